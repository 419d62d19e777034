using System.Runtime.CompilerServices;
using System.Runtime.InteropServices;
using System.Runtime.Intrinsics;

namespace ItemReduce.Core.Screening;

/// <summary>
/// Cholesky factorisation <c>A = L Lᵀ</c> of a small symmetric positive definite matrix, kept inside the
/// screening stage (row-major <c>q × q</c> storage, lower triangle used). The factorisation fails, instead
/// of returning nonsense, when a pivot is not positive or falls below <see cref="RelativePivotTolerance"/>
/// times the matching diagonal entry of <c>A</c> (a numerically singular matrix).
/// </summary>
internal sealed class ScreeningCholesky
{
    /// <summary>A pivot smaller than this share of its original diagonal entry counts as singular.</summary>
    internal const double RelativePivotTolerance = 1e-12;

    private readonly double[] _l;
    private readonly int _order;

    private ScreeningCholesky(double[] l, int order, double logDeterminant)
    {
        _l = l;
        _order = order;
        Order = order;
        LogDeterminant = logDeterminant;
    }

    /// <summary>Matrix order q.</summary>
    public int Order { get; }

    /// <summary><c>ln det A = 2 Σ ln L_ii</c>.</summary>
    public double LogDeterminant { get; }

    /// <summary>Factorises the row-major <paramref name="a"/> (q × q); null when not positive definite.</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public static ScreeningCholesky? TryFactor(double[] a, int q)
    {
        var l = new double[q * q];
        double logDet = 0;
        for (int i = 0; i < q; i++)
        {
            int oi = i * q;
            for (int j = 0; j <= i; j++)
            {
                int oj = j * q;
                double s = a[oi + j];
                for (int t = 0; t < j; t++) s -= l[oi + t] * l[oj + t];
                if (i == j)
                {
                    double diag = a[oi + i];
                    if (!(s > 0) || !(diag > 0) || s <= RelativePivotTolerance * diag || double.IsNaN(s)) return null;
                    double r = Math.Sqrt(s);
                    l[oi + i] = r;
                    logDet += 2 * Math.Log(r);
                }
                else l[oi + j] = s / l[oj + j];
            }
        }
        return new ScreeningCholesky(l, q, logDet);
    }

    /// <summary>Factorises a symmetric <c>double[,]</c>; null when not positive definite.</summary>
    public static ScreeningCholesky? TryFactor(double[,] a)
    {
        int q = a.GetLength(0);
        var flat = new double[q * q];
        for (int i = 0; i < q; i++)
            for (int j = 0; j < q; j++) flat[i * q + j] = a[i, j];
        return TryFactor(flat, q);
    }

    /// <summary>
    /// Quadratic form <c>dᵀ A⁻¹ d = ‖L⁻¹ d‖²</c> by forward substitution; <paramref name="d"/> and
    /// <paramref name="work"/> have length ≥ q (arrays, not spans: this is the hot loop of every distance).
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public double QuadraticForm(double[] d, double[] work)
    {
        int q = _order;
        if (d.Length < q || work.Length < q) throw new ArgumentException($"d and work need length ≥ {q}; got {d.Length} and {work.Length}.");
        // References instead of indexed arrays: the loop runs without bounds checks (lengths checked above; the
        // arithmetic, and so every result bit, is the same as the indexed form).
        ref double l0 = ref MemoryMarshal.GetArrayDataReference(_l);
        ref double w0 = ref MemoryMarshal.GetArrayDataReference(work);
        ref double d0 = ref MemoryMarshal.GetArrayDataReference(d);
        double sum = 0;
        for (int i = 0; i < q; i++)
        {
            ref double li = ref Unsafe.Add(ref l0, i * q);
            double s = Unsafe.Add(ref d0, i);
            int t = 0;
            // Two accumulators: fewer dependent additions (helps unoptimised builds most).
            double s2 = 0;
            for (; t + 1 < i; t += 2)
            {
                s -= Unsafe.Add(ref li, t) * Unsafe.Add(ref w0, t);
                s2 -= Unsafe.Add(ref li, t + 1) * Unsafe.Add(ref w0, t + 1);
            }
            if (t < i) s -= Unsafe.Add(ref li, t) * Unsafe.Add(ref w0, t);
            s += s2;
            double z = s / Unsafe.Add(ref li, i);
            Unsafe.Add(ref w0, i) = z;
            sum += z * z;
        }
        return sum;
    }

    /// <summary>Rows handled together by <see cref="QuadraticForms"/>.</summary>
    internal const int Lanes = 4;

