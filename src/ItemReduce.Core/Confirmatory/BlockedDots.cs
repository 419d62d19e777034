using System.Numerics;
using System.Runtime.CompilerServices;
using System.Runtime.InteropServices;
using System.Runtime.Intrinsics;

namespace ItemReduce.Core.Confirmatory;

/// <summary>
/// The one inner kernel of the robust scaling's triangular solves, quadratic forms and information sums: the 16 dot
/// products of four rows with four vectors over a common span, each row and vector loaded once for all 16 (register
/// blocking, as in a blocked matrix product). The summation order depends only on the span length, so results are
/// reproducible on a given machine and independent of the thread count.
/// </summary>
internal static class BlockedDots
{
    /// <summary><see cref="Dot4x4"/> of rows <paramref name="firstRow"/> … + <paramref name="rows"/> − 1 (1 ≤ rows ≤ 4;
    /// the missing rows repeat the last) of the row-major matrix <paramref name="m"/> (row length
    /// <paramref name="stride"/>), columns <paramref name="start"/> … + <paramref name="length"/> − 1, with the vectors
    /// <paramref name="v"/>[b … b + 3] from the same column <paramref name="start"/>.</summary>
    public static void RowsByVectors(double[] m, int stride, int firstRow, int rows, int start, int length, double[][] v, int b, Span<double> sums)
    {
        int last = rows - 1;
        Dot4x4(m.AsSpan(firstRow * stride + start, length), m.AsSpan((firstRow + Math.Min(1, last)) * stride + start, length),
            m.AsSpan((firstRow + Math.Min(2, last)) * stride + start, length), m.AsSpan((firstRow + Math.Min(3, last)) * stride + start, length),
            v[b].AsSpan(start), v[b + 1].AsSpan(start), v[b + 2].AsSpan(start), v[b + 3].AsSpan(start), sums);
    }

