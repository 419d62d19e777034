using ItemReduce.Core.Randomness;

namespace ItemReduce.Core.LinearAlgebra;

/// <summary>
/// The leading (algebraically largest) k eigenpairs of a real symmetric matrix by the Lanczos process with full
/// reorthogonalisation: Lanczos (1950), "An iteration method for the solution of the eigenvalue problem of linear
/// differential and integral operators", Journal of Research of the National Bureau of Standards 45(4), 255–282;
/// in the form of Golub &amp; Van Loan (2013), Matrix Computations, 4th ed., §10.1 (Lanczos tridiagonalisation,
/// Ritz pairs and the residual bound β_j |s_ji|) and §10.3.1 (complete reorthogonalisation), and Parlett (1998),
/// The Symmetric Eigenvalue Problem, SIAM Classics in Applied Mathematics 20, ch. 13 (section numbers from memory).
/// <para>
/// Steps: (1) a fixed pseudo-random start vector (seeded, so results are deterministic); (2) Lanczos steps
/// w = A q_j − α_j q_j − β_{j−1} q_{j−1}, each followed by two passes of classical Gram–Schmidt against every
/// earlier vector (full reorthogonalisation); (3) every few steps the Ritz values θ_i and vectors s_i of the j × j
/// tridiagonal T_j (<see cref="SymmetricEigensolver.ImplicitQl"/>), stopping when every one of the k largest has
/// residual ‖A y_i − θ_i y_i‖ = β_j |s_ji| ≤ <see cref="RelativeTolerance"/> · ‖A‖_F; (4) Ritz vectors y_i = Q_j s_i.
/// A breakdown (β_j ≈ 0: an invariant subspace was found) continues from a new random vector orthogonal to the
/// basis. At j = n the Krylov basis spans the whole space and T_n has A's eigenvalues exactly (to rounding), so the
/// process always ends; the number of steps is capped at n by construction.
/// </para>
/// <para>
/// Use: cheaper than a full decomposition when k is small and the leading eigenvalues stand apart from the rest
/// (the k-factor minimum-residual fits). When the wanted eigenvalues lie in a dense cluster (e.g. the leading
/// eigenvalues of random correlation matrices) convergence takes many steps and the full decomposition is as cheap.
/// Limitation of the single-vector method: an exactly repeated leading eigenvalue (not generic for sample correlation
/// matrices) shows up once until the Krylov space becomes invariant, so a copy can be missed.
/// </para>
/// </summary>
internal static class LanczosIteration
{
    /// <summary>Residual tolerance relative to ‖A‖_F: a Ritz pair is accepted when ‖A y − θ y‖ ≤ 1e-12 ‖A‖_F; the
    /// Ritz value is then within that bound of an eigenvalue (and usually far closer, residual² / gap).</summary>
    public const double RelativeTolerance = 1e-12;

    private const ulong StartPurpose = 0x4C414E43; // "LANC"

    /// <summary>Outcome: the k leading eigenvalues (descending), their unit eigenvectors (row i of
    /// <see cref="Vectors"/>, row-major k × n, signed so that the largest-magnitude element is positive) and the
    /// number of Lanczos steps taken.</summary>
    public readonly record struct Result(double[] Values, double[] Vectors, int Steps);

    /// <summary>Leading <paramref name="k"/> eigenpairs of the symmetric row-major n × n matrix <paramref name="a"/>
    /// (both triangles; not modified). Unchecked kernel: 1 ≤ k ≤ n.</summary>
    public static Result Leading(double[] a, int n, int k)
    {
        double norm = Math.Sqrt(VectorKernels.Dot(a, a));
        double tol = RelativeTolerance * Math.Max(norm, double.Epsilon);
        int capacity = Math.Min(n, 2 * k + 32);
        var basis = new double[capacity * n];    // Lanczos vectors q_0, q_1, … as rows; grows when needed
        var alpha = new double[n];
        var beta = new double[n];                // beta[j] couples q_j and q_{j+1}
        var w = new double[n];
        var coef = new double[n];
        var rng = RandomStream.ForTask(1, 0, StartPurpose);
        StartVector(basis, n, 0, rng, w, coef);
        int j = 0, nextCheck = Math.Min(n, k + 8);
        double[]? theta = null, s = null;
        while (true)
        {
            var q = basis.AsSpan(j * n, n);
            for (int i = 0; i < n; i++) w[i] = VectorKernels.Dot(a.AsSpan(i * n, n), q);
            alpha[j] = VectorKernels.Dot(q, w);
            VectorKernels.Axpy(-alpha[j], q, w);
            if (j > 0) VectorKernels.Axpy(-beta[j - 1], basis.AsSpan((j - 1) * n, n), w);
            Reorthogonalise(basis, n, j + 1, w, coef);
            Reorthogonalise(basis, n, j + 1, w, coef);
            double b = Math.Sqrt(VectorKernels.Dot(w, w));
            int m = j + 1;
            if (m == n || m >= nextCheck)
            {
                (theta, s) = RitzPairs(alpha, beta, m);
                if (m == n || Converged(theta, s, m, k, b, tol)) { j = m; break; }
                nextCheck = Math.Min(n, m + Math.Max(4, m / 4));
            }
            beta[j] = b;
            if (m == capacity)
            {
                capacity = Math.Min(n, 2 * capacity);
                Array.Resize(ref basis, capacity * n);
            }
            var qn = basis.AsSpan(m * n, n);
            if (b > tol * 1e-3)
            {
                for (int i = 0; i < n; i++) qn[i] = w[i] / b;
            }
            else
            {
                // Breakdown: the basis spans an invariant subspace; continue from a fresh orthogonal direction.
                beta[j] = 0;
                StartVector(basis, n, m, rng, w, coef);
            }
            j = m;
        }
        return RitzVectors(basis, n, j, k, theta!, s!);
    }

