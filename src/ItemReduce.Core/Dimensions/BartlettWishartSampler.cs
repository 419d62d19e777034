using System.Runtime.CompilerServices;
using ItemReduce.Core.Confirmatory;
using ItemReduce.Core.LinearAlgebra;
using ItemReduce.Core.Randomness;

namespace ItemReduce.Core.Dimensions;

/// <summary>
/// Draws W ~ Wishart_p(I, m) by the Bartlett decomposition — Bartlett (1933), "On the theory of statistical
/// regression", Proceedings of the Royal Society of Edinburgh 53, 260–283; in the form of Anderson (2003),
/// An Introduction to Multivariate Statistical Analysis, 3rd ed., Theorem 7.2.1 / Corollary 7.2.1 and
/// Odell &amp; Feiveson (1966), JASA 61, 199–203: W = L Lᵀ with L lower triangular, independent
/// L_ii² ~ χ²(m − i + 1) for i = 1..p and L_ij ~ N(0, 1) for i &gt; j. χ² variates come from
/// <see cref="MarsagliaTsangGamma"/>.
/// <para>
/// Use in parallel analysis: the centred cross-product matrix of n independent N_p(0, I) observations is
/// Wishart_p(I, n − 1), and the sample correlation matrix is its scale-free version
/// R = D^{−1/2} W D^{−1/2}. So a reference correlation matrix for n respondents costs p(p+1)/2 random
/// numbers and p³/6 multiply-adds, independent of n. Requires m ≥ p (n &gt; p).
/// </para>
/// <para>
/// General scale matrix: if W ~ Wishart_p(I, m) and Σ = C Cᵀ (C lower triangular, the Cholesky factor), then
/// C W Cᵀ ~ Wishart_p(Σ, m) (a standard property of the Wishart distribution; Anderson, 2003, ch. 7). With W = L Lᵀ from the Bartlett factor, C W Cᵀ
/// = A Aᵀ
/// where A = C L is again lower triangular, so a draw costs p³/3 multiply-adds: the sample correlation matrix of
/// n = m + 1 normal observations from a population with correlation matrix Σ (used by <see cref="ComparisonData"/>).
/// </para>
/// </summary>
public static class BartlettWishartSampler
{
    /// <summary>One draw of W ~ Wishart_p(I, <paramref name="degreesOfFreedom"/>) (p × p).</summary>
    /// <exception cref="ArgumentException">p &lt; 1 or degreesOfFreedom &lt; p.</exception>
    public static double[,] SampleWishart(int p, int degreesOfFreedom, RandomStream rng)
    {
        Validate(p, degreesOfFreedom, rng);
        var l = new double[p * p];
        var w = new double[p * p];
        SampleFactor(p, degreesOfFreedom, rng, l);
        Product(l, p, w);
        return MatrixChecks.FromRowMajor(w, p);
    }

    /// <summary>One draw of the correlation matrix of n = <paramref name="degreesOfFreedom"/> + 1 independent
    /// standard-normal p-vectors (p × p, unit diagonal).</summary>
    public static double[,] SampleCorrelation(int p, int degreesOfFreedom, RandomStream rng)
    {
        Validate(p, degreesOfFreedom, rng);
        var w = new double[p * p];
        SampleCorrelationInto(p, degreesOfFreedom, rng, new double[p * p], w);
        return MatrixChecks.FromRowMajor(w, p);
    }

    private static void Validate(int p, int df, RandomStream rng)
    {
        ArgumentNullException.ThrowIfNull(rng);
        if (p < 1) throw new ArgumentException($"p must be ≥ 1, got {p}.", nameof(p));
        if (df < p)
            throw new DataConditionException($"Degrees of freedom must be ≥ p = {p} (more respondents than items), got {df}.", nameof(df));
    }

    /// <summary>Unchecked kernel: fills <paramref name="w"/> (row-major p × p, full) with a correlation draw;
    /// <paramref name="l"/> (p × p) is scratch.</summary>
    internal static void SampleCorrelationInto(int p, int df, RandomStream rng, double[] l, double[] w)
    {
        SampleFactor(p, df, rng, l);
        Product(l, p, w);
        ScaleToCorrelation(w, p);
    }

    /// <summary>Unchecked kernel: fills <paramref name="w"/> (row-major p × p, full) with the sample correlation
    /// matrix of df + 1 normal observations whose population correlation has the lower Cholesky factor
    /// <paramref name="c"/> (row-major, strict upper triangle zero); <paramref name="l"/> and <paramref name="a"/> are scratch.</summary>
    internal static void SampleCorrelationInto(int p, int df, double[] c, RandomStream rng, double[] l, double[] a, double[] w)
    {
        SampleFactor(p, df, rng, l);
        LowerProduct(c, l, p, a);
        Product(l, p, w);
        ScaleToCorrelation(w, p);
    }

