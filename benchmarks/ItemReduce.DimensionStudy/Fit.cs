using System.Globalization;
using System.Text;
using ItemReduce.Core.Dimensions;
using MathNet.Numerics.LinearAlgebra;

namespace ItemReduce.DimensionStudy;

/// <summary>
/// Fits the combined rule (<see cref="CombinedRetention"/>) on the training design: a multinomial logistic regression of
/// the step (planted − reduced-matrix count, clipped to −2 … +2) on the standardised features, with a ridge penalty on
/// the weights (not the intercepts), the step-0 class as reference (its coefficients fixed at 0), and the same allowed
/// steps per survey as at prediction time. Newton's method on the penalised log-likelihood (concave), stopped when
/// the largest change is below 1e-9 (at most 100 iterations). The ridge strength is chosen from a fixed list by
/// five-fold cross-validation (survey i in fold i mod 5) on the training data only. Writes the C# coefficient file.
/// </summary>
internal static class Fit
{
    private static readonly double[] Ridges = [0.03, 0.1, 0.3, 1, 3, 10];

    public static void Run(IReadOnlyList<string> trainingCsvs, string outFile, string provenance)
    {
        var parts = trainingCsvs.Select(Read).ToList();
        var x = parts.SelectMany(t => t.X).ToArray();
        var m = parts.SelectMany(t => t.M).ToArray();
        var truth = parts.SelectMany(t => t.Truth).ToArray();
        var p = parts.SelectMany(t => t.P).ToArray();
        int n = x.Length, f = CombinedRetention.FeatureNames.Length;
        var means = new double[f];
        var sds = new double[f];
        for (int j = 0; j < f; j++)
        {
            means[j] = x.Average(r => r[j]);
            sds[j] = Math.Sqrt(x.Sum(r => (r[j] - means[j]) * (r[j] - means[j])) / (n - 1));
            if (!(sds[j] > 1e-12)) sds[j] = 1;
        }
        var z = x.Select(r => r.Select((v, j) => (v - means[j]) / sds[j]).ToArray()).ToArray();
        var ci = CultureInfo.InvariantCulture;
        double bestRidge = Ridges[0], bestHit = -1;
        foreach (double ridge in Ridges)
        {
            int hits = 0;
            for (int fold = 0; fold < 5; fold++)
            {
                var train = Enumerable.Range(0, n).Where(i => i % 5 != fold).ToArray();
                var (b, w) = Newton(z, m, truth, p, train, ridge);
                hits += Enumerable.Range(0, n).Where(i => i % 5 == fold)
                    .Count(i => Predict(x[i], m[i], p[i], means, sds, b, w) == truth[i]);
            }
            double hit = (double)hits / n;
            Console.WriteLine(string.Create(ci, $"ridge {ridge}: cross-validated hit rate {hit:F4}"));
            if (hit > bestHit + 1e-12) { bestHit = hit; bestRidge = ridge; }
        }
        var (intercepts, weights) = Newton(z, m, truth, p, Enumerable.Range(0, n).ToArray(), bestRidge);
        int inSample = Enumerable.Range(0, n).Count(i => Predict(x[i], m[i], p[i], means, sds, intercepts, weights) == truth[i]);
        int start = Enumerable.Range(0, n).Count(i => m[i] == truth[i]);
        string summary = string.Create(ci,
            $"{n} training surveys; ridge {bestRidge} (five-fold cross-validated hit rate {bestHit:F4}); in-sample hit rate {(double)inSample / n:F4}; reduced-matrix parallel analysis alone {(double)start / n:F4}");
        Console.WriteLine(summary);
        File.WriteAllText(outFile, Source(means, sds, intercepts, weights, bestRidge, provenance, summary));
    }

    private static int Predict(double[] x, int m, int p, double[] means, double[] sds, double[] b, double[,] w) =>
        CombinedRetention.Decide(x, m, ComparisonData.MaxFactors(p), means, sds, b, w).Count;

