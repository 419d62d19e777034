using ItemReduce.Core.Correlation;

namespace ItemReduce.Core.Dimensions;

/// <summary>
/// Mann–Whitney U test: Mann, H. B., &amp; Whitney, D. R. (1947). On a test of whether one of two random variables
/// is stochastically larger than the other. Annals of Mathematical Statistics, 18(1), 50–60. Large-sample normal
/// approximation with mid-ranks for ties, the tie-corrected variance
/// <c>σ² = n₁n₂/12 · [(N + 1) − Σ(t³ − t)/(N(N − 1))]</c> and a continuity correction of ½.
/// Used by <see cref="ComparisonData"/> to ask whether one more factor improves the fit.
/// </summary>
public static class MannWhitneyUTest
{
    /// <summary>One-sided p-value for the alternative "values in <paramref name="x"/> tend to be smaller than values in
    /// <paramref name="y"/>". With U_x = R_x − n₁(n₁ + 1)/2 (R_x = rank sum of x),
    /// the p-value is Φ((U_x − n₁n₂/2 + ½)/σ).</summary>
    /// <exception cref="ArgumentException">An empty sample or a NaN value.</exception>
    public static double PValueLess(IReadOnlyList<double> x, IReadOnlyList<double> y)
    {
        ArgumentNullException.ThrowIfNull(x);
        ArgumentNullException.ThrowIfNull(y);
        if (x.Count == 0 || y.Count == 0) throw new ArgumentException("Both samples need at least one value.");
        int n1 = x.Count, n2 = y.Count, n = n1 + n2;
        var all = new (double Value, bool FromX)[n];
        for (int i = 0; i < n1; i++) all[i] = (x[i], true);
        for (int i = 0; i < n2; i++) all[n1 + i] = (y[i], false);
        if (all.Any(v => double.IsNaN(v.Value))) throw new ArgumentException("The samples contain NaN.");
        Array.Sort(all, (a, b) => a.Value.CompareTo(b.Value));
        double rankSumX = 0, ties = 0;
        for (int i = 0; i < n;)
        {
            int j = i;
            while (j + 1 < n && all[j + 1].Value == all[i].Value) j++;
            double midRank = (i + j) / 2.0 + 1; // 1-based mid-rank of positions i..j
            for (int t = i; t <= j; t++) if (all[t].FromX) rankSumX += midRank;
            double size = j - i + 1;
            ties += size * size * size - size;
            i = j + 1;
        }
        double u = rankSumX - n1 * (n1 + 1) / 2.0;
        double mean = n1 * (double)n2 / 2;
        double variance = n1 * (double)n2 / 12 * (n + 1 - ties / (n * (n - 1.0)));
        if (!(variance > 0)) return 0.5;
        double z = (u - mean + 0.5) / Math.Sqrt(variance);
        return BivariateNormalDistribution.Phi(z);
    }
}