    /// <summary>sums[4r + c] = a_r · x_c (r, c = 0..3) over the length of <paramref name="a0"/>; every span at least
    /// that long.</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public static void Dot4x4(ReadOnlySpan<double> a0, ReadOnlySpan<double> a1, ReadOnlySpan<double> a2, ReadOnlySpan<double> a3,
        ReadOnlySpan<double> x0, ReadOnlySpan<double> x1, ReadOnlySpan<double> x2, ReadOnlySpan<double> x3, Span<double> sums)
    {
        int n = a0.Length, t = 0;
        a1 = a1[..n];
        a2 = a2[..n];
        a3 = a3[..n];
        x0 = x0[..n];
        x1 = x1[..n];
        x2 = x2[..n];
        x3 = x3[..n];
        sums = sums[..16];
        sums.Clear();
        if (Vector512.IsHardwareAccelerated && n >= Vector512<double>.Count)
        {
            int m = n / Vector512<double>.Count;
            var va0 = MemoryMarshal.Cast<double, Vector512<double>>(a0);
            var va1 = MemoryMarshal.Cast<double, Vector512<double>>(a1);
            var va2 = MemoryMarshal.Cast<double, Vector512<double>>(a2);
            var va3 = MemoryMarshal.Cast<double, Vector512<double>>(a3);
            var vx0 = MemoryMarshal.Cast<double, Vector512<double>>(x0);
            var vx1 = MemoryMarshal.Cast<double, Vector512<double>>(x1);
            var vx2 = MemoryMarshal.Cast<double, Vector512<double>>(x2);
            var vx3 = MemoryMarshal.Cast<double, Vector512<double>>(x3);
            Vector512<double> s00 = default, s01 = default, s02 = default, s03 = default, s10 = default, s11 = default, s12 = default, s13 = default;
            Vector512<double> s20 = default, s21 = default, s22 = default, s23 = default, s30 = default, s31 = default, s32 = default, s33 = default;
            for (int v = 0; v < m; v++)
            {
                var y0 = vx0[v];
                var y1 = vx1[v];
                var y2 = vx2[v];
                var y3 = vx3[v];
                var r = va0[v];
                s00 = Vector512.FusedMultiplyAdd(r, y0, s00);
                s01 = Vector512.FusedMultiplyAdd(r, y1, s01);
                s02 = Vector512.FusedMultiplyAdd(r, y2, s02);
                s03 = Vector512.FusedMultiplyAdd(r, y3, s03);
                r = va1[v];
                s10 = Vector512.FusedMultiplyAdd(r, y0, s10);
                s11 = Vector512.FusedMultiplyAdd(r, y1, s11);
                s12 = Vector512.FusedMultiplyAdd(r, y2, s12);
                s13 = Vector512.FusedMultiplyAdd(r, y3, s13);
                r = va2[v];
                s20 = Vector512.FusedMultiplyAdd(r, y0, s20);
                s21 = Vector512.FusedMultiplyAdd(r, y1, s21);
                s22 = Vector512.FusedMultiplyAdd(r, y2, s22);
                s23 = Vector512.FusedMultiplyAdd(r, y3, s23);
                r = va3[v];
                s30 = Vector512.FusedMultiplyAdd(r, y0, s30);
                s31 = Vector512.FusedMultiplyAdd(r, y1, s31);
                s32 = Vector512.FusedMultiplyAdd(r, y2, s32);
                s33 = Vector512.FusedMultiplyAdd(r, y3, s33);
            }
            (sums[0], sums[1], sums[2], sums[3]) = (Vector512.Sum(s00), Vector512.Sum(s01), Vector512.Sum(s02), Vector512.Sum(s03));
            (sums[4], sums[5], sums[6], sums[7]) = (Vector512.Sum(s10), Vector512.Sum(s11), Vector512.Sum(s12), Vector512.Sum(s13));
            (sums[8], sums[9], sums[10], sums[11]) = (Vector512.Sum(s20), Vector512.Sum(s21), Vector512.Sum(s22), Vector512.Sum(s23));
            (sums[12], sums[13], sums[14], sums[15]) = (Vector512.Sum(s30), Vector512.Sum(s31), Vector512.Sum(s32), Vector512.Sum(s33));
            t = m * Vector512<double>.Count;
        }
        else if (Vector.IsHardwareAccelerated && n >= Vector<double>.Count)
        {
            int m = n / Vector<double>.Count;
            var va0 = MemoryMarshal.Cast<double, Vector<double>>(a0);
            var va1 = MemoryMarshal.Cast<double, Vector<double>>(a1);
            var va2 = MemoryMarshal.Cast<double, Vector<double>>(a2);
            var va3 = MemoryMarshal.Cast<double, Vector<double>>(a3);
            var vx0 = MemoryMarshal.Cast<double, Vector<double>>(x0);
            var vx1 = MemoryMarshal.Cast<double, Vector<double>>(x1);
            var vx2 = MemoryMarshal.Cast<double, Vector<double>>(x2);
            var vx3 = MemoryMarshal.Cast<double, Vector<double>>(x3);
            Vector<double> s00 = default, s01 = default, s02 = default, s03 = default, s10 = default, s11 = default, s12 = default, s13 = default;
            Vector<double> s20 = default, s21 = default, s22 = default, s23 = default, s30 = default, s31 = default, s32 = default, s33 = default;
            for (int v = 0; v < m; v++)
            {
                var y0 = vx0[v];
                var y1 = vx1[v];
                var y2 = vx2[v];
                var y3 = vx3[v];
                var r = va0[v];
                s00 += r * y0;
                s01 += r * y1;
                s02 += r * y2;
                s03 += r * y3;
                r = va1[v];
                s10 += r * y0;
                s11 += r * y1;
                s12 += r * y2;
                s13 += r * y3;
                r = va2[v];
                s20 += r * y0;
                s21 += r * y1;
                s22 += r * y2;
                s23 += r * y3;
                r = va3[v];
                s30 += r * y0;
                s31 += r * y1;
                s32 += r * y2;
                s33 += r * y3;
            }
            (sums[0], sums[1], sums[2], sums[3]) = (Vector.Sum(s00), Vector.Sum(s01), Vector.Sum(s02), Vector.Sum(s03));
            (sums[4], sums[5], sums[6], sums[7]) = (Vector.Sum(s10), Vector.Sum(s11), Vector.Sum(s12), Vector.Sum(s13));
            (sums[8], sums[9], sums[10], sums[11]) = (Vector.Sum(s20), Vector.Sum(s21), Vector.Sum(s22), Vector.Sum(s23));
            (sums[12], sums[13], sums[14], sums[15]) = (Vector.Sum(s30), Vector.Sum(s31), Vector.Sum(s32), Vector.Sum(s33));
            t = m * Vector<double>.Count;
        }
        for (; t < n; t++)
        {
            double y0 = x0[t], y1 = x1[t], y2 = x2[t], y3 = x3[t];
            double r = a0[t];
            sums[0] += r * y0;
            sums[1] += r * y1;
            sums[2] += r * y2;
            sums[3] += r * y3;
            r = a1[t];
            sums[4] += r * y0;
            sums[5] += r * y1;
            sums[6] += r * y2;
            sums[7] += r * y3;
            r = a2[t];
            sums[8] += r * y0;
            sums[9] += r * y1;
            sums[10] += r * y2;
            sums[11] += r * y3;
            r = a3[t];
            sums[12] += r * y0;
            sums[13] += r * y1;
            sums[14] += r * y2;
            sums[15] += r * y3;
        }
    }
}
