using MathNet.Numerics;
using MathNet.Numerics.Distributions;

namespace ItemReduce.Core.Screening;

/// <summary>
/// Chi-square probabilities for the screening cutoffs, accurate in the far upper tail. The upper tail
/// <c>Q(x; k) = Γ(k/2, x/2) / Γ(k/2)</c> is evaluated directly with the regularised upper incomplete gamma
/// function (not as <c>1 − CDF</c>, which loses every digit once Q is below about 1e−16). The upper
/// quantile starts from Math.NET's <see cref="ChiSquared.InvCDF"/> and is polished with Newton steps on
/// <c>ln Q</c>, so that <c>Q(quantile) = q</c> holds to about 1e−12 relative error even for q = 1e−10.
/// </summary>
internal static class ChiSquareTail
{
    private const int MaxNewtonSteps = 50;

    /// <summary>Lower tail <c>P(χ²_k ≤ x)</c>; 0 for x ≤ 0.</summary>
    public static double Cdf(double x, double df)
    {
        if (double.IsNaN(x) || !(df > 0)) return double.NaN;
        if (x <= 0) return 0;
        if (double.IsPositiveInfinity(x)) return 1;
        return SpecialFunctions.GammaLowerRegularized(df / 2, x / 2);
    }

    /// <summary>Upper tail <c>P(χ²_k &gt; x)</c>; 1 for x ≤ 0, NaN for NaN input or df ≤ 0.</summary>
    public static double UpperTail(double x, double df)
    {
        if (double.IsNaN(x) || !(df > 0)) return double.NaN;
        if (x <= 0) return 1;
        if (double.IsPositiveInfinity(x)) return 0;
        return SpecialFunctions.GammaUpperRegularized(df / 2, x / 2);
    }

    /// <summary>
    /// The value <c>x</c> with <c>P(χ²_k &gt; x) = q</c> (the "critical value" of tables), 0 &lt; q &lt; 1.
    /// </summary>
    public static double UpperQuantile(double q, double df)
    {
        if (!(q > 0 && q < 1)) throw new ArgumentOutOfRangeException(nameof(q), q, "upper-tail probability must lie in (0, 1)");
        if (!(df > 0)) throw new ArgumentOutOfRangeException(nameof(df), df, "degrees of freedom must be positive");
        double x = ChiSquared.InvCDF(df, 1 - q);
        if (!(x > 0) || double.IsInfinity(x)) x = Math.Max(df, 1e-8);
        double logQ = Math.Log(q);
        for (int step = 0; step < MaxNewtonSteps; step++)
        {
            double tail = UpperTail(x, df);
            if (!(tail > 0)) { x *= 0.5; continue; }
            // d/dx ln Q(x) = −f(x) / Q(x), with f the chi-square density (computed on the log scale).
            double logDensity = (df / 2 - 1) * Math.Log(x) - x / 2 - (df / 2) * Math.Log(2) - SpecialFunctions.GammaLn(df / 2);
            double slope = -Math.Exp(logDensity - Math.Log(tail));
            double delta = (Math.Log(tail) - logQ) / slope;
            double next = x - delta;
            if (next <= 0) next = x / 2;
            if (Math.Abs(next - x) <= 1e-15 * Math.Max(1, x)) { x = next; break; }
            x = next;
        }
        return x;
    }
}
