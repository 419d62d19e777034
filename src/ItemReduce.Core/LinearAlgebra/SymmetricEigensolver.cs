using System.Runtime.CompilerServices;
namespace ItemReduce.Core.LinearAlgebra;

/// <summary>
/// Eigenvalues (and optionally eigenvectors) of a real symmetric matrix in two named steps:
/// <see cref="HouseholderTridiagonalize"/> (Householder reduction to tridiagonal form) and
/// <see cref="ImplicitQl"/> (QL iteration with implicit shifts). The procedures follow the EISPACK lineage:
/// Martin, Reinsch &amp; Wilkinson (1968), "Householder's tridiagonalization of a symmetric matrix",
/// Numerische Mathematik 11, 181–195 (tred1/tred2), and Bowdler, Martin, Reinsch &amp; Wilkinson (1968),
/// "The QR and QL algorithms for symmetric matrices", Numerische Mathematik 11, 293–306 (tql1/tql2); as
/// collected in Wilkinson &amp; Reinsch (1971), Handbook for Automatic Computation Vol. II, Linear Algebra,
/// contributions II/2 and II/3, and Smith et al. (1976), Matrix Eigensystem Routines — EISPACK Guide.
/// <para>
/// Conventions: eigenvalues are returned in descending order. Eigenvectors are the columns of the returned
/// matrix, have unit length, and each is signed so that its largest-magnitude element is positive
/// (ties: the first such element). The eigenvalues-only path (<see cref="Eigenvalues"/>, <see cref="EigenvaluesInPlace"/>)
/// skips the accumulation of the Householder transformations and uses the blocked reduction
/// (<see cref="BlockedHouseholderTridiagonalization"/>) and the root-free QL iteration (<see cref="PalWalkerKahanQl"/>),
/// about 4/3 p³ + O(p²) flops; the path with vectors keeps the two steps named above.
/// </para>
/// <para>
/// When only the k leading eigenpairs are needed, <see cref="LeadingDecompose"/> / <see cref="Leading"/> compute them by
/// the Lanczos process with full reorthogonalisation (<see cref="LanczosIteration"/>; Golub &amp; Van Loan, 2013,
/// §10.1 and §10.3.1): far cheaper when the leading eigenvalues stand apart (factor fits), no cheaper when they lie
/// in a dense cluster (the leading eigenvalues of random correlation matrices, which parallel analysis needs).
/// </para>
/// <para>
/// The reduction works on the full (both triangles) row-major matrix so that every inner loop is a
/// contiguous SIMD dot product or rank-2 row update. The QL iteration is capped at
/// <see cref="MaxIterationsPerEigenvalue"/> sweeps per eigenvalue; beyond that a
/// <see cref="NonConvergenceException"/> is thrown.
/// </para>
/// </summary>
public static class SymmetricEigensolver
{
    /// <summary>QL sweeps allowed per eigenvalue before giving up (EISPACK uses 30; we allow 60).</summary>
    public const int MaxIterationsPerEigenvalue = 60;

    /// <summary>Eigenvalues of the symmetric matrix <paramref name="matrix"/> (p × p), descending.
    /// The input is not modified.</summary>
    /// <exception cref="ArgumentException">Not square, not symmetric, or non-finite.</exception>
    /// <exception cref="NonConvergenceException">The QL iteration exceeded its cap.</exception>
    public static double[] Eigenvalues(double[,] matrix)
    {
        MatrixChecks.SymmetricFinite(matrix, nameof(matrix));
        int n = matrix.GetLength(0);
        return EigenvaluesInPlace(MatrixChecks.ToRowMajor(matrix), n, new double[n], new double[n], new double[EigenvaluesWorkLength(n)]);
    }

