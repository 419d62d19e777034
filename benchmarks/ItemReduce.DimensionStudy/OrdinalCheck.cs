using System.Globalization;
using System.Text;
using ItemReduce.Core.Correlation;
using ItemReduce.Core.Data;
using ItemReduce.Core.Dimensions;
using ItemReduce.Core.LinearAlgebra;
using ItemReduce.Core.Randomness;
using ItemReduce.Simulation;

namespace ItemReduce.DimensionStudy;

/// <summary>
/// Checks of the two fast paths against simulating ordinal data, written to ordinal-check.md:
/// (1) the ordinal reference of polychoric parallel analysis (<see cref="PolychoricNullDistribution"/>) against
///     polychoric correlations of simulated independent items with the observed marginals (Garrido, Abad &amp;
///     Ponsoda, 2013; here by shuffling each item, which keeps its marginal exactly) and against the normal reference;
/// (2) decisions with polychoric correlations on skewed and symmetric items: normal vs ordinal vs simulated reference;
/// (3) comparison data with Wishart populations (the tool's fast path) against comparison data with ordinal
///     populations in the manner of Ruscio &amp; Roche (2012): a finite population of 10,000 ordinal cases with the
///     observed marginals whose Pearson correlations reproduce the k-factor matrix (intermediate matrix adjusted
///     five times), resampled at the observed size.
/// </summary>
internal static class OrdinalCheck
{
    private const ulong Purpose = 0x4F434B; // "OCK"

    public static void Run(string outDir, int sets, int replicates, ulong seed)
    {
        var sb = new StringBuilder("# Ordinal checks of the fast paths\n\n");
        sb.AppendLine(string.Create(CultureInfo.InvariantCulture, $"Seed {seed}; {replicates} replicates per reference; {sets} data sets per cell in parts 2 and 3.\n"));
        ReferenceCheck(sb, replicates, seed);
        Console.Write(sb.ToString());
        PolychoricDecisions(sb, sets, replicates, seed);
        Console.Write(sb.ToString());
        ComparisonCheck(sb, sets, seed);
        File.WriteAllText(Path.Combine(outDir, "ordinal-check.md"), sb.ToString());
        Console.Write(sb.ToString());
    }

    private static string F(double v, string f = "0.000") => v.ToString(f, CultureInfo.InvariantCulture);

    /// <summary>Independent items: zero loadings, given categories and marginals.</summary>
    private static ResponseMatrix Independent(int n, int p, double[] probabilities, ulong dataSeed)
    {
        var spec = new FactorModelSpec
        {
            ItemFactor = new int[p],
            Loadings = new double[p],
            Categories = probabilities.Length,
            CategoryProbabilities = probabilities,
        };
        return FactorModelSimulator.Generate(spec, new FactorModelSimulator.Settings(n, dataSeed)).Responses;
    }

    private static void ReferenceCheck(StringBuilder sb, int replicates, ulong seed)
    {
        sb.AppendLine("## 1. Reference eigenvalues for independent ordinal items (polychoric)\n");
        sb.AppendLine("95th-percentile reference eigenvalues of components 1–3 (full matrix) and 1–2 (reduced matrix): simulated = polychoric correlations of the items shuffled independently (observed marginals); ordinal = the fast path; normal = Wishart draws of normal data.\n");
        sb.AppendLine("| categories | marginals | n | p | reference | λ1 | λ2 | λ3 | reduced λ1 | reduced λ2 |");
        sb.AppendLine("|---:|---|---:|---:|---|---:|---:|---:|---:|---:|");
        var configs = new (int C, bool Skew, int N, int P)[] { (4, true, 200, 10), (5, true, 300, 20), (5, false, 200, 20), (7, true, 500, 30), (4, true, 1000, 15) };
        var o = new ParallelAnalysisOptions { Replicates = replicates, Seed = seed, MaxDegreeOfParallelism = -1 };
        foreach (var (c, skew, n, p) in configs)
        {
            var data = Independent(n, p, skew ? Conditions.Skewed(c) : Conditions.Symmetric(c), seed + (ulong)(c * 1000 + n + p));
            var simulated = ParallelAnalysis.PermutationReference(data, d => PolychoricCorrelation.Compute(d, MissingDataHandling.Pairwise, 1), o);
            var ordinal = ParallelAnalysis.OrdinalReference(n, PolychoricNullDistribution.InformationFactors(data), o);
            var normal = ParallelAnalysis.NormalReference(n, p, o);
            foreach (var (name, r) in new[] { ("simulated", simulated), ("ordinal", ordinal), ("normal", normal) })
                sb.AppendLine(string.Create(CultureInfo.InvariantCulture,
                    $"| {c} | {(skew ? "skewed" : "symmetric")} | {n} | {p} | {name} | {F(r.Percentile[0])} | {F(r.Percentile[1])} | {F(r.Percentile[2])} | {F(r.ReducedPercentile![0])} | {F(r.ReducedPercentile[1])} |"));
        }
        sb.AppendLine();
    }

