using System.Numerics;
using System.Runtime.CompilerServices;
using MathNet.Numerics;

namespace ItemReduce.Core.Screening;

/// <summary>
/// Mendell–Elston approximation of a multivariate normal rectangle probability
/// <c>P(a_k &lt; Z_k ≤ b_k, k = 1..m)</c>, Z ~ N(0, S) (Mendell, N. R., &amp; Elston, R. C., 1974, "Multifactorial
/// qualitative traits: genetic analysis and prediction of recurrence risks", Biometrics 30(1), 41–57; the univariate
/// conditioning approximation as described by Trinh, G., &amp; Genz, A., 2015, "Bivariate conditioning approximations
/// for multivariate normal probabilities", Statistics and Computing 25(5), 989–996, section 2; both citations from
/// memory). The probability is written as a product of conditional probabilities,
/// <c>P = Π_k P(a_k &lt; Z_k ≤ b_k | Z_1..Z_{k−1} in their intervals)</c>; each conditional law is taken to be normal,
/// with the mean and variance that the earlier truncations leave: after variable k is truncated to its interval, its
/// mean and variance become those of the truncated normal (standard formulas), and the later variables' means and
/// covariances are updated as if they were linearly regressed on Z_k (the selection formulas:
/// <c>μ_l += S_lk / S_kk · (μ_k* − μ_k)</c>, <c>S_lq += S_lk S_qk / S_kk² · (S_kk* − S_kk)</c>). The approximation is
/// exact for m = 1 and for independent variables, and its error grows with the correlations; the variables are taken
/// in the order given. Cost O(m³ / 6) multiply-adds per rectangle (a rank-one update of the remaining upper triangle
/// per step). Used by <see cref="RandomAnsweringIndex"/> for the likelihood of one respondent's ordinal answers.
/// </summary>
internal static class MendellElstonApproximation
{
    /// <summary>Smallest conditional probability or variance ratio kept (avoids log 0 and negative variances from rounding).</summary>
    private const double Floor = 1e-300;

    /// <summary>
    /// log P(lower_k &lt; Z_k ≤ upper_k, k &lt; m) for Z ~ N(0, S). <paramref name="s"/> holds S (m × m, row-major,
    /// stride m; only the upper triangle with the diagonal is read) and is overwritten; <paramref name="mean"/> (length
    /// m) is overwritten. Infinite bounds are allowed.
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public static double LogProbability(Span<double> s, int m, ReadOnlySpan<double> lower, ReadOnlySpan<double> upper, Span<double> mean)
    {
        mean[..m].Clear();
        double logP = 0;
        for (int k = 0; k < m; k++)
        {
            double var = Math.Max(s[k * m + k], Floor);
            double sd = Math.Sqrt(var);
            double alpha = (lower[k] - mean[k]) / sd, beta = (upper[k] - mean[k]) / sd;
            double prob = Interval(alpha, beta);
            prob = Math.Max(prob, Floor);
            logP += Math.Log(prob);
            if (k == m - 1) break;
            // Truncated-normal moments of the standardised variable on (alpha, beta].
            double phiA = double.IsInfinity(alpha) ? 0 : Density(alpha), phiB = double.IsInfinity(beta) ? 0 : Density(beta);
            double lambda = (phiA - phiB) / prob;
            double aPhiA = double.IsInfinity(alpha) ? 0 : alpha * phiA, bPhiB = double.IsInfinity(beta) ? 0 : beta * phiB;
            double ratio = Math.Clamp(1 + (aPhiA - bPhiB) / prob - lambda * lambda, 0, 1);
            double shift = sd * lambda;                 // change of the mean of Z_k
            double scale = (ratio - 1) / var;           // S_lq += S_lk S_qk · (ratio − 1) / S_kk
            var row = s.Slice(k * m, m);
            for (int l = k + 1; l < m; l++)
            {
                double slk = row[l];
                mean[l] += slk / var * shift;
                double f = slk * scale;
                if (f == 0) continue;
                var target = s.Slice(l * m + l, m - l);
                var source = row.Slice(l, m - l);
                int t = 0;
                if (Vector.IsHardwareAccelerated)
                {
                    int w = Vector<double>.Count;
                    var fv = new Vector<double>(f);
                    for (; t <= target.Length - w; t += w)
                        (new Vector<double>(target.Slice(t)) + fv * new Vector<double>(source.Slice(t))).CopyTo(target.Slice(t));
                }
                for (; t < target.Length; t++) target[t] += f * source[t];
            }
        }
        return logP;
    }

    /// <summary>Φ(beta) − Φ(alpha) for alpha ≤ beta, computed on the tail that keeps precision.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    internal static double Interval(double alpha, double beta)
    {
        const double invSqrt2 = 0.70710678118654752440;
        // Upper tail Φc(x) = erfc(x / √2) / 2 is accurate for large x; use it when both ends are above 0.
        if (alpha > 0) return 0.5 * (SpecialFunctions.Erfc(alpha * invSqrt2) - SpecialFunctions.Erfc(beta * invSqrt2));
        return 0.5 * (SpecialFunctions.Erfc(-beta * invSqrt2) - SpecialFunctions.Erfc(-alpha * invSqrt2));
    }

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private static double Density(double x) => 0.39894228040143267794 * Math.Exp(-0.5 * x * x);
}