    /// <summary>Eigenvalues and eigenvectors of <paramref name="matrix"/>: values descending, vectors as the
    /// columns of a p × p matrix (unit length, largest-magnitude element positive). Input not modified.</summary>
    public static (double[] Values, double[,] Vectors) Decompose(double[,] matrix)
    {
        MatrixChecks.SymmetricFinite(matrix, nameof(matrix));
        int n = matrix.GetLength(0);
        var w = MatrixChecks.ToRowMajor(matrix);
        var d = new double[n];
        var e = new double[n];
        var h = new double[n];
        HouseholderTridiagonalize(w, n, d, e, h, new double[2 * n]);
        var zt = AccumulateTransformations(w, n, h);
        ImplicitQl(d, e, zt, n);
        return SortDescending(d, zt, n);
    }

    /// <summary>The <paramref name="k"/> algebraically largest eigenvalues of <paramref name="matrix"/> (descending) and their
    /// eigenvectors (columns of a p × k matrix; unit length, largest-magnitude element positive) by the Lanczos process
    /// with full reorthogonalisation (<see cref="LanczosIteration"/>): each residual ‖A v − λ v‖ is at most
    /// 1e-12 ‖A‖_F. Input not modified.</summary>
    /// <exception cref="ArgumentException">Not square, not symmetric, non-finite, or k outside [1, p].</exception>
    public static (double[] Values, double[,] Vectors) LeadingDecompose(double[,] matrix, int k)
    {
        MatrixChecks.SymmetricFinite(matrix, nameof(matrix));
        int n = matrix.GetLength(0);
        if (k < 1 || k > n) throw new ArgumentException($"k must lie in [1, {n}], got {k}.", nameof(k));
        var (values, rows) = Leading(MatrixChecks.ToRowMajor(matrix), n, k);
        var vectors = new double[n, k];
        for (int c = 0; c < k; c++)
            for (int i = 0; i < n; i++) vectors[i, c] = rows[c * n + i];
        return (values, vectors);
    }

    /// <summary>Unchecked kernel of <see cref="LeadingDecompose"/>: <paramref name="a"/> is the full symmetric row-major
    /// n × n matrix (not modified); the vectors are returned as the rows of a row-major k × n array.</summary>
    internal static (double[] Values, double[] Vectors) Leading(double[] a, int n, int k)
    {
        var result = LanczosIteration.Leading(a, n, k);
        return (result.Values, result.Vectors);
    }

    /// <summary>Length of the scratch array <see cref="EigenvaluesInPlace"/> needs for an n × n matrix.</summary>
    internal static int EigenvaluesWorkLength(int n) => BlockedHouseholderTridiagonalization.WorkLength(n);

    /// <summary>
    /// Unchecked eigenvalues-only kernel for hot loops: <paramref name="a"/> is a symmetric row-major (lower triangle read)
    /// n × n matrix and is destroyed; <paramref name="d"/>, <paramref name="e"/> (length n) and
    /// <paramref name="work"/> (length <see cref="EigenvaluesWorkLength"/>(n)) are scratch. Returns <paramref name="d"/>
    /// sorted descending. The reduction is the blocked one (<see cref="BlockedHouseholderTridiagonalization"/>) and the
    /// tridiagonal step the root-free QL iteration (<see cref="PalWalkerKahanQl"/>): the same eigenvalues as the
    /// unblocked reduction and <see cref="ImplicitQl"/> up to rounding (within 1e-12 of the largest in the tests).
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    internal static double[] EigenvaluesInPlace(double[] a, int n, double[] d, double[] e, double[] work)
    {
        BlockedHouseholderTridiagonalization.Reduce(a, n, d, e, work);
        PalWalkerKahanQl.Eigenvalues(d, e, n);
        Array.Sort(d);
        Array.Reverse(d);
        return d;
    }