    private static void PolychoricDecisions(StringBuilder sb, int sets, int replicates, ulong seed)
    {
        sb.AppendLine("## 2. Decisions with polychoric correlations\n");
        sb.AppendLine("Hit rates (share of data sets giving the planted number). Five items per factor, loadings .4–.7, factor correlation .3; categories cycle 4, 5, 7.\n");
        var cells = new List<(int K, bool Skew, int N)>();
        foreach (int k in new[] { 1, 3 }) foreach (bool s in new[] { true, false }) foreach (int n in new[] { 200, 500 }) cells.Add((k, s, n));
        string[] names = ["pa-pca-95 normal", "pa-pca-95 ordinal", "pa-pca-95 simulated", "pa-reduced-95 normal", "pa-reduced-95 ordinal", "pa-reduced-95 simulated", "cd", "ekc"];
        sb.AppendLine("| k | marginals | n | " + string.Join(" | ", names) + " |");
        sb.AppendLine("|---:|---|---:|" + string.Concat(names.Select(_ => "---:|")));
        int cellIndex = 0;
        foreach (var (k, skew, n) in cells)
        {
            var hits = new double[names.Length];
            var jobs = Enumerable.Range(0, sets).ToArray();
            var counts = new int[sets][];
            Parallel.For(0, sets, new ParallelOptions { MaxDegreeOfParallelism = Environment.ProcessorCount }, d =>
            {
                var rng = RandomStream.ForTask(seed, cellIndex * 1000L + d, Purpose);
                var cell = new Cell(0, k, 5, 0.3, n);
                var spec = Conditions.Spec(cell, 0, rng) with
                {
                    Categories = new[] { 4, 5, 7 }[d % 3],
                };
                spec = spec with { CategoryProbabilities = skew ? Conditions.Skewed(spec.Categories) : Conditions.Symmetric(spec.Categories), CrossLoadings = [] };
                var data = FactorModelSimulator.Generate(spec, new FactorModelSimulator.Settings(n, rng.NextUInt64())).Responses;
                var baseOptions = new DimensionOptions { Correlation = new CorrelationOptions { Kind = CorrelationKind.Polychoric }, Replicates = replicates, Seed = rng.NextUInt64(), MaxDegreeOfParallelism = 1 };
                var normal = DimensionAnalysis.Run(data, baseOptions with { Reference = ReferenceKind.Normal });
                var ordinal = DimensionAnalysis.Run(data, baseOptions with { Reference = ReferenceKind.Ordinal });
                var simulated = DimensionAnalysis.Run(data, baseOptions with { Reference = ReferenceKind.Permutation, Replicates = Math.Max(10, replicates / 2) });
                counts[d] =
                [
                    normal.ByRule.Parallel, ordinal.ByRule.Parallel, simulated.ByRule.Parallel,
                    normal.ByRule.ParallelReduced ?? 0, ordinal.ByRule.ParallelReduced ?? 0, simulated.ByRule.ParallelReduced ?? 0,
                    ordinal.ByRule.ComparisonData ?? 0, ordinal.ByRule.EmpiricalKaiser,
                ];
            });
            for (int r = 0; r < names.Length; r++) hits[r] = counts.Average(c => c[r] == k ? 1.0 : 0.0);
            sb.AppendLine($"| {k} | {(skew ? "skewed" : "symmetric")} | {n} | " + string.Join(" | ", hits.Select(h => F(h, "0.00"))) + " |");
            cellIndex++;
        }
        sb.AppendLine("\nThe simulated (shuffled-items) reference used half the replicates, because each of its replicates computes a full polychoric matrix.\n");
    }

    private static void ComparisonCheck(StringBuilder sb, int sets, ulong seed)
    {
        sb.AppendLine("## 3. Comparison data: Wishart populations vs ordinal populations (Pearson correlations)\n");
        sb.AppendLine("Five items per factor, loadings .4–.7, factor correlation .3, categories cycle 4, 5, 7, skewed in odd data sets; 100 samples per population in both versions.\n");
        sb.AppendLine("| k | n | data sets | hit rate, Wishart | hit rate, ordinal populations | same count |");
        sb.AppendLine("|---:|---:|---:|---:|---:|---:|");
        int cellIndex = 500;
        foreach (int k in new[] { 1, 2, 3 })
            foreach (int n in new[] { 200, 500 })
            {
                var pair = new (int Fast, int Ordinal)[sets];
                Parallel.For(0, sets, new ParallelOptions { MaxDegreeOfParallelism = Environment.ProcessorCount }, d =>
                {
                    var rng = RandomStream.ForTask(seed, cellIndex * 1000L + d, Purpose);
                    var spec = Conditions.Spec(new Cell(0, k, 5, 0.3, n), 0, rng);
                    int categories = new[] { 4, 5, 7 }[d % 3];
                    spec = spec with { Categories = categories, CategoryProbabilities = d % 2 == 1 ? Conditions.Skewed(categories) : Conditions.Symmetric(categories), CrossLoadings = [] };
                    var data = FactorModelSimulator.Generate(spec, new FactorModelSimulator.Settings(n, rng.NextUInt64())).Responses;
                    var r = PearsonCorrelation.Compute(data, MissingDataHandling.Pairwise, 1);
                    var eig = SymmetricEigensolver.Eigenvalues(r);
                    ulong s = rng.NextUInt64();
                    int fast = ComparisonData.Run(r, eig, n, new ComparisonDataOptions { Samples = 100, Seed = s, MaxDegreeOfParallelism = 1 }).Count;
                    int ordinal = OrdinalComparisonData(data, r, eig, 100, s);
                    pair[d] = (fast, ordinal);
                });
                sb.AppendLine(string.Create(CultureInfo.InvariantCulture,
                    $"| {k} | {n} | {sets} | {F(pair.Average(x => x.Fast == k ? 1.0 : 0.0), "0.00")} | {F(pair.Average(x => x.Ordinal == k ? 1.0 : 0.0), "0.00")} | {F(pair.Average(x => x.Fast == x.Ordinal ? 1.0 : 0.0), "0.00")} |"));
                cellIndex++;
            }
        sb.AppendLine();
    }

