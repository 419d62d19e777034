using System.Runtime.CompilerServices;
using System.Runtime.Intrinsics;

namespace ItemReduce.Core.LinearAlgebra;

/// <summary>
/// Householder reduction of a symmetric matrix to tridiagonal form in panels of <see cref="PanelWidth"/> reflections:
/// Dongarra, Hammarling &amp; Sorensen (1989), "Block reduction of matrices to condensed forms for eigenvalue
/// computations", Journal of Computational and Applied Mathematics 27, 215–227 (the scheme of LAPACK's blocked
/// symmetric tridiagonal reduction; Golub &amp; Van Loan, 2013, §8.3.1 and §5.2.3 describe the unblocked reduction
/// and the aggregated update). Within a panel each reflection P = I − u uᵀ / H is not applied to the rest of the matrix
/// at once; instead its update A ← A − u wᵀ − w uᵀ is remembered as the pair (u, w) and applied lazily: to the next row
/// before it is reduced and to the matrix–vector product that forms the next w. After the panel the trailing block
/// receives all of them in one symmetric rank-2k update A ← A − U Wᵀ − W Uᵀ, whose register-blocked kernel does most
/// of the arithmetic with each loaded element used many times (the matrix–vector products remain, about half of the
/// 4/3 p³ flops). Each reflection is the one of <see cref="SymmetricEigensolver.HouseholderTridiagonalize"/> (same
/// scaling, same sign choice), so the tridiagonal matrix is the same up to rounding.
/// </summary>
internal static class BlockedHouseholderTridiagonalization
{
    /// <summary>Reflections per panel.</summary>
    public const int PanelWidth = 24;

    /// <summary>Length of the scratch array <see cref="Reduce"/> needs for an n × n matrix.</summary>
    public static int WorkLength(int n) => 2 * (2 * PanelWidth + 2) * n;

    /// <summary>
    /// Reduces the symmetric row-major n × n matrix <paramref name="a"/> (lower triangle read; destroyed) to tridiagonal
    /// form: on return <paramref name="d"/> holds the diagonal and <paramref name="e"/>[i] the sub-diagonal element
    /// T[i, i−1] (e[0] = 0), as <see cref="SymmetricEigensolver.HouseholderTridiagonalize"/> leaves them.
    /// <paramref name="work"/> has at least <see cref="WorkLength"/>(n) elements.
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public static void Reduce(double[] a, int n, double[] d, double[] e, double[] work)
    {
        int nb = PanelWidth;
        // work: W panel (nb rows of n), U panel copy (nb rows of n), then 2 spare rows.
        var wPanel = work.AsSpan(0, (2 * nb + 2) * n);
        int uOffset = (2 * nb + 2) * n; // U panel copy in the second half
        int i = n - 1;
        while (i >= 0)
        {
            int last = i - nb + 1;
            if (last < nb) last = 0; // the final panel takes what is left, down to row 0
            int count = 0;
            for (int s = i; s >= last; s--, count++)
            {
                var row = a.AsSpan(s * n, s + 1);
                for (int k = 0; k < count; k++)
                {
                    var uk = work.AsSpan(uOffset + k * n, n);
                    var wk = wPanel.Slice(k * n, n);
                    VectorKernels.Rank2Row(uk[s], wk[..(s + 1)], wk[s], uk[..(s + 1)], row);
                }
                d[s] = row[s];
                var wRow = wPanel.Slice(count * n, n);
                var uRow = work.AsSpan(uOffset + count * n, n);
                if (s == 0)
                {
                    e[0] = 0;
                    break;
                }
                int m = s;
                var x = row[..m];
                double scale = 0;
                foreach (double v in x) scale += Math.Abs(v);
                if (m == 1 || scale == 0)
                {
                    e[s] = x[m - 1];
                    wRow[..m].Clear();
                    uRow[..m].Clear();
                    continue;
                }
                double hh = 0;
                for (int k = 0; k < m; k++) { x[k] /= scale; hh += x[k] * x[k]; }
                double f = x[m - 1];
                double g = f >= 0 ? -Math.Sqrt(hh) : Math.Sqrt(hh);
                e[s] = scale * g;
                hh -= f * g;
                x[m - 1] = f - g;
                x.CopyTo(uRow);
                ReadOnlySpan<double> u = uRow[..m];
                // y = A u on the leading m × m block as stored (lower triangle), then the panel's pending updates.
                var y = wRow[..m];
                SymmetricLowerTimesVector(a, n, m, u, y);
                for (int k = 0; k < count; k++)
                {
                    ReadOnlySpan<double> uk = work.AsSpan(uOffset + k * n, m);
                    ReadOnlySpan<double> wk = wPanel.Slice(k * n, m);
                    VectorKernels.Rank2Row(VectorKernels.Dot(wk, u), uk, VectorKernels.Dot(uk, u), wk, y);
                }
                // p = y / H; w = p − K u with K = uᵀp / (2H).
                for (int j = 0; j < m; j++) y[j] /= hh;
                double kk = VectorKernels.Dot(u, y) / (2 * hh);
                VectorKernels.Axpy(-kk, u, y);
            }
            if (last == 0) break;
            SymmetricRank2kLower(a, n, last, work.AsSpan(uOffset, count * n), wPanel[..(count * n)], count);
            i = last - 1;
        }
    }

