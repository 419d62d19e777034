using System.Runtime.CompilerServices;
using MathNet.Numerics;
using MathNet.Numerics.Distributions;

namespace ItemReduce.Core.Screening;

/// <summary>
/// Chi-square probabilities for the screening cutoffs, accurate in the far upper tail. The upper tail
/// <c>Q(x; k) = Γ(k/2, x/2) / Γ(k/2)</c> is always evaluated directly, never as <c>1 − CDF</c> (which loses every
/// digit once Q is below about 1e−16).
/// <para>
/// Whole-number k ≤ 400 (the screening case: k = items answered) uses the finite sums of the incomplete gamma
/// function at integer and half-integer order (standard identities, from memory; checked against scipy in the
/// tests), with h = x/2:
/// even k: <c>Q = e^{−h} Σ_{j=0}^{k/2−1} h^j / j!</c>;
/// odd k: <c>Q = erfc(√h) + e^{−h} Σ_{j=1}^{(k−1)/2} h^{j−1/2} / Γ(j+1/2)</c>.
/// All terms are positive, so the sums are stable; the terms follow the recurrences
/// <c>t_j = t_{j−1}·h/j</c> (even) and <c>t_j = t_{j−1}·h/(j−1/2)</c> (odd, <c>t_1 = e^{−h}·2√h/√π</c>).
/// To keep <c>e^{−h}</c> from underflowing in the far tail it is split as <c>e^{−h/2}·e^{−h/2}</c>: the terms start
/// from <c>e^{−h/2}</c> and the sum is multiplied once more by <c>e^{−h/2}</c>; for h ≤ 1400 neither factor
/// underflows and no term overflows. erfc is Math.NET's <see cref="SpecialFunctions.Erfc"/>, with a first-order
/// correction for the rounding of √h (which alone would cost about h·1e−16 relative error in the far tail).
/// The lower tail for x &lt; k is the rest of the same series (the terms after the last one of the finite sum, with
/// the same recurrence; for odd k through
/// erf(√h) = e^{−h} Σ_{j≥1} h^{j−1/2}/Γ(j+1/2)), again all positive terms; for x ≥ k (above the median) it is 1 − Q.
/// Measured on k = 1..300, x from 1e−6 to Q = 1e−300 (ChiSquareTailTests): relative error of Q at most 3e−14
/// against mpmath at 50 digits and 2.2e−13 against scipy.stats.chi2.sf (scipy's own error there); of P at most
/// 4e−15 against mpmath.
/// </para>
/// <para>
/// Fallback: for k that is not a whole number, k &gt; 400, or x &gt; 2800 (where Q is below the smallest double
/// for every k ≤ 400 anyway) Math.NET's regularised incomplete gamma functions
/// (<see cref="SpecialFunctions.GammaUpperRegularized"/>, <see cref="SpecialFunctions.GammaLowerRegularized"/>) are
/// used; about 3e−13 relative error on the same grid.
/// </para>
/// The upper quantile starts from Math.NET's <see cref="ChiSquared.InvCDF"/> and is polished with Newton steps on
/// <c>ln Q</c>, so that <c>Q(quantile) = q</c> holds to about 1e−12 relative error even for q = 1e−10.
/// </summary>
internal static class ChiSquareTail
{
    private const int MaxNewtonSteps = 50;

    /// <summary>Largest whole-number df evaluated with the finite sums (at most 200 terms).</summary>
    internal const int MaxSumDf = 400;

    /// <summary>Largest x evaluated with the finite sums: e^{−x/4} ≥ e^{−700} is still a normal double.</summary>
    internal const double MaxSumX = 2800;

    /// <summary>Cap on lower-tail series terms (x &lt; k ≤ 400 needs about 130 at most).</summary>
    private const int MaxLowerTerms = 5000;

    /// <summary>√½.</summary>
    private const double SqrtHalf = 0.70710678118654757;

    /// <summary>2/√π.</summary>
    private const double TwoOverSqrtPi = 1.1283791670955126;

    /// <summary>Lower tail <c>P(χ²_k ≤ x)</c>; 0 for x ≤ 0.</summary>
    public static double Cdf(double x, double df)
    {
        if (double.IsNaN(x) || !(df > 0)) return double.NaN;
        if (x <= 0) return 0;
        if (double.IsPositiveInfinity(x)) return 1;
        if (IsSumCase(x, df))
        {
            int k = (int)df;
            // x ≥ k lies above the median (median < mean = k), so Q ≤ 1/2 and 1 − Q keeps full relative accuracy.
            return x >= k ? 1 - WholeDfUpperTail(x, k) : WholeDfLowerTail(x, k);
        }
        return SpecialFunctions.GammaLowerRegularized(df / 2, x / 2);
    }

