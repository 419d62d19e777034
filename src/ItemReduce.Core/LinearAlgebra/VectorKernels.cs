using System.Numerics;
using System.Runtime.InteropServices;

namespace ItemReduce.Core.LinearAlgebra;

/// <summary>
/// Small SIMD kernels (<see cref="Vector{T}"/>) on contiguous spans, used by the eigen-solver, Cholesky and
/// correlation code. Unchecked: callers pass spans of equal length. The summation order depends only on the
/// span length (fixed lane blocking), so results are reproducible on a given machine.
/// </summary>
internal static class VectorKernels
{
    /// <summary>Σ x_k y_k.</summary>
    public static double Dot(ReadOnlySpan<double> x, ReadOnlySpan<double> y)
    {
        int n = x.Length, k = 0;
        double s = 0;
        if (Vector.IsHardwareAccelerated && n >= 2 * Vector<double>.Count)
        {
            var vx = MemoryMarshal.Cast<double, Vector<double>>(x);
            var vy = MemoryMarshal.Cast<double, Vector<double>>(y[..x.Length]);
            var acc0 = Vector<double>.Zero;
            var acc1 = Vector<double>.Zero;
            int m = vx.Length, v = 0;
            for (; v + 1 < m; v += 2)
            {
                acc0 += vx[v] * vy[v];
                acc1 += vx[v + 1] * vy[v + 1];
            }
            if (v < m) acc0 += vx[v] * vy[v];
            s = Vector.Sum(acc0 + acc1);
            k = m * Vector<double>.Count;
        }
        for (; k < n; k++) s += x[k] * y[k];
        return s;
    }

    /// <summary>y ← y + α x.</summary>
    public static void Axpy(double alpha, ReadOnlySpan<double> x, Span<double> y)
    {
        int n = x.Length, k = 0;
        if (Vector.IsHardwareAccelerated && n >= Vector<double>.Count)
        {
            var vx = MemoryMarshal.Cast<double, Vector<double>>(x);
            var vy = MemoryMarshal.Cast<double, Vector<double>>(y[..x.Length]);
            var va = new Vector<double>(alpha);
            for (int v = 0; v < vx.Length; v++) vy[v] += va * vx[v];
            k = vx.Length * Vector<double>.Count;
        }
        for (; k < n; k++) y[k] += alpha * x[k];
    }

    /// <summary>Returns Σ x_k u_k and does y ← y + α x in the same pass over <paramref name="x"/>
    /// (one row of a symmetric matrix–vector product from the lower triangle).</summary>
    public static double DotAndAxpy(ReadOnlySpan<double> x, ReadOnlySpan<double> u, double alpha, Span<double> y)
    {
        int n = x.Length, k = 0;
        double s = 0;
        if (Vector.IsHardwareAccelerated && n >= Vector<double>.Count)
        {
            var vx = MemoryMarshal.Cast<double, Vector<double>>(x);
            var vu = MemoryMarshal.Cast<double, Vector<double>>(u[..n]);
            var vy = MemoryMarshal.Cast<double, Vector<double>>(y[..n]);
            var va = new Vector<double>(alpha);
            var acc = Vector<double>.Zero;
            for (int v = 0; v < vx.Length; v++)
            {
                acc += vx[v] * vu[v];
                vy[v] += va * vx[v];
            }
            s = Vector.Sum(acc);
            k = vx.Length * Vector<double>.Count;
        }
        for (; k < n; k++)
        {
            s += x[k] * u[k];
            y[k] += alpha * x[k];
        }
        return s;
    }

    /// <summary>y ← y − a·q − b·u (one row of a symmetric rank-2 update).</summary>
    public static void Rank2Row(double a, ReadOnlySpan<double> q, double b, ReadOnlySpan<double> u, Span<double> y)
    {
        int n = y.Length, k = 0;
        if (Vector.IsHardwareAccelerated && n >= Vector<double>.Count)
        {
            var vq = MemoryMarshal.Cast<double, Vector<double>>(q[..n]);
            var vu = MemoryMarshal.Cast<double, Vector<double>>(u[..n]);
            var vy = MemoryMarshal.Cast<double, Vector<double>>(y);
            var va = new Vector<double>(a);
            var vb = new Vector<double>(b);
            for (int v = 0; v < vy.Length; v++) vy[v] -= va * vq[v] + vb * vu[v];
            k = vy.Length * Vector<double>.Count;
        }
        for (; k < n; k++) y[k] -= a * q[k] + b * u[k];
    }
}
