namespace ItemReduce.Core.LinearAlgebra;

/// <summary>
/// Cholesky factorisation A = L Lᵀ of a symmetric positive-definite matrix and what follows from it:
/// the inverse, the diagonal of the inverse and the log-determinant (Cholesky's method as published by
/// Benoît, 1924, "Note sur une méthode de résolution des équations normales…", Bulletin Géodésique 2, 67–77;
/// algorithm as in Golub &amp; Van Loan, 2013, Matrix Computations, 4th ed., Alg. 4.2.1).
/// A pivot ≤ 0 (not positive definite to working precision) throws <see cref="MatrixNotPositiveDefiniteException"/>;
/// callers that must also reject numerically singular matrices pass an explicit relative pivot tolerance τ: pivot i
/// must exceed τ · A_ii (its original diagonal element).
/// </summary>
public static class CholeskyDecomposition
{
    /// <summary>Inverse of the symmetric positive-definite matrix <paramref name="matrix"/> (input unchanged).</summary>
    public static double[,] Inverse(double[,] matrix)
    {
        MatrixChecks.SymmetricFinite(matrix, nameof(matrix));
        int n = matrix.GetLength(0);
        var l = MatrixChecks.ToRowMajor(matrix);
        FactorInPlace(l, n);
        return MatrixChecks.FromRowMajor(InverseFromFactor(l, n), n);
    }

    /// <summary>ln det A of the symmetric positive-definite matrix <paramref name="matrix"/> = 2 Σ ln L_ii.</summary>
    public static double LogDeterminant(double[,] matrix)
    {
        MatrixChecks.SymmetricFinite(matrix, nameof(matrix));
        int n = matrix.GetLength(0);
        var l = MatrixChecks.ToRowMajor(matrix);
        FactorInPlace(l, n);
        double s = 0;
        for (int i = 0; i < n; i++) s += Math.Log(l[i * n + i]);
        return 2 * s;
    }

    /// <summary>True when the symmetric matrix <paramref name="matrix"/> has a Cholesky factor whose every pivot exceeds
    /// <paramref name="relativePivotTolerance"/> times its diagonal element (0 = positive definite to working precision);
    /// <paramref name="logDeterminant"/> is then ln det A, else NaN. Input not modified.</summary>
    public static bool TryLogDeterminant(double[,] matrix, double relativePivotTolerance, out double logDeterminant)
    {
        MatrixChecks.SymmetricFinite(matrix, nameof(matrix));
        int n = matrix.GetLength(0);
        var l = MatrixChecks.ToRowMajor(matrix);
        logDeterminant = double.NaN;
        try
        {
            FactorInPlace(l, n, relativePivotTolerance);
        }
        catch (MatrixNotPositiveDefiniteException)
        {
            return false;
        }
        double s = 0;
        for (int i = 0; i < n; i++) s += Math.Log(l[i * n + i]);
        logDeterminant = 2 * s;
        return true;
    }

    /// <summary>
    /// Overwrites the lower triangle of the row-major n × n matrix <paramref name="a"/> with L (row i of L
    /// in columns 0..i; the strict upper triangle is zeroed). Unchecked kernel. A pivot that is not above
    /// <paramref name="relativePivotTolerance"/> · A_ii (default 0: not positive) throws
    /// <see cref="MatrixNotPositiveDefiniteException"/>.
    /// </summary>
    internal static void FactorInPlace(double[] a, int n, double relativePivotTolerance = 0)
    {
        for (int i = 0; i < n; i++)
        {
            var li = a.AsSpan(i * n, n);
            for (int j = 0; j <= i; j++)
            {
                double s = li[j] - VectorKernels.Dot(li[..j], a.AsSpan(j * n, j));
                if (i == j)
                {
                    if (!(s > 0) || (relativePivotTolerance > 0 && !(s > relativePivotTolerance * li[i])))
                        throw new MatrixNotPositiveDefiniteException(
                            $"Matrix is not positive definite: Cholesky pivot {i + 1} of {n} is {s}.");
                    li[i] = Math.Sqrt(s);
                }
                else li[j] = s / a[j * n + j];
            }
            li[(i + 1)..].Clear();
        }
    }

    /// <summary>X = L⁻¹ (row-major, lower triangular) from the factor left by <see cref="FactorInPlace"/>.</summary>
    internal static double[] LowerInverse(double[] l, int n) => LowerInverse(l, n, new double[n * n]);

    /// <summary>As <see cref="LowerInverse(double[], int)"/>, writing into <paramref name="x"/> (n × n, overwritten).</summary>
    internal static double[] LowerInverse(double[] l, int n, double[] x)
    {
        for (int i = 0; i < n; i++)
        {
            var xi = x.AsSpan(i * n, n);
            xi.Clear();
            // L[i,i] X[i,:] = e_i − Σ_{k<i} L[i,k] X[k,:], with X[k,:] non-zero in columns 0..k.
            for (int k = 0; k < i; k++) VectorKernels.Axpy(-l[i * n + k], x.AsSpan(k * n, k + 1), xi);
            xi[i] += 1;
            double inv = 1 / l[i * n + i];
            for (int k = 0; k <= i; k++) xi[k] *= inv;
        }
        return x;
    }

    /// <summary>A⁻¹ = XᵀX with X = L⁻¹ (row-major, full symmetric).</summary>
    internal static double[] InverseFromFactor(double[] l, int n)
    {
        var x = LowerInverse(l, n);
        var inv = new double[n * n];
        for (int i = 0; i < n; i++)
        {
            var xi = x.AsSpan(i * n, i + 1);
            for (int j = 0; j <= i; j++) VectorKernels.Axpy(xi[j], xi, inv.AsSpan(j * n, i + 1));
        }
        // The loop filled inv[j, k] for k ≤ i over all i ≥ max(j,k): that is the full row; symmetric already.
        return inv;
    }

    /// <summary>Diagonal of A⁻¹ (Σ_i X[i,j]² with X = L⁻¹) from the factor.</summary>
    internal static double[] InverseDiagonalFromFactor(double[] l, int n) => InverseDiagonalFromFactor(l, n, new double[n * n], new double[n]);

    /// <summary>As above with caller-provided scratch <paramref name="x"/> (n × n) and output <paramref name="diag"/> (n).</summary>
    internal static double[] InverseDiagonalFromFactor(double[] l, int n, double[] x, double[] diag)
    {
        LowerInverse(l, n, x);
        Array.Clear(diag, 0, n);
        for (int i = 0; i < n; i++)
        {
            var xi = x.AsSpan(i * n, i + 1);
            for (int j = 0; j < xi.Length; j++) diag[j] += xi[j] * xi[j];
        }
        return diag;
    }
}