    /// <summary>Row <paramref name="row"/> of the basis: a random vector orthogonalised against rows 0..row−1, unit length.</summary>
    private static void StartVector(double[] basis, int n, int row, RandomStream rng, double[] w, double[] coef)
    {
        while (true)
        {
            for (int i = 0; i < n; i++) w[i] = rng.NextGaussian();
            Reorthogonalise(basis, n, row, w, coef);
            Reorthogonalise(basis, n, row, w, coef);
            double b = Math.Sqrt(VectorKernels.Dot(w, w));
            if (b > 1e-8)
            {
                var q = basis.AsSpan(row * n, n);
                for (int i = 0; i < n; i++) q[i] = w[i] / b;
                return;
            }
        }
    }

    /// <summary>One classical Gram–Schmidt pass: w ← w − Q (Qᵀ w) over the first <paramref name="rows"/> basis vectors.</summary>
    private static void Reorthogonalise(double[] basis, int n, int rows, double[] w, double[] coef)
    {
        for (int r = 0; r < rows; r++) coef[r] = VectorKernels.Dot(basis.AsSpan(r * n, n), w);
        for (int r = 0; r < rows; r++) VectorKernels.Axpy(-coef[r], basis.AsSpan(r * n, n), w);
    }

    /// <summary>Eigenvalues (unsorted) and eigenvectors (rows of the returned m × m row-major array) of T_m.</summary>
    private static (double[] Theta, double[] S) RitzPairs(double[] alpha, double[] beta, int m)
    {
        var d = new double[m];
        var e = new double[m];
        Array.Copy(alpha, d, m);
        // ImplicitQl expects e[i] = T[i, i−1] (e[0] unused).
        for (int i = 1; i < m; i++) e[i] = beta[i - 1];
        var st = new double[m * m];
        for (int i = 0; i < m; i++) st[i * m + i] = 1;
        SymmetricEigensolver.ImplicitQl(d, e, st, m);
        return (d, st);
    }

    /// <summary>True when the k largest Ritz values all have residual β |last component| ≤ tol.</summary>
    private static bool Converged(double[] theta, double[] s, int m, int k, double b, double tol)
    {
        if (m < k) return false;
        var order = Descending(theta, m);
        for (int c = 0; c < k; c++)
            if (b * Math.Abs(s[order[c] * m + m - 1]) > tol) return false;
        return true;
    }

    /// <summary>Indices 0..m−1 ordered by descending <paramref name="theta"/> (ties by index).</summary>
    private static int[] Descending(double[] theta, int m)
    {
        var order = Enumerable.Range(0, m).ToArray();
        Array.Sort(order, (x, y) => theta[y].CompareTo(theta[x]) is int c && c != 0 ? c : x.CompareTo(y));
        return order;
    }

    private static Result RitzVectors(double[] basis, int n, int m, int k, double[] theta, double[] s)
    {
        var order = Descending(theta, m);
        var values = new double[k];
        var vectors = new double[k * n];
        for (int c = 0; c < k; c++)
        {
            int src = order[c];
            values[c] = theta[src];
            var y = vectors.AsSpan(c * n, n);
            for (int r = 0; r < m; r++) VectorKernels.Axpy(s[src * m + r], basis.AsSpan(r * n, n), y);
            double len = Math.Sqrt(VectorKernels.Dot(y, y));
            int big = 0;
            for (int i = 1; i < n; i++) if (Math.Abs(y[i]) > Math.Abs(y[big])) big = i;
            double scale = (y[big] < 0 ? -1 : 1) / len;
            for (int i = 0; i < n; i++) y[i] *= scale;
        }
        return new Result(values, vectors, m);
    }
}
