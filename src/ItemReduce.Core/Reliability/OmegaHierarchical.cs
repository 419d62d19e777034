using ItemReduce.Core.Factoring;

namespace ItemReduce.Core.Reliability;

/// <summary>Result of <see cref="OmegaHierarchical.Compute"/>.</summary>
/// <param name="OmegaH">ω_h = (Σⱼ gⱼ)² / 1ᵀR1.</param>
/// <param name="SecondOrderLoadings">Loadings γ of the k first-order factors on the second-order factor (length k).</param>
/// <param name="GeneralLoadings">General-factor loadings gⱼ = Σ_f P[j,f] γ_f (length p).</param>
/// <param name="GroupLoadings">Group-factor loadings P[j,f] · √(1 − γ_f²) (p × k); 0 where γ_f² ≥ 1.</param>
/// <param name="TotalVariance">1ᵀR1: the variance of the unit-weighted sum of standardized items.</param>
public sealed record OmegaHierarchicalResult(
    double OmegaH, double[] SecondOrderLoadings, double[] GeneralLoadings, double[,] GroupLoadings, double TotalVariance);

/// <summary>
/// Omega hierarchical of the whole item bank through a Schmid–Leiman orthogonalisation of an oblique solution.
/// Steps: (1) a second-order factor: a one-factor minimum-residual fit to the factor correlation matrix Φ (k × k, k ≥ 3),
/// loadings γ (for k = 3 this model is just identified and reproduces Φ's off-diagonal exactly when it is admissible);
/// (2) Schmid, J., &amp; Leiman, J. M. (1957). The development of hierarchical factor solutions. Psychometrika, 22(1),
/// 53–61: general loadings gⱼ = Σ_f P[j,f] γ_f and group loadings P[j,f] √(1 − γ_f²);
/// (3) McDonald, R. P. (1999). Test theory: A unified treatment. Lawrence Erlbaum (ch. 6), and Zinbarg, R. E., Revelle, W.,
/// Yovel, I., &amp; Li, W. (2005). Cronbach's α, Revelle's β, and McDonald's ω_H: Their relations with each other and two
/// alternative conceptualizations of reliability. Psychometrika, 70(1), 123–133: ω_h = (Σⱼ gⱼ)² / 1ᵀR1, the share of the
/// unit-weighted sum's variance due to the general factor, with the denominator the sum of all entries of the observed
/// correlation matrix R the pattern was fitted to (items as scored, reverse-keyed items already reversed).
/// Correlation metric: the sum of standardized items.
/// </summary>
public static class OmegaHierarchical
{
    /// <summary>ω_h from an oblique pattern (p × k), its factor correlations Φ (k × k) and the item correlations R (p × p).</summary>
    /// <exception cref="ArgumentException">Shapes disagree or k &lt; 3.</exception>
    public static OmegaHierarchicalResult Compute(double[,] pattern, double[,] factorCorrelations, double[,] correlation)
    {
        ArgumentNullException.ThrowIfNull(pattern);
        ArgumentNullException.ThrowIfNull(factorCorrelations);
        ArgumentNullException.ThrowIfNull(correlation);
        int p = pattern.GetLength(0), k = pattern.GetLength(1);
        if (k < 3) throw new DataConditionException($"{k} factors; omega hierarchical by Schmid–Leiman needs at least 3.", nameof(pattern));
        if (factorCorrelations.GetLength(0) != k || factorCorrelations.GetLength(1) != k)
            throw new ArgumentException($"Φ is {factorCorrelations.GetLength(0)}×{factorCorrelations.GetLength(1)} for {k} factors.", nameof(factorCorrelations));
        if (correlation.GetLength(0) != p || correlation.GetLength(1) != p)
            throw new ArgumentException($"R is {correlation.GetLength(0)}×{correlation.GetLength(1)} for {p} items.", nameof(correlation));

        var gamma = SecondOrder(factorCorrelations);
        var (general, group) = Orthogonalise(pattern, gamma);
        double total = 0;
        for (int i = 0; i < p; i++)
            for (int j = 0; j < p; j++) total += correlation[i, j];
        double g = general.Sum();
        return new OmegaHierarchicalResult(g * g / total, gamma, general, group, total);
    }

    /// <summary>Step 1: one-factor minres fit to Φ (sign: loadings sum ≥ 0).</summary>
    private static double[] SecondOrder(double[,] phi)
    {
        int k = phi.GetLength(0);
        // n only enters maximum-likelihood fit statistics, which minres does not compute.
        var fit = FactorAnalysis.Fit(phi, 1000, 1, new FactoringOptions { Extraction = FactorExtraction.MinimumResidual, Rotation = FactorRotation.None });
        var gamma = new double[k];
        for (int f = 0; f < k; f++) gamma[f] = fit.Pattern[f, 0];
        if (gamma.Sum() < 0) for (int f = 0; f < k; f++) gamma[f] = -gamma[f];
        return gamma;
    }

    /// <summary>Step 2: Schmid–Leiman general and group loadings.</summary>
    private static (double[] General, double[,] Group) Orthogonalise(double[,] pattern, double[] gamma)
    {
        int p = pattern.GetLength(0), k = pattern.GetLength(1);
        var general = new double[p];
        var group = new double[p, k];
        for (int j = 0; j < p; j++)
            for (int f = 0; f < k; f++)
            {
                general[j] += pattern[j, f] * gamma[f];
                group[j, f] = pattern[j, f] * Math.Sqrt(Math.Max(0, 1 - gamma[f] * gamma[f]));
            }
        return (general, group);
    }
}