    /// <summary>Allowed steps of a survey, as at prediction time.</summary>
    private static bool[] Allowed(int m, int p) => CombinedRetention.Allowed(m, ComparisonData.MaxFactors(p));

    private static (double[] Intercepts, double[,] Weights) Newton(double[][] z, int[] m, int[] truth, int[] p, int[] rows, double ridge)
    {
        int s = CombinedRetention.Steps.Length, f = z[0].Length, zero = Array.IndexOf(CombinedRetention.Steps, 0);
        var free = Enumerable.Range(0, s).Where(c => c != zero).ToArray();
        int q = f + 1, dim = free.Length * q;
        var theta = new double[dim];
        for (int iter = 0; iter < 100; iter++)
        {
            var grad = new double[dim];
            var hess = Matrix<double>.Build.Dense(dim, dim);
            foreach (int i in rows)
            {
                var allowed = Allowed(m[i], p[i]);
                var prob = Probabilities(theta, z[i], allowed, free, zero, q);
                int label = Label(truth[i] - m[i], allowed);
                var xi = new double[q];
                xi[0] = 1;
                Array.Copy(z[i], 0, xi, 1, f);
                for (int a = 0; a < free.Length; a++)
                {
                    double ya = free[a] == label ? 1 : 0;
                    for (int u = 0; u < q; u++) grad[a * q + u] += (ya - prob[free[a]]) * xi[u];
                    for (int b = 0; b < free.Length; b++)
                    {
                        double h = (a == b ? prob[free[a]] : 0) - prob[free[a]] * prob[free[b]];
                        if (h == 0) continue;
                        for (int u = 0; u < q; u++)
                            for (int v = 0; v < q; v++) hess[a * q + u, b * q + v] += h * xi[u] * xi[v];
                    }
                }
            }
            for (int a = 0; a < free.Length; a++)
                for (int u = 1; u < q; u++)
                {
                    grad[a * q + u] -= ridge * theta[a * q + u];
                    hess[a * q + u, a * q + u] += ridge;
                }
            for (int d = 0; d < dim; d++) hess[d, d] += 1e-9;
            var step = hess.Cholesky().Solve(Vector<double>.Build.DenseOfArray(grad));
            double largest = 0;
            for (int d = 0; d < dim; d++) { theta[d] += step[d]; largest = Math.Max(largest, Math.Abs(step[d])); }
            if (largest < 1e-9) break;
        }
        var intercepts = new double[s];
        var weights = new double[s, f];
        for (int a = 0; a < free.Length; a++)
        {
            intercepts[free[a]] = theta[a * q];
            for (int j = 0; j < f; j++) weights[free[a], j] = theta[a * q + 1 + j];
        }
        return (intercepts, weights);
    }

    private static double[] Probabilities(double[] theta, double[] z, bool[] allowed, int[] free, int zero, int q)
    {
        var score = new double[allowed.Length];
        for (int a = 0; a < free.Length; a++)
        {
            double t = theta[a * q];
            for (int u = 1; u < q; u++) t += theta[a * q + u] * z[u - 1];
            score[free[a]] = t;
        }
        score[zero] = 0;
        double top = Enumerable.Range(0, allowed.Length).Where(c => allowed[c]).Max(c => score[c]), sum = 0;
        var prob = new double[allowed.Length];
        for (int c = 0; c < allowed.Length; c++) { prob[c] = allowed[c] ? Math.Exp(score[c] - top) : 0; sum += prob[c]; }
        for (int c = 0; c < allowed.Length; c++) prob[c] /= sum;
        return prob;
    }

    /// <summary>Class of a step: clipped to −2 … +2 and moved to the nearest allowed step.</summary>
    private static int Label(int step, bool[] allowed)
    {
        var steps = CombinedRetention.Steps;
        int best = -1;
        for (int c = 0; c < steps.Length; c++)
            if (allowed[c] && (best < 0 || Math.Abs(steps[c] - step) < Math.Abs(steps[best] - step))) best = c;
        return best;
    }

