using ItemReduce.Core.Factoring;

namespace ItemReduce.Core.Reliability;

/// <summary>
/// Coefficient omega total: McDonald, R. P. (1999). Test Theory: A Unified Treatment. Mahwah, NJ: Erlbaum
/// (ch. 6). From a one-factor model with loadings λ and uniquenesses ψ,
/// ω = (Σλ)² / ((Σλ)² + Σψ). ItemReduce fits the one-factor model by minres to the correlation matrix of the
/// scale's items, so ω here is on the correlation metric: the reliability of the sum of standardized items.
/// NaN for fewer than 3 items (one-factor model not identified).
/// </summary>
internal static class McDonaldOmega
{
    /// <summary>ω from given loadings and uniquenesses (same length).</summary>
    public static double FromLoadings(IReadOnlyList<double> loadings, IReadOnlyList<double> uniquenesses)
    {
        ArgumentNullException.ThrowIfNull(loadings);
        ArgumentNullException.ThrowIfNull(uniquenesses);
        if (loadings.Count != uniquenesses.Count)
            throw new ArgumentException($"{loadings.Count} loadings but {uniquenesses.Count} uniquenesses.", nameof(uniquenesses));
        double s = loadings.Sum(), u = uniquenesses.Sum();
        return s * s / (s * s + u);
    }

    /// <summary>One-factor minres fit to <paramref name="correlation"/> (k × k) and the resulting ω with the
    /// loadings used; (NaN, null) for k &lt; 3.</summary>
    public static (double Omega, FactorSolution? Model) FromCorrelation(double[,] correlation, int n)
    {
        ArgumentNullException.ThrowIfNull(correlation);
        if (correlation.GetLength(0) < 3) return (double.NaN, null);
        var model = FactorAnalysis.Fit(correlation, Math.Max(n, 2), 1, new FactoringOptions { Rotation = FactorRotation.None });
        var lambda = Enumerable.Range(0, model.ItemCount).Select(j => model.Pattern[j, 0]).ToArray();
        return (FromLoadings(lambda, model.Uniquenesses), model);
    }
}
