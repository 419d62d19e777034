using MathNet.Numerics;
using MathNet.Numerics.Distributions;

namespace ItemReduce.Core.Screening;

/// <summary>
/// Finite-sample law of in-sample squared Mahalanobis distances: when the mean and the covariance (divisor N − 1)
/// are estimated from N independent k-variate normal rows that include row i, <c>N D²_i / (N − 1)²</c> follows
/// Beta(k / 2, (N − k − 1) / 2) (Wilks, S. S., 1963, "Multivariate statistical outliers", Sankhyā A 25(4),
/// 407–426; Gnanadesikan, R., &amp; Kettenring, J. R., 1972, "Robust estimates, residuals, and outlier detection with
/// multiresponse data", Biometrics 28(1), 81–124). Both from memory. Unlike χ²_k, the law is bounded by
/// <c>(N − 1)² / N</c>, and its upper quantiles lie below the χ² ones: with few respondents per item the χ²
/// cutoff is too lenient for in-sample distances and much too strict for out-of-sample ones, which is why the
/// screening uses this law for the respondents in the estimate. For N above <see cref="ChiSquareAbove"/> the two
/// laws differ by less than about k / N relative and the χ² law (with its accurate far tail) is used.
/// </summary>
internal static class BetaDistanceLaw
{
    /// <summary>Sample sizes above which the χ²_k law is used instead.</summary>
    internal const int ChiSquareAbove = 20_000;

    /// <summary>True when the Beta law is defined and used for k items and N rows.</summary>
    public static bool Applies(int n, int k) => n <= ChiSquareAbove && n - k - 1 > 0;

    /// <summary>Upper quantile of D²: the value exceeded with probability <paramref name="q"/>; χ² when the Beta law does not apply.</summary>
    public static double UpperQuantile(double q, int k, int n)
    {
        if (!Applies(n, k)) return ChiSquareTail.UpperQuantile(q, k);
        double scale = (n - 1.0) * (n - 1.0) / n;
        return scale * Beta.InvCDF(k / 2.0, (n - k - 1) / 2.0, 1 - q);
    }

    /// <summary>P(D² &gt; <paramref name="d2"/>); the upper tail is computed directly as I_{1−x}(b, a), never as 1 − CDF.</summary>
    public static double UpperTail(double d2, int k, int n)
    {
        if (double.IsNaN(d2)) return double.NaN;
        if (!Applies(n, k)) return ChiSquareTail.UpperTail(d2, k);
        double x = d2 * n / ((n - 1.0) * (n - 1.0));
        if (x >= 1) return 0;
        if (x <= 0) return 1;
        return SpecialFunctions.BetaRegularized((n - k - 1) / 2.0, k / 2.0, 1 - x);
    }
}