    /// <summary>y = A u for the leading m × m block of the row-major n × n symmetric matrix <paramref name="a"/> from its
    /// lower triangle, four rows at a time: each loaded vector of the four rows serves both their dot products with u
    /// (the lower-triangle part of y's four entries) and their contribution to y's earlier entries (the mirrored upper
    /// part).</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    internal static void SymmetricLowerTimesVector(double[] a, int n, int m, ReadOnlySpan<double> u, Span<double> y)
    {
        y[..m].Clear();
        int j0 = 0;
        if (Vector256.IsHardwareAccelerated)
        {
            for (; j0 + 4 <= m; j0 += 4)
            {
                int cEnd = j0 & ~3;
                var r0 = a.AsSpan(j0 * n, cEnd);
                var r1 = a.AsSpan((j0 + 1) * n, cEnd);
                var r2 = a.AsSpan((j0 + 2) * n, cEnd);
                var r3 = a.AsSpan((j0 + 3) * n, cEnd);
                var b0 = Vector256.Create(u[j0]);
                var b1 = Vector256.Create(u[j0 + 1]);
                var b2 = Vector256.Create(u[j0 + 2]);
                var b3 = Vector256.Create(u[j0 + 3]);
                Vector256<double> t0 = default, t1 = default, t2 = default, t3 = default;
                for (int c = 0; c < cEnd; c += 4)
                {
                    var x0 = Vector256.Create(r0.Slice(c, 4));
                    var x1 = Vector256.Create(r1.Slice(c, 4));
                    var x2 = Vector256.Create(r2.Slice(c, 4));
                    var x3 = Vector256.Create(r3.Slice(c, 4));
                    var uc = Vector256.Create(u.Slice(c, 4));
                    t0 = Vector256.FusedMultiplyAdd(x0, uc, t0);
                    t1 = Vector256.FusedMultiplyAdd(x1, uc, t1);
                    t2 = Vector256.FusedMultiplyAdd(x2, uc, t2);
                    t3 = Vector256.FusedMultiplyAdd(x3, uc, t3);
                    var yc = y.Slice(c, 4);
                    var acc = Vector256.Create((ReadOnlySpan<double>)yc);
                    acc = Vector256.FusedMultiplyAdd(x0, b0, acc);
                    acc = Vector256.FusedMultiplyAdd(x1, b1, acc);
                    acc = Vector256.FusedMultiplyAdd(x2, b2, acc);
                    acc = Vector256.FusedMultiplyAdd(x3, b3, acc);
                    acc.CopyTo(yc);
                }
                y[j0] += Vector256.Sum(t0);
                y[j0 + 1] += Vector256.Sum(t1);
                y[j0 + 2] += Vector256.Sum(t2);
                y[j0 + 3] += Vector256.Sum(t3);
                for (int j = j0; j < j0 + 4; j++)
                {
                    double uj = u[j], s = 0;
                    int o = j * n;
                    for (int c = cEnd; c < j; c++)
                    {
                        s += a[o + c] * u[c];
                        y[c] += a[o + c] * uj;
                    }
                    y[j] += s + a[o + j] * uj;
                }
            }
        }
        for (int j = j0; j < m; j++)
        {
            var rowJ = a.AsSpan(j * n, j);
            y[j] += VectorKernels.DotAndAxpy(rowJ, u, u[j], y) + a[j * n + j] * u[j];
        }
    }