    /// <summary>
    /// Step 1 (tred1/tred2): reduce the symmetric row-major matrix (lower triangle read and updated) <paramref name="a"/> to tridiagonal
    /// form T = Qᵀ A Q by Householder reflections P_i = I − u uᵀ / H applied for i = n−1, …, 1 to the leading
    /// i × i block. On return <paramref name="d"/> holds the diagonal of T, <paramref name="e"/>[i] the
    /// sub-diagonal element T[i, i−1] (e[0] = 0). When <paramref name="h"/> is given, the Householder vector
    /// of step i is left in row i, columns 0..i−1 of <paramref name="a"/> and H in h[i] (0 = no reflection).
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    internal static void HouseholderTridiagonalize(double[] a, int n, double[] d, double[] e, double[]? h, double[] work)
    {
        var p = work.AsSpan(0, n);
        var q = work.AsSpan(n, n);
        for (int i = n - 1; i >= 1; i--)
        {
            int l = i - 1, m = i; // block 0..l has m = i rows
            var row = a.AsSpan(i * n, m);
            double scale = 0;
            foreach (double x in row) scale += Math.Abs(x);
            if (l == 0 || scale == 0)
            {
                e[i] = row[l];
                if (h is not null) h[i] = 0;
                d[i] = a[i * n + i];
                continue;
            }
            // Householder vector u (scaled by 1/scale to avoid over/underflow), H = |u|²/2.
            double hh = 0;
            for (int k = 0; k < m; k++) { row[k] /= scale; hh += row[k] * row[k]; }
            double f = row[l];
            double g = f >= 0 ? -Math.Sqrt(hh) : Math.Sqrt(hh);
            e[i] = scale * g;
            hh -= f * g;
            row[l] = f - g;
            ReadOnlySpan<double> u = row;
            // p = A u / H on the leading block, from the lower triangle only: row j gives
            // Σ_{k<j} A_jk u_k + A_jj u_j to p_j and u_j A_jk to p_k (k < j).
            p[..m].Clear();
            for (int j = 0; j < m; j++)
            {
                var rowJ = a.AsSpan(j * n, j);
                p[j] += VectorKernels.DotAndAxpy(rowJ, u, u[j], p) + a[j * n + j] * u[j];
            }
            for (int j = 0; j < m; j++) p[j] /= hh;
            // q = p − K u with K = uᵀp / (2H).
            double kk = VectorKernels.Dot(u, p[..m]) / (2 * hh);
            for (int j = 0; j < m; j++) q[j] = p[j] - kk * u[j];
            // A ← A − u qᵀ − q uᵀ on the lower triangle of the leading block.
            for (int j = 0; j < m; j++) VectorKernels.Rank2Row(u[j], q[..(j + 1)], q[j], u[..(j + 1)], a.AsSpan(j * n, j + 1));
            if (h is not null) h[i] = hh;
            d[i] = a[i * n + i];
        }
        d[0] = a[0];
        e[0] = 0;
    }

    /// <summary>
    /// Step 1b (the accumulation part of tred2): form Qᵀ (row-major) from the stored Householder vectors,
    /// Q = P_{n−1} ⋯ P_1, so that row j of the result is column j of Q.
    /// </summary>
    internal static double[] AccumulateTransformations(double[] a, int n, double[] h)
    {
        var zt = new double[n * n];
        for (int j = 0; j < n; j++) zt[j * n + j] = 1;
        for (int i = 1; i < n; i++)
        {
            if (h[i] == 0) continue;
            int m = i;
            ReadOnlySpan<double> u = a.AsSpan(i * n, m);
            // Zᵀ ← Zᵀ P_i: only rows 0..i−1 of Zᵀ are non-trivial in columns 0..i−1.
            for (int c = 0; c < m; c++)
            {
                var zr = zt.AsSpan(c * n, m);
                double s = VectorKernels.Dot(zr, u) / h[i];
                VectorKernels.Axpy(-s, u, zr);
            }
        }
        return zt;
    }