    private static (double[][] X, int[] M, int[] Truth, int[] P) Read(string path)
    {
        var lines = File.ReadAllLines(path);
        var head = lines[0].Split(',');
        int Col(string name) => Array.IndexOf(head, name) is int i and >= 0 ? i : throw new InvalidDataException($"{path}: no column {name}");
        int k = Col("factors"), ipf = Col("items_per_factor"), red = Col("pa-reduced-95");
        var fc = CombinedRetention.FeatureNames.Select(Col).ToArray();
        var rows = lines.Skip(1).Where(l => l.Length > 0).Select(l => l.Split(',')).ToArray();
        int I(string v) => int.Parse(v, CultureInfo.InvariantCulture);
        return (rows.Select(r => fc.Select(c => double.Parse(r[c], CultureInfo.InvariantCulture)).ToArray()).ToArray(),
            rows.Select(r => I(r[red])).ToArray(), rows.Select(r => I(r[k])).ToArray(), rows.Select(r => I(r[k]) * I(r[ipf])).ToArray());
    }

    private static string Source(double[] means, double[] sds, double[] b, double[,] w, double ridge, string provenance, string summary)
    {
        string A(IEnumerable<double> v) => "[" + string.Join(", ", v.Select(x => x.ToString("R", CultureInfo.InvariantCulture))) + "]";
        var sb = new StringBuilder();
        sb.AppendLine("// <auto-generated> Written by benchmarks/ItemReduce.DimensionStudy (mode \"fit\"); do not edit by hand. </auto-generated>");
        sb.AppendLine("namespace ItemReduce.Core.Dimensions;");
        sb.AppendLine();
        sb.AppendLine("/// <summary>");
        sb.AppendLine("/// Fitted coefficients of <see cref=\"CombinedRetention\"/>: training-feature means and standard deviations, and per step");
        sb.AppendLine("/// (−2, −1, 0, +1, +2; step 0 is the reference class, all zero) an intercept and one weight per standardised feature.");
        foreach (var line in provenance.Trim().Split('\n')) sb.AppendLine("/// " + line.TrimEnd());
        sb.AppendLine("/// " + summary + ".");
        sb.AppendLine("/// </summary>");
        sb.AppendLine("internal static class CombinedRetentionModel");
        sb.AppendLine("{");
        sb.AppendLine("    /// <summary>Ridge penalty (ridge / 2 · sum of squared weights) chosen by five-fold cross-validation on the training table.</summary>");
        sb.AppendLine("    public const double Ridge = " + ridge.ToString("R", CultureInfo.InvariantCulture) + ";");
        sb.AppendLine();
        sb.AppendLine("    /// <summary>Feature order: " + string.Join(", ", CombinedRetention.FeatureNames) + ".</summary>");
        sb.AppendLine("    public static readonly double[] Means = " + A(means) + ";");
        sb.AppendLine();
        sb.AppendLine("    /// <summary>Training standard deviations (n − 1) of the features.</summary>");
        sb.AppendLine("    public static readonly double[] StandardDeviations = " + A(sds) + ";");
        sb.AppendLine();
        sb.AppendLine("    /// <summary>Intercepts per step.</summary>");
        sb.AppendLine("    public static readonly double[] Intercepts = " + A(b) + ";");
        sb.AppendLine();
        sb.AppendLine("    /// <summary>Weights per step (rows) and standardised feature (columns).</summary>");
        sb.AppendLine("    public static readonly double[,] Weights =");
        sb.AppendLine("    {");
        for (int c = 0; c < w.GetLength(0); c++)
            sb.AppendLine("        { " + string.Join(", ", Enumerable.Range(0, w.GetLength(1)).Select(j => w[c, j].ToString("R", CultureInfo.InvariantCulture))) + " },");
        sb.AppendLine("    };");
        sb.AppendLine("}");
        return sb.ToString();
    }
}