    /// <summary>A ← A − U Wᵀ − W Uᵀ on the lower triangle of the leading m × m block of the row-major n × n matrix
    /// <paramref name="a"/>, where U and W hold <paramref name="count"/> vectors as rows of stride n. Rows in blocks of
    /// four, columns in blocks of eight (two 256-bit vectors): 16 fused multiply-adds per pair of vector loads.</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    internal static void SymmetricRank2kLower(double[] a, int n, int m, ReadOnlySpan<double> u, ReadOnlySpan<double> w, int count)
    {
        int r0 = 0;
        if (Vector256.IsHardwareAccelerated)
        {
            for (; r0 + 4 <= m; r0 += 4)
            {
                int cEnd = r0 & ~7;
                for (int c0 = 0; c0 < cEnd; c0 += 8) Block4x8(a, n, r0, c0, u, w, count);
                for (int rr = r0; rr < r0 + 4; rr++) Rank2kRowTail(a, n, rr, cEnd, u, w, count);
            }
        }
        for (int rr = r0; rr < m; rr++) Rank2kRowTail(a, n, rr, 0, u, w, count);
    }

    /// <summary>Row <paramref name="r"/>, columns <paramref name="c0"/>..r, of the rank-2k update, one vector pair at a time.</summary>
    private static void Rank2kRowTail(double[] a, int n, int r, int c0, ReadOnlySpan<double> u, ReadOnlySpan<double> w, int count)
    {
        var row = a.AsSpan(r * n + c0, r + 1 - c0);
        for (int k = 0; k < count; k++)
            VectorKernels.Rank2Row(u[k * n + r], w.Slice(k * n + c0, row.Length), w[k * n + r], u.Slice(k * n + c0, row.Length), row);
    }

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private static void Block4x8(double[] a, int n, int r0, int c0, ReadOnlySpan<double> u, ReadOnlySpan<double> w, int count)
    {
        Vector256<double> s00 = default, s01 = default, s10 = default, s11 = default;
        Vector256<double> s20 = default, s21 = default, s30 = default, s31 = default;
        for (int k = 0; k < count; k++)
        {
            int o = k * n;
            var w0 = Vector256.Create(w.Slice(o + c0, 4));
            var w1 = Vector256.Create(w.Slice(o + c0 + 4, 4));
            var u0 = Vector256.Create(u.Slice(o + c0, 4));
            var u1 = Vector256.Create(u.Slice(o + c0 + 4, 4));
            var ur = Vector256.Create(u[o + r0]);
            var wr = Vector256.Create(w[o + r0]);
            s00 = Vector256.FusedMultiplyAdd(ur, w0, Vector256.FusedMultiplyAdd(wr, u0, s00));
            s01 = Vector256.FusedMultiplyAdd(ur, w1, Vector256.FusedMultiplyAdd(wr, u1, s01));
            ur = Vector256.Create(u[o + r0 + 1]);
            wr = Vector256.Create(w[o + r0 + 1]);
            s10 = Vector256.FusedMultiplyAdd(ur, w0, Vector256.FusedMultiplyAdd(wr, u0, s10));
            s11 = Vector256.FusedMultiplyAdd(ur, w1, Vector256.FusedMultiplyAdd(wr, u1, s11));
            ur = Vector256.Create(u[o + r0 + 2]);
            wr = Vector256.Create(w[o + r0 + 2]);
            s20 = Vector256.FusedMultiplyAdd(ur, w0, Vector256.FusedMultiplyAdd(wr, u0, s20));
            s21 = Vector256.FusedMultiplyAdd(ur, w1, Vector256.FusedMultiplyAdd(wr, u1, s21));
            ur = Vector256.Create(u[o + r0 + 3]);
            wr = Vector256.Create(w[o + r0 + 3]);
            s30 = Vector256.FusedMultiplyAdd(ur, w0, Vector256.FusedMultiplyAdd(wr, u0, s30));
            s31 = Vector256.FusedMultiplyAdd(ur, w1, Vector256.FusedMultiplyAdd(wr, u1, s31));
        }
        Subtract(a, r0 * n + c0, s00, s01);
        Subtract(a, (r0 + 1) * n + c0, s10, s11);
        Subtract(a, (r0 + 2) * n + c0, s20, s21);
        Subtract(a, (r0 + 3) * n + c0, s30, s31);
    }

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private static void Subtract(double[] a, int at, Vector256<double> lo, Vector256<double> hi)
    {
        var target = a.AsSpan(at, 8);
        (Vector256.Create(target[..4]) - lo).CopyTo(target);
        (Vector256.Create(target.Slice(4, 4)) - hi).CopyTo(target[4..]);
    }
}