    /// <summary>
    /// <see cref="QuadraticForm"/> of <see cref="Lanes"/> vectors at once, one per vector lane: <paramref name="d"/> holds
    /// them interleaved (<c>d[j · Lanes + lane]</c>, length ≥ q · Lanes), <paramref name="work"/> is scratch of the same
    /// length, <paramref name="result"/> receives the Lanes forms. Each lane performs exactly the scalar operations of
    /// <see cref="QuadraticForm"/> in the same order (separate multiply and subtract, no fused multiply-add), so every
    /// result is bit-identical to the scalar one; the lanes only remove the scalar version's latency stalls.
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public void QuadraticForms(double[] d, double[] work, Span<double> result)
    {
        int q = _order;
        if (d.Length < q * Lanes || work.Length < q * Lanes || result.Length < Lanes)
            throw new ArgumentException($"d and work need length ≥ {q * Lanes} and result ≥ {Lanes}; got {d.Length}, {work.Length} and {result.Length}.");
        ref double l0 = ref MemoryMarshal.GetArrayDataReference(_l);
        ref double w0 = ref MemoryMarshal.GetArrayDataReference(work);
        ref double d0 = ref MemoryMarshal.GetArrayDataReference(d);
        var sum = Vector256<double>.Zero;
        for (int i = 0; i < q; i++)
        {
            ref double li = ref Unsafe.Add(ref l0, i * q);
            var s = Vector256.LoadUnsafe(ref d0, (nuint)(i * Lanes));
            var s2 = Vector256<double>.Zero;
            int t = 0;
            for (; t + 1 < i; t += 2)
            {
                s -= Vector256.Create(Unsafe.Add(ref li, t)) * Vector256.LoadUnsafe(ref w0, (nuint)(t * Lanes));
                s2 -= Vector256.Create(Unsafe.Add(ref li, t + 1)) * Vector256.LoadUnsafe(ref w0, (nuint)((t + 1) * Lanes));
            }
            if (t < i) s -= Vector256.Create(Unsafe.Add(ref li, t)) * Vector256.LoadUnsafe(ref w0, (nuint)(t * Lanes));
            s += s2;
            var z = s / Vector256.Create(Unsafe.Add(ref li, i));
            z.StoreUnsafe(ref w0, (nuint)(i * Lanes));
            sum += z * z;
        }
        sum.CopyTo(result);
    }

    /// <summary>
    /// Solves <c>Lᵀ u = w</c> (back substitution) for <see cref="Lanes"/> vectors at once, interleaved as in
    /// <see cref="QuadraticForms"/> (<c>w[j · Lanes + lane]</c>); after <see cref="QuadraticForms"/> left
    /// <c>w = L⁻¹ d</c> in its work array, this gives <c>u = A⁻¹ d</c>. Every lane performs the same operations in
    /// the same order, so a vector's result does not depend on the vectors sharing its call.
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public void BackSubstitutions(double[] w, double[] u)
    {
        int q = _order;
        if (w.Length < q * Lanes || u.Length < q * Lanes)
            throw new ArgumentException($"w and u need length ≥ {q * Lanes}; got {w.Length} and {u.Length}.");
        ref double l0 = ref MemoryMarshal.GetArrayDataReference(_l);
        ref double w0 = ref MemoryMarshal.GetArrayDataReference(w);
        ref double u0 = ref MemoryMarshal.GetArrayDataReference(u);
        for (int i = q - 1; i >= 0; i--)
        {
            var s = Vector256.LoadUnsafe(ref w0, (nuint)(i * Lanes));
            for (int t = i + 1; t < q; t++)
                s -= Vector256.Create(Unsafe.Add(ref l0, t * q + i)) * Vector256.LoadUnsafe(ref u0, (nuint)(t * Lanes));
            (s / Vector256.Create(Unsafe.Add(ref l0, i * q + i))).StoreUnsafe(ref u0, (nuint)(i * Lanes));
        }
    }

    /// <summary><c>A⁻¹</c> (row-major q × q) as <c>L⁻ᵀ L⁻¹</c>, with <c>L⁻¹</c> from forward substitution on the identity.</summary>
    public double[] Inverse()
    {
        int q = _order;
        var inv = new double[q * q]; // L⁻¹, lower triangular, row-major
        for (int c = 0; c < q; c++)
        {
            inv[c * q + c] = 1 / _l[c * q + c];
            for (int i = c + 1; i < q; i++)
            {
                double s = 0;
                for (int t = c; t < i; t++) s -= _l[i * q + t] * inv[t * q + c];
                inv[i * q + c] = s / _l[i * q + i];
            }
        }
        var a = new double[q * q];
        for (int j = 0; j < q; j++)
            for (int k = 0; k <= j; k++)
            {
                double s = 0;
                for (int i = j; i < q; i++) s += inv[i * q + j] * inv[i * q + k];
                a[j * q + k] = a[k * q + j] = s;
            }
        return a;
    }
}
