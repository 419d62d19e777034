using ItemReduce.Core.Correlation;
using ItemReduce.Core.Data;
using ItemReduce.Core.Randomness;

namespace ItemReduce.Core.Dimensions;

/// <summary>
/// Random reference for polychoric correlations of independent ordinal items with the observed marginal
/// distributions — the reference Garrido, L. E., Abad, F. J., &amp; Ponsoda, V. (2013), "A new look at Horn's parallel
/// analysis with ordinal variables", Psychological Methods, 18(4), 454–474, obtain by simulating such items and
/// computing their polychoric correlations — drawn here without simulating data, from the large-sample
/// distribution of the maximum-likelihood polychoric estimate at ρ = 0.
/// <para>
/// Derivation (ours, from the two-step ML estimator of Olsson, U. (1979), "Maximum likelihood estimation of the
/// polychoric correlation coefficient", Psychometrika, 44(4), 443–460): at ρ = 0 the cell probabilities are
/// π_ab = P_a Q_b and ∂π_ab/∂ρ = (φ(α_{a−1}) − φ(α_a))(φ(β_{b−1}) − φ(β_b)), so the score of one respondent in
/// categories (a, b) is m_j(a) m_k(b) with m_j(a) = (φ(τ_{a−1}) − φ(τ_a)) / P_a = E[Z | category a], the mean of the
/// latent normal within the category; the Fisher information is n I_j I_k with I_j = Σ_a P_a m_j(a)² (≤ 1, the
/// share of latent variance the categories keep). Hence ρ̂_jk ≈ r_jk / √(I_j I_k), where r_jk is the Pearson
/// correlation of the category-mean scores m_j(X_j), m_k(X_k) of independent items: for n respondents these
/// correlations are distributed, to the same order, like those of independent normal data. A reference matrix is
/// therefore a Wishart correlation draw (<see cref="BartlettWishartSampler"/>) whose off-diagonal entries are
/// divided by √(I_j I_k); O(p³) per replicate, independent of n. The approximation was checked against polychoric
/// correlations of permuted data (the simulation-based reference) in the study under <c>benchmarks/dimensions-study</c>.
/// </para>
/// </summary>
public static class PolychoricNullDistribution
{
    /// <summary>Information factor I_j of each item (length p, each in (0, 1]) from its observed category counts
    /// (missing answers ignored). An item with fewer than two observed categories gets 1.</summary>
    public static double[] InformationFactors(ResponseMatrix data)
    {
        ArgumentNullException.ThrowIfNull(data);
        int p = data.ItemCount;
        var info = new double[p];
        for (int j = 0; j < p; j++)
        {
            var counts = data.Column(j).Where(x => !double.IsNaN(x)).GroupBy(x => x).OrderBy(g => g.Key).Select(g => (long)g.Count()).ToArray();
            info[j] = InformationFactor(counts);
        }
        return info;
    }

    /// <summary>I = Σ_a P_a m(a)², m(a) = (φ(τ_{a−1}) − φ(τ_a)) / P_a, for category counts in category order.</summary>
    public static double InformationFactor(IReadOnlyList<long> counts)
    {
        ArgumentNullException.ThrowIfNull(counts);
        var nonEmpty = counts.Where(c => c > 0).ToArray();
        if (nonEmpty.Length < 2) return 1.0;
        var tau = PolychoricCorrelation.Thresholds(nonEmpty);
        double all = nonEmpty.Sum(), info = 0;
        for (int a = 0; a < nonEmpty.Length; a++)
        {
            double pa = nonEmpty[a] / all;
            double m = (Density(tau[a]) - Density(tau[a + 1])) / pa;
            info += pa * m * m;
        }
        return Math.Min(info, 1.0);
    }

    private static double Density(double z) => double.IsInfinity(z) ? 0 : Math.Exp(-0.5 * z * z) / Math.Sqrt(2 * Math.PI);

    /// <summary>Unchecked kernel: a reference matrix into <paramref name="w"/> (row-major p × p); <paramref name="l"/> is scratch;
    /// <paramref name="inverseRootInfo"/>[j] = 1/√I_j.</summary>
    internal static void SampleInto(int p, int df, double[] inverseRootInfo, RandomStream rng, double[] l, double[] w)
    {
        BartlettWishartSampler.SampleCorrelationInto(p, df, rng, l, w);
        for (int i = 0; i < p; i++)
            for (int j = 0; j < p; j++)
                if (i != j)
                    w[i * p + j] = Math.Clamp(w[i * p + j] * inverseRootInfo[i] * inverseRootInfo[j], -PolychoricCorrelation.RhoBound, PolychoricCorrelation.RhoBound);
    }
}