    /// <summary>Upper tail <c>P(χ²_k &gt; x)</c>; 1 for x ≤ 0, NaN for NaN input or df ≤ 0. Never above 1 (the series
    /// can round to 1 + 2⁻⁵² near x = 0).</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public static double UpperTail(double x, double df)
    {
        if (double.IsNaN(x) || !(df > 0)) return double.NaN;
        if (x <= 0) return 1;
        if (double.IsPositiveInfinity(x)) return 0;
        return Math.Min(1, IsSumCase(x, df) ? WholeDfUpperTail(x, (int)df) : GammaUpperTail(x, df));
    }

    /// <summary>The general path: Math.NET's regularised upper incomplete gamma function Γ(k/2, x/2)/Γ(k/2).</summary>
    internal static double GammaUpperTail(double x, double df) => SpecialFunctions.GammaUpperRegularized(df / 2, x / 2);

    private static bool IsSumCase(double x, double df) => df <= MaxSumDf && x <= MaxSumX && df == Math.Floor(df);

    /// <summary>
    /// The finite head of the series times e^{h/2}: returns <c>Σ_{j=j0}^{J} t_j</c> with <c>t_j = e^{−h/2}·h^j/j!</c>
    /// (even k, j0 = 0, J = k/2 − 1) or <c>t_j = e^{−h/2}·h^{j−1/2}/Γ(j+1/2)</c> (odd k, j0 = 1, J = (k−1)/2);
    /// <paramref name="next"/> is <c>t_{J+1}</c>, the first term of the lower tail, <paramref name="half"/> = e^{−h/2}.
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private static double ScaledHead(double x, double half, int k, out double next)
    {
        double h = 0.5 * x;
        bool odd = (k & 1) == 1;
        double shift = odd ? 0.5 : 0; // t_{j+1} = t_j · h / (j + 1 − shift)
        int j = odd ? 1 : 0, last = odd ? (k - 1) / 2 : k / 2 - 1;
        double term = odd ? half * TwoOverSqrtPi * RootOfHalf(x) : half;
        double sum = 0;
        for (; j <= last; j++)
        {
            sum += term;
            term *= h / (j + 1 - shift);
        }
        next = term;
        return sum;
    }

    /// <summary>
    /// Whole k, 0 &lt; x ≤ <see cref="MaxSumX"/>: even k <c>e^{−h} Σ_{j=0}^{k/2−1} h^j/j!</c>; odd k
    /// <c>erfc(√h) + e^{−h} Σ_{j=1}^{(k−1)/2} h^{j−1/2}/Γ(j+1/2)</c>; h = x/2.
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private static double WholeDfUpperTail(double x, int k)
    {
        double half = Math.Exp(-0.25 * x); // e^{−h/2}; e^{−h} = half², applied in two steps so that it cannot underflow
        double head = half * ScaledHead(x, half, k, out _);
        return (k & 1) == 1 ? ErfcOfRoot(x, half) + head : head;
    }

    /// <summary>
    /// erfc(√h), h = x/2. The rounding of the computed root z alone would cost a relative error of about h·1e−16 in
    /// the far tail (1e−13 at Q = 1e−300), so the residual d = √h − z is corrected to first order:
    /// erfc(z + d) ≈ erfc(z) − d·(2/√π)·e^{−h}, with d = (h − z²)/(2z) and h − z² taken with a single rounding (FMA).
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private static double ErfcOfRoot(double x, double half)
    {
        double z = RootOfHalf(x);
        double d = Math.FusedMultiplyAdd(-z, z, 0.5 * x) / (2 * z);
        return SpecialFunctions.Erfc(z) - d * TwoOverSqrtPi * half * half;
    }

    /// <summary>√(x/2), taken as √x·√½ so that it stays positive even when x/2 underflows (x = 4.9e−324).</summary>
    private static double RootOfHalf(double x) => Math.Sqrt(x) * SqrtHalf;

    /// <summary>
    /// Whole k, 0 &lt; x &lt; k: the lower tail as the rest of the same series, <c>e^{−h} Σ_{j&gt;J} t_j</c> (all terms
    /// positive; for odd k this uses erf(√h) = e^{−h} Σ_{j≥1} h^{j−1/2}/Γ(j+1/2)). Since h &lt; k/2 the term ratio
    /// h/(j + 1 − shift) is below 1 from the start, so the terms fall geometrically.
    /// </summary>
    private static double WholeDfLowerTail(double x, int k)
    {
        double h = 0.5 * x;
        double half = Math.Exp(-0.25 * x);
        ScaledHead(x, half, k, out double term);
        double shift = (k & 1) == 1 ? 0.5 : 0;
        double j = (k & 1) == 1 ? (k + 1) / 2 : k / 2; // index of term
        double sum = 0;
        for (int step = 0; step < MaxLowerTerms && term > sum * 1e-17; step++, j++)
        {
            sum += term;
            term *= h / (j + 1 - shift);
        }
        return half * sum;
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
