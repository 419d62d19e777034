using MathNet.Numerics.Distributions;

namespace ItemReduce.Simulation;

/// <summary>
/// Oracle for the validation study: the likelihood-ratio statistic of "uniform-random answers" against "an attentive
/// respondent from the true ordinal factor model" for one respondent's observed answers,
/// <c>T(x) = log[c^(−m) / P_model(x_obs)]</c> with m the items answered and c the categories. With the careless kind
/// and the model both fully known, rejecting for large T at a threshold taken from simulated attentive respondents is
/// the most powerful test at that false-flag rate (Neyman, J., &amp; Pearson, E. S., 1933, "On the problem of the most
/// efficient tests of statistical hypotheses", Philosophical Transactions of the Royal Society of London, Series A,
/// 231, 289–337; citation from memory). Missing answers completely at random do not change that: the joint
/// likelihood ratio of (pattern, answers) is the same T, so one threshold over all patterns is optimal.
/// No data-based method can beat its recall; it uses the truth, so it is a yardstick, never a screening rule.
/// <para>P_model(x_obs) = ∫ Π_j P(x_j | f) dΦ(f), with latent x*_j = λ_j f_g(j) + √(1 − λ_j²) ε_j cut at the model's
/// thresholds. The factors must be equicorrelated (ρ ≥ 0), which gives f_a = √ρ G + √(1 − ρ) E_a with independent
/// standard normal G, E_a, so the integral is one outer integral over G of a product over factors of inner integrals
/// over E_a; both are computed on a fixed grid of normal-weighted points (our numerical choice; the grid error
/// changes T slightly for the null and the alternative alike, so the false-flag rate stays exact).</para>
/// </summary>
internal sealed class OrdinalLikelihoodRatio
{
    private const double GridHalfWidth = 6;
    private readonly int p, c, outer, inner;
    private readonly int[][] factorItems;
    private readonly double[] outerLogWeight, innerWeight;
    // prob[((j * outer + g) * inner + e) * c + t] = P(answer t + 1 | G node g, E node e) for item j.
    private readonly double[] prob;

    /// <summary>Builds the statistic for <paramref name="spec"/> (answers scored 1..Categories in the model's
    /// direction, i.e. after reverse scoring).</summary>
    public OrdinalLikelihoodRatio(FactorModelSpec spec, int outerPoints = 31, int innerPoints = 41)
    {
        ArgumentNullException.ThrowIfNull(spec);
        if (spec.Categories < 2) throw new ArgumentException("The ordinal likelihood ratio needs ordinal items.", nameof(spec));
        if (spec.CrossLoadings.Count > 0) throw new ArgumentException("Cross-loadings are not supported.", nameof(spec));
        p = spec.ItemFactor.Length;
        c = spec.Categories;
        int k = spec.FactorCount;
        double rho = k > 1 ? spec.FactorCorrelations![0, 1] : 0;
        for (int a = 0; a < k; a++)
            for (int b = 0; b < k; b++)
                if (a != b && Math.Abs(spec.FactorCorrelations![a, b] - rho) > 1e-12)
                    throw new ArgumentException("Factors must be equicorrelated.", nameof(spec));
        if (rho < 0 || rho >= 1) throw new ArgumentException("Factor correlation must be in [0, 1).", nameof(spec));
        factorItems = Enumerable.Range(0, k).Select(a => Enumerable.Range(0, p).Where(j => spec.ItemFactor[j] == a).ToArray()).ToArray();
        outer = rho > 0 ? outerPoints : 1;
        inner = innerPoints;
        var (gz, gw) = Grid(outer);
        var (ez, ew) = Grid(inner);
        outerLogWeight = gw.Select(w => Math.Log(w)).ToArray();
        innerWeight = ew;
        var probabilities = spec.CategoryProbabilities ?? throw new ArgumentException("Category probabilities are required.", nameof(spec));
        double total = probabilities.Sum(), acc = 0;
        var cuts = new double[c + 1];
        cuts[0] = double.NegativeInfinity;
        cuts[c] = double.PositiveInfinity;
        for (int t = 1; t < c; t++) { acc += probabilities[t - 1] / total; cuts[t] = Normal.InvCDF(0, 1, acc); }
        prob = new double[(long)p * outer * inner * c];
        for (int j = 0; j < p; j++)
        {
            double l = spec.Loadings[j], u = Math.Sqrt(1 - l * l);
            for (int g = 0; g < outer; g++)
                for (int e = 0; e < inner; e++)
                {
                    double f = Math.Sqrt(rho) * gz[g] + Math.Sqrt(1 - rho) * ez[e];
                    long o = (((long)j * outer + g) * inner + e) * c;
                    double below = 0;
                    for (int t = 0; t < c; t++)
                    {
                        double upTo = t == c - 1 ? 1 : Normal.CDF(0, 1, (cuts[t + 1] - l * f) / u);
                        prob[o + t] = Math.Max(upTo - below, 1e-300);
                        below = upTo;
                    }
                }
        }
    }

    /// <summary>Normal-weighted grid on [−6, 6] (weights φ(z) normalised to sum 1); one point at 0 when <paramref name="points"/> is 1.</summary>
    private static (double[] Z, double[] W) Grid(int points)
    {
        if (points == 1) return ([0.0], [1.0]);
        var z = new double[points];
        var w = new double[points];
        for (int i = 0; i < points; i++)
        {
            z[i] = -GridHalfWidth + 2 * GridHalfWidth * i / (points - 1);
            w[i] = Math.Exp(-0.5 * z[i] * z[i]);
        }
        double s = w.Sum();
        for (int i = 0; i < points; i++) w[i] /= s;
        return (z, w);
    }

    /// <summary>T(x) for one row of answers 1..c (NaN = missing); NaN when nothing was answered.</summary>
    public double Statistic(ReadOnlySpan<double> answers)
    {
        if (answers.Length != p) throw new ArgumentException($"Expected {p} answers.", nameof(answers));
        Span<int> cat = stackalloc int[p];
        int m = 0;
        for (int j = 0; j < p; j++)
        {
            if (double.IsNaN(answers[j])) { cat[j] = -1; continue; }
            cat[j] = (int)answers[j] - 1;
            if (cat[j] < 0 || cat[j] >= c) throw new ArgumentException($"Answer {answers[j]} outside 1..{c}.", nameof(answers));
            m++;
        }
        if (m == 0) return double.NaN;
        Span<double> logByOuter = stackalloc double[outer];
        double best = double.NegativeInfinity;
        for (int g = 0; g < outer; g++)
        {
            double logL = outerLogWeight[g];
            foreach (var items in factorItems)
            {
                double s = 0;
                for (int e = 0; e < inner; e++)
                {
                    double prod = innerWeight[e];
                    foreach (int j in items)
                        if (cat[j] >= 0) prod *= prob[(((long)j * outer + g) * inner + e) * c + cat[j]];
                    s += prod;
                }
                logL += Math.Log(Math.Max(s, double.Epsilon));
            }
            logByOuter[g] = logL;
            if (logL > best) best = logL;
        }
        double sum = 0;
        for (int g = 0; g < outer; g++) sum += Math.Exp(logByOuter[g] - best);
        double logP = best + Math.Log(sum);
        return -m * Math.Log(c) - logP;
    }
}
