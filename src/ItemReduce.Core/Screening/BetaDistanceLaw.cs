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
        return scale * UpperBetaQuantile(k / 2.0, (n - k - 1) / 2.0, q);
    }

    /// <summary>
    /// x with P(Beta(a, b) &gt; x) = q: Newton's method on the upper tail <c>I_{1−x}(b, a)</c>, whose derivative in x
    /// is minus the Beta density, from the χ² approximation <c>x₀ = χ²_{2a}(q) / (2a + 2b)</c>, kept inside (0, 1) by
    /// bisection steps; falls back to Math.NET's <see cref="Beta.InvCDF"/> when it does not settle in 60 steps.
    /// </summary>
    internal static double UpperBetaQuantile(double a, double b, double q)
    {
        double logB = SpecialFunctions.BetaLn(a, b);
        double lo = 0, hi = 1;
        double x = Math.Clamp(ChiSquareTail.UpperQuantile(q, 2 * a) / (2 * a + 2 * b), 1e-12, 1 - 1e-12);
        for (int step = 0; step < 60; step++)
        {
            double tail = SpecialFunctions.BetaRegularized(b, a, 1 - x);
            double f = tail - q;
            if (f > 0) lo = x; else hi = x;   // the tail falls as x grows
            double density = Math.Exp((a - 1) * Math.Log(x) + (b - 1) * Math.Log(1 - x) - logB);
            double next = x + f / density;
            if (!(next > lo && next < hi)) next = 0.5 * (lo + hi);
            if (Math.Abs(next - x) <= 1e-14 * x) return next;
            x = next;
        }
        return Beta.InvCDF(a, b, 1 - q);
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