    /// <summary>Comparison data with finite ordinal populations (study only; slow).</summary>
    internal static int OrdinalComparisonData(ResponseMatrix data, double[,] r, double[] observed, int samples, ulong seed)
    {
        const int populationSize = 10_000;
        int n = data.RespondentCount, p = data.ItemCount;
        var levels = new double[p][];
        var cuts = new double[p][];
        for (int j = 0; j < p; j++)
        {
            var groups = data.Column(j).GroupBy(x => x).OrderBy(g => g.Key).ToArray();
            levels[j] = groups.Select(g => g.Key).ToArray();
            double acc = 0;
            cuts[j] = groups.Take(groups.Length - 1).Select(g => { acc += g.Count(); return MathNet.Numerics.Distributions.Normal.InvCDF(0, 1, acc / n); }).ToArray();
        }
        var rm = ItemReduce.Core.Factoring.MatrixHelpers.ToMatrix(r);
        int maxK = ComparisonData.MaxFactors(p);
        double[]? previous = null;
        for (int k = 1; k <= maxK; k++)
        {
            var target = ComparisonData.Population(rm, k);
            var rng = RandomStream.ForTask(seed, k, 0x4F524450); // "ORDP"
            var intermediate = (double[,])target.Clone();
            double[] population = [];
            for (int trial = 0; trial < 6; trial++)
            {
                population = Generate(intermediate, levels, cuts, populationSize, rng);
                if (trial == 5) break;
                var achieved = PearsonCorrelation.Complete(population, populationSize, p, 1);
                for (int a = 0; a < p; a++)
                    for (int b = 0; b < p; b++)
                        if (a != b) intermediate[a, b] += target[a, b] - achieved[a, b];
                intermediate = NearestCorrelationMatrix.Find(intermediate).Matrix;
            }
            var fit = new double[samples];
            var rows = Enumerable.Range(0, populationSize).ToArray();
            var sample = new double[n * p];
            for (int s = 0; s < samples; s++)
            {
                for (int i = 0; i < n; i++) { int t = i + rng.NextInt(populationSize - i); (rows[i], rows[t]) = (rows[t], rows[i]); }
                for (int i = 0; i < n; i++) Array.Copy(population, rows[i] * p, sample, i * p, p);
                var e = SymmetricEigensolver.Eigenvalues(PearsonCorrelation.Complete(sample, n, p, 1));
                fit[s] = ComparisonData.Rmsr(e, observed);
            }
            if (previous is not null && MannWhitneyUTest.PValueLess(fit, previous) >= 0.30) return k - 1;
            previous = fit;
        }
        return maxK;
    }

    private static double[] Generate(double[,] correlation, double[][] levels, double[][] cuts, int rows, RandomStream rng)
    {
        int p = levels.Length;
        var c = MatrixChecksCopy(correlation);
        CholeskyDecomposition.FactorInPlace(c, p);
        var x = new double[rows * p];
        var z = new double[p];
        for (int i = 0; i < rows; i++)
        {
            for (int j = 0; j < p; j++) z[j] = rng.NextGaussian();
            for (int j = 0; j < p; j++)
            {
                double v = 0;
                for (int t = 0; t <= j; t++) v += c[j * p + t] * z[t];
                int cat = 0;
                while (cat < cuts[j].Length && v > cuts[j][cat]) cat++;
                x[i * p + j] = levels[j][cat];
            }
        }
        return x;
    }

    private static double[] MatrixChecksCopy(double[,] a)
    {
        int p = a.GetLength(0);
        var v = new double[p * p];
        for (int i = 0; i < p; i++) for (int j = 0; j < p; j++) v[i * p + j] = a[i, j];
        return v;
    }
}