    /// <summary>L ← C L for lower-triangular C and L (row-major): (C L)_ij = Σ_{j ≤ k ≤ i} C_ik L_kj, lower triangular. L
    /// is first transposed into the scratch <paramref name="lt"/> so that every entry is a dot product of two contiguous
    /// rows, taken sixteen at a time (<see cref="BlockedDots.Dot4x4"/>).</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private static void LowerProduct(double[] c, double[] l, int p, double[] lt)
    {
        for (int i = 0; i < p; i++)
            for (int k = 0; k < p; k++) lt[k * p + i] = l[i * p + k];
        var a = l;
        Span<double> sums = stackalloc double[16];
        Array.Clear(a, 0, p * p);
        for (int i0 = 0; i0 < p; i0 += 4)
            for (int j0 = 0; j0 <= i0; j0 += 4)
            {
                // Rows i0.. of C and rows j0.. of Lᵀ are zero outside columns j0 .. i0 + 3.
                int end = Math.Min(p, i0 + 4), length = end - j0;
                Dot4x4Clamped(c, lt, p, i0, j0, j0, length, sums);
                for (int r = 0; r < 4 && i0 + r < p; r++)
                    for (int q = 0; q < 4 && j0 + q <= i0 + r; q++) a[(i0 + r) * p + j0 + q] = sums[4 * r + q];
            }
    }

    /// <summary>The 16 dot products of rows <paramref name="i0"/>.. of <paramref name="x"/> with rows <paramref name="j0"/>..
    /// of <paramref name="y"/> (row length p) over columns start .. start + length − 1; rows past p repeat the last.</summary>
    private static void Dot4x4Clamped(double[] x, double[] y, int p, int i0, int j0, int start, int length, Span<double> sums)
    {
        int last = p - 1;
        BlockedDots.Dot4x4(x.AsSpan(i0 * p + start, length), x.AsSpan(Math.Min(i0 + 1, last) * p + start, length),
            x.AsSpan(Math.Min(i0 + 2, last) * p + start, length), x.AsSpan(Math.Min(i0 + 3, last) * p + start, length),
            y.AsSpan(j0 * p + start, length), y.AsSpan(Math.Min(j0 + 1, last) * p + start, length),
            y.AsSpan(Math.Min(j0 + 2, last) * p + start, length), y.AsSpan(Math.Min(j0 + 3, last) * p + start, length), sums);
    }

    /// <summary>Bartlett factor: row i (0-based) holds L_i0..L_ii; L_ii = sqrt(χ²(m − i)), i.e. χ²(m − i + 1) in
    /// 1-based numbering; strict upper triangle zero.</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    internal static void SampleFactor(int p, int df, RandomStream rng, double[] l)
    {
        for (int i = 0; i < p; i++)
        {
            int o = i * p;
            for (int j = 0; j < i; j++) l[o + j] = rng.NextGaussian();
            l[o + i] = Math.Sqrt(MarsagliaTsangGamma.ChiSquare(rng, df - i));
            Array.Clear(l, o + i + 1, p - i - 1);
        }
    }

    /// <summary>W = L Lᵀ: W_ij = Σ_{k ≤ j} L_ik L_jk for j ≤ i (dot products of contiguous rows, sixteen at a time by
    /// <see cref="BlockedDots.Dot4x4"/>), mirrored.</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private static void Product(double[] l, int p, double[] w)
    {
        Span<double> sums = stackalloc double[16];
        for (int i0 = 0; i0 < p; i0 += 4)
            for (int j0 = 0; j0 <= i0; j0 += 4)
            {
                // Rows j0 .. j0 + 3 of L are zero beyond column j0 + 3.
                Dot4x4Clamped(l, l, p, i0, j0, 0, Math.Min(p, j0 + 4), sums);
                for (int r = 0; r < 4 && i0 + r < p; r++)
                    for (int q = 0; q < 4 && j0 + q <= i0 + r; q++)
                    {
                        int i = i0 + r, j = j0 + q;
                        w[i * p + j] = sums[4 * r + q];
                        w[j * p + i] = sums[4 * r + q];
                    }
            }
    }

    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private static void ScaleToCorrelation(double[] w, int p)
    {
        Span<double> s = p <= 512 ? stackalloc double[p] : new double[p];
        for (int i = 0; i < p; i++) s[i] = 1 / Math.Sqrt(w[i * p + i]);
        for (int i = 0; i < p; i++)
        {
            var row = w.AsSpan(i * p, p);
            double si = s[i];
            for (int j = 0; j < p; j++) row[j] *= si * s[j];
            row[i] = 1;
        }
    }
}