    /// <summary>
    /// Step 2 (tql1/tql2): implicit-shift QL iteration on the tridiagonal matrix (d, e). On return
    /// <paramref name="d"/> holds the eigenvalues (unsorted). When <paramref name="zt"/> is given (row-major,
    /// rows = vectors), the plane rotations are applied to its rows, turning Qᵀ into the eigenvectors' transpose.
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    internal static void ImplicitQl(double[] d, double[] e, double[]? zt, int n)
    {
        for (int i = 1; i < n; i++) e[i - 1] = e[i];
        e[n - 1] = 0;
        double f = 0, tst1 = 0;
        const double eps = 2.220446049250313e-16; // 2^-52
        for (int l = 0; l < n; l++)
        {
            tst1 = Math.Max(tst1, Math.Abs(d[l]) + Math.Abs(e[l]));
            int m = l;
            while (m < n - 1 && Math.Abs(e[m]) > eps * tst1) m++;
            if (m > l)
            {
                int iter = 0;
                do
                {
                    if (++iter > MaxIterationsPerEigenvalue)
                        throw new NonConvergenceException(
                            $"Symmetric QL iteration did not converge for eigenvalue {l + 1} of {n} within {MaxIterationsPerEigenvalue} sweeps.");
                    // Implicit shift from the leading 2×2 block.
                    double g = d[l];
                    double p = (d[l + 1] - g) / (2 * e[l]);
                    double r = FastHypot(p, 1);
                    if (p < 0) r = -r;
                    d[l] = e[l] / (p + r);
                    d[l + 1] = e[l] * (p + r);
                    double dl1 = d[l + 1];
                    double hs = g - d[l];
                    for (int i = l + 2; i < n; i++) d[i] -= hs;
                    f += hs;
                    // QL sweep with plane rotations from m−1 down to l.
                    p = d[m];
                    double c = 1, c2 = 1, c3 = 1, el1 = e[l + 1], s = 0, s2 = 0;
                    for (int i = m - 1; i >= l; i--)
                    {
                        c3 = c2; c2 = c; s2 = s;
                        g = c * e[i];
                        double hq = c * p;
                        r = FastHypot(p, e[i]);
                        e[i + 1] = s * r;
                        s = e[i] / r;
                        c = p / r;
                        p = c * d[i] - s * g;
                        d[i + 1] = hq + s * (c * g + s * d[i]);
                        if (zt is not null) Rotate(zt, n, i, c, s);
                    }
                    p = -s * s2 * c3 * el1 * e[l] / dl1;
                    e[l] = s * p;
                    d[l] = c * p;
                } while (Math.Abs(e[l]) > eps * tst1);
            }
            d[l] += f;
            e[l] = 0;
        }
    }

    private static void Rotate(double[] zt, int n, int i, double c, double s)
    {
        var zi = zt.AsSpan(i * n, n);
        var zi1 = zt.AsSpan((i + 1) * n, n);
        for (int k = 0; k < n; k++)
        {
            double t = zi1[k];
            zi1[k] = s * zi[k] + c * t;
            zi[k] = c * zi[k] - s * t;
        }
    }

    /// <summary>sqrt(a² + b²): plain formula when a² + b² is safely inside the normal range, else <see cref="Hypot"/>.</summary>
    private static double FastHypot(double a, double b)
    {
        double s = a * a + b * b;
        return s > 1e-290 && s < 1e290 ? Math.Sqrt(s) : Hypot(a, b);
    }

    /// <summary>sqrt(a² + b²) without destructive overflow or underflow.</summary>
    internal static double Hypot(double a, double b)
    {
        double x = Math.Abs(a), y = Math.Abs(b);
        if (x < y) (x, y) = (y, x);
        if (x == 0) return 0;
        double t = y / x;
        return x * Math.Sqrt(1 + t * t);
    }

    private static (double[] Values, double[,] Vectors) SortDescending(double[] d, double[] zt, int n)
    {
        var order = Enumerable.Range(0, n).ToArray();
        Array.Sort(order, (x, y) => d[y].CompareTo(d[x]));
        var values = new double[n];
        var vectors = new double[n, n];
        for (int c = 0; c < n; c++)
        {
            int src = order[c];
            values[c] = d[src];
            var z = zt.AsSpan(src * n, n);
            int big = 0;
            for (int k = 1; k < n; k++) if (Math.Abs(z[k]) > Math.Abs(z[big])) big = k;
            double sign = z[big] < 0 ? -1 : 1;
            for (int k = 0; k < n; k++) vectors[k, c] = sign * z[k];
        }
        return (values, vectors);
    }
}
