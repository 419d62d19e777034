using ItemReduce.Core.LinearAlgebra;

namespace ItemReduce.Core.Correlation;

/// <summary>Outcome of <see cref="NearestCorrelationMatrix.Find"/>.</summary>
/// <param name="Matrix">The correlation matrix to use (p × p, symmetric, unit diagonal, smallest eigenvalue
/// ≥ the floor up to rounding). The input itself when <paramref name="Adjusted"/> is false.</param>
/// <param name="Adjusted">True when the input had an eigenvalue below the floor and was replaced.</param>
/// <param name="MinEigenvalueBefore">Smallest eigenvalue of the input.</param>
/// <param name="MinEigenvalueAfter">Smallest eigenvalue of <paramref name="Matrix"/>.</param>
/// <param name="MaxAbsoluteChange">max_ij |output − input| (0 when not adjusted).</param>
/// <param name="FrobeniusChange">‖output − input‖_F (0 when not adjusted).</param>
/// <param name="Iterations">Alternating-projection iterations used (0 when not adjusted).</param>
public sealed record NearestCorrelationResult(
    double[,] Matrix, bool Adjusted, double MinEigenvalueBefore, double MinEigenvalueAfter,
    double MaxAbsoluteChange, double FrobeniusChange, int Iterations);

/// <summary>
/// Nearest correlation matrix (in the Frobenius norm) with eigenvalues at least a floor δ, by alternating
/// projections with Dykstra's correction: Higham (2002), "Computing the nearest correlation matrix — a
/// problem from finance", IMA Journal of Numerical Analysis 22(3), 329–343, Algorithm 3.3 (with the
/// positive-semidefinite projection replaced by projection onto {X : λ_min(X) ≥ δ}, which is also convex).
/// A final clean-up step clips eigenvalues at δ and rescales to unit diagonal (X ← D^{−1/2} X D^{−1/2}),
/// which guarantees an exact unit diagonal and positive definiteness.
/// Used when pairwise-complete Pearson or polychoric matrices are not positive definite.
/// </summary>
public static class NearestCorrelationMatrix
{
    /// <summary>Default eigenvalue floor δ.</summary>
    public const double DefaultEigenvalueFloor = 1e-6;

    /// <summary>Iteration cap of the alternating projections.</summary>
    public const int MaxIterations = 2000;

    /// <summary>
    /// Returns <paramref name="correlation"/> unchanged when its smallest eigenvalue is ≥ <paramref name="eigenvalueFloor"/>,
    /// otherwise the nearest correlation matrix whose eigenvalues are ≥ the floor.
    /// </summary>
    /// <param name="correlation">Symmetric p × p matrix with unit diagonal (finite entries).</param>
    /// <param name="eigenvalueFloor">δ in (0, 0.5]; default <see cref="DefaultEigenvalueFloor"/>.</param>
    /// <param name="tolerance">Stop when ‖Y − X‖_F / ‖Y‖_F ≤ tolerance; in (0, 1e-2].</param>
    /// <exception cref="NonConvergenceException">No convergence within <see cref="MaxIterations"/>.</exception>
    public static NearestCorrelationResult Find(double[,] correlation, double eigenvalueFloor = DefaultEigenvalueFloor, double tolerance = 1e-9)
    {
        MatrixChecks.SymmetricFinite(correlation, nameof(correlation));
        if (!(eigenvalueFloor > 0 && eigenvalueFloor <= 0.5))
            throw new ArgumentException($"eigenvalueFloor must lie in (0, 0.5], got {eigenvalueFloor}.", nameof(eigenvalueFloor));
        if (!(tolerance > 0 && tolerance <= 1e-2))
            throw new ArgumentException($"tolerance must lie in (0, 0.01], got {tolerance}.", nameof(tolerance));
        int p = correlation.GetLength(0);
        for (int j = 0; j < p; j++)
            if (Math.Abs(correlation[j, j] - 1) > 1e-10)
                throw new ArgumentException($"Diagonal element {j + 1} is {correlation[j, j]}, expected 1.", nameof(correlation));

        double minBefore = SymmetricEigensolver.Eigenvalues(correlation)[^1];
        if (minBefore >= eigenvalueFloor)
            return new NearestCorrelationResult(correlation, false, minBefore, minBefore, 0, 0, 0);

        var (y, iterations) = AlternatingProjections(correlation, eigenvalueFloor, tolerance);
        var x = CleanUp(y, eigenvalueFloor);
        double maxAbs = 0, frob = 0;
        for (int i = 0; i < p; i++)
            for (int j = 0; j < p; j++)
            {
                double d = x[i, j] - correlation[i, j];
                maxAbs = Math.Max(maxAbs, Math.Abs(d));
                frob += d * d;
            }
        double minAfter = SymmetricEigensolver.Eigenvalues(x)[^1];
        return new NearestCorrelationResult(x, true, minBefore, minAfter, maxAbs, Math.Sqrt(frob), iterations);
    }

    /// <summary>Higham's Algorithm 3.3: Y ← P_U(P_S(Y − ΔS)), ΔS ← P_S(R) − R.</summary>
    private static (double[,] Y, int Iterations) AlternatingProjections(double[,] a, double floor, double tol)
    {
        int p = a.GetLength(0);
        var y = (double[,])a.Clone();
        var ds = new double[p, p];
        for (int k = 1; k <= MaxIterations; k++)
        {
            var rk = new double[p, p];
            for (int i = 0; i < p; i++) for (int j = 0; j < p; j++) rk[i, j] = y[i, j] - ds[i, j];
            var x = ProjectOntoEigenvalueFloor(rk, floor);
            for (int i = 0; i < p; i++) for (int j = 0; j < p; j++) ds[i, j] = x[i, j] - rk[i, j];
            // P_U: unit diagonal.
            double diff = 0, norm = 0;
            for (int i = 0; i < p; i++)
                for (int j = 0; j < p; j++)
                {
                    double v = i == j ? 1 : x[i, j];
                    diff += (v - x[i, j]) * (v - x[i, j]);
                    norm += v * v;
                    y[i, j] = v;
                }
            if (Math.Sqrt(diff / norm) <= tol) return (y, k);
        }
        throw new NonConvergenceException($"Nearest correlation matrix: alternating projections did not converge within {MaxIterations} iterations.");
    }

    /// <summary>P_S: V max(Λ, δ) Vᵀ (symmetrised).</summary>
    internal static double[,] ProjectOntoEigenvalueFloor(double[,] a, double floor)
    {
        var (values, vectors) = SymmetricEigensolver.Decompose(a);
        int p = values.Length;
        var x = new double[p, p];
        for (int c = 0; c < p; c++)
        {
            double l = Math.Max(values[c], floor);
            for (int i = 0; i < p; i++)
            {
                double vi = vectors[i, c] * l;
                for (int j = 0; j <= i; j++) x[i, j] += vi * vectors[j, c];
            }
        }
        for (int i = 0; i < p; i++) for (int j = 0; j < i; j++) x[j, i] = x[i, j];
        return x;
    }

    /// <summary>Clip eigenvalues at δ, then rescale to unit diagonal.</summary>
    private static double[,] CleanUp(double[,] y, double floor)
    {
        var x = ProjectOntoEigenvalueFloor(y, floor);
        int p = x.GetLength(0);
        var s = new double[p];
        for (int i = 0; i < p; i++) s[i] = 1 / Math.Sqrt(x[i, i]);
        for (int i = 0; i < p; i++)
            for (int j = 0; j < p; j++) x[i, j] = i == j ? 1 : x[i, j] * s[i] * s[j];
        return x;
    }
}
