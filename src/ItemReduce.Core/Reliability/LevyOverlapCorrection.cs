namespace ItemReduce.Core.Reliability;

/// <summary>
/// Short-form / full-form correlation corrected for item overlap. Levy, P. (1967), "The correction for
/// spurious correlation in the evaluation of short-form tests" Journal of Clinical Psychology, 23(1), 84–86 (citation from
/// memory, not checked against the paper). Because the short form S is part of the full form F, their observed correlation contains
/// S's own error variance twice over. The correction, in the form implemented here (our statement of the
/// principle, derived rather than copied): replace the shared error by independent error, i.e.
/// r_c = (Cov(S, F) − σ²_S (1 − ρ_S)) / (σ_S σ_F), where ρ_S is the short form's reliability (alpha). This is
/// the expected correlation between F and a re-administration of S with fresh errors.
/// </summary>
internal static class LevyOverlapCorrection
{
    /// <summary>Corrected correlation from the short/full covariance, both variances and ρ_S.</summary>
    public static double Correct(double covarianceShortFull, double varianceShort, double varianceFull, double shortReliability)
    {
        if (!(varianceShort > 0 && varianceFull > 0)) return double.NaN;
        return (covarianceShortFull - varianceShort * (1 - shortReliability)) / Math.Sqrt(varianceShort * varianceFull);
    }

    /// <summary>
    /// Uncorrected and corrected correlation between the sum of <paramref name="shortItems"/> and the sum of
    /// <paramref name="fullItems"/>, from the item covariance matrix; ρ_S is the short form's raw alpha.
    /// </summary>
    public static (double Observed, double Corrected) FromCovariance(double[,] covariance, IReadOnlyList<int> shortItems, IReadOnlyList<int> fullItems)
    {
        ArgumentNullException.ThrowIfNull(covariance);
        ArgumentNullException.ThrowIfNull(shortItems);
        ArgumentNullException.ThrowIfNull(fullItems);
        double vs = Block(covariance, shortItems, shortItems), vf = Block(covariance, fullItems, fullItems);
        double csf = Block(covariance, shortItems, fullItems);
        double alpha = CronbachAlpha.FromCovariance(covariance, shortItems);
        double observed = vs > 0 && vf > 0 ? csf / Math.Sqrt(vs * vf) : double.NaN;
        return (observed, Correct(csf, vs, vf, alpha));
    }

    private static double Block(double[,] c, IReadOnlyList<int> a, IReadOnlyList<int> b)
    {
        double s = 0;
        foreach (int i in a) foreach (int j in b) s += c[i, j];
        return s;
    }
}
