namespace ItemReduce.Core.LinearAlgebra;

/// <summary>
/// An iterative matrix algorithm (QL iteration, alternating projections) did not reach its tolerance within
/// its iteration cap. The message names the algorithm, the cap and where it stopped.
/// </summary>
internal sealed class NonConvergenceException : Exception
{
    public NonConvergenceException(string message) : base(message) { }
}

/// <summary>A matrix that must be symmetric positive definite (Cholesky) is not.</summary>
internal sealed class MatrixNotPositiveDefiniteException : Exception
{
    public MatrixNotPositiveDefiniteException(string message) : base(message) { }
}

/// <summary>Input checks shared by the public linear-algebra entry points.</summary>
internal static class MatrixChecks
{
    /// <summary>Throws unless <paramref name="a"/> is a non-empty, finite, square, symmetric matrix
    /// (|a_ij − a_ji| ≤ 1e-10 · (1 + max |a|)).</summary>
    public static void SymmetricFinite(double[,] a, string name)
    {
        ArgumentNullException.ThrowIfNull(a, name);
        int n = a.GetLength(0);
        if (n == 0 || a.GetLength(1) != n)
            throw new ArgumentException($"Expected a non-empty square matrix, got {a.GetLength(0)}×{a.GetLength(1)}.", name);
        double max = 0;
        foreach (double x in a)
        {
            if (!double.IsFinite(x)) throw new ArgumentException($"Matrix contains a non-finite value ({x}).", name);
            max = Math.Max(max, Math.Abs(x));
        }
        double tol = 1e-10 * (1 + max);
        for (int i = 0; i < n; i++)
            for (int j = 0; j < i; j++)
                if (Math.Abs(a[i, j] - a[j, i]) > tol)
                    throw new ArgumentException($"Matrix is not symmetric: a[{i},{j}] = {a[i, j]} but a[{j},{i}] = {a[j, i]}.", name);
    }

    /// <summary>Row-major copy of a square matrix.</summary>
    public static double[] ToRowMajor(double[,] a)
    {
        int n = a.GetLength(0);
        var v = new double[n * n];
        Buffer.BlockCopy(a, 0, v, 0, n * n * sizeof(double));
        return v;
    }

    /// <summary>Square matrix from a row-major array.</summary>
    public static double[,] FromRowMajor(double[] v, int n)
    {
        var a = new double[n, n];
        Buffer.BlockCopy(v, 0, a, 0, n * n * sizeof(double));
        return a;
    }
}
