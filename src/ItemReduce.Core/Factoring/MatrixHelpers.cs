using MathNet.Numerics.LinearAlgebra;

namespace ItemReduce.Core.Factoring;

/// <summary>Small dense helpers shared by the factoring steps (MathNet.Numerics underneath).</summary>
internal static class MatrixHelpers
{
    public static Matrix<double> ToMatrix(double[,] a) => Matrix<double>.Build.DenseOfArray(a);

    public static double[,] ToArray(Matrix<double> m) => m.ToArray();

    /// <summary>Eigen-decomposition of a symmetric matrix with eigenvalues in descending order, by the project's one
    /// symmetric eigensolver (<see cref="LinearAlgebra.SymmetricEigensolver"/>: vectors of unit length, each signed so
    /// that its largest-magnitude element is positive).</summary>
    public static (double[] Values, Matrix<double> Vectors) SymmetricEigenDescending(Matrix<double> a)
    {
        var (values, vectors) = LinearAlgebra.SymmetricEigensolver.Decompose(a.ToArray());
        return (values, Matrix<double>.Build.DenseOfArray(vectors));
    }

    /// <summary>Eigenvalues only of a symmetric matrix, descending (no eigenvectors: about a seventh of the work of
    /// <see cref="SymmetricEigenDescending"/>).</summary>
    public static double[] SymmetricEigenvaluesDescending(Matrix<double> a) => LinearAlgebra.SymmetricEigensolver.Eigenvalues(a.ToArray());

    /// <summary>Squared multiple correlations 1 − 1/(R⁻¹)ⱼⱼ, the classic starting communalities
    /// (common practice, no source). Falls back to the largest absolute off-diagonal correlation of each row
    /// when R is singular.</summary>
    public static double[] SquaredMultipleCorrelations(Matrix<double> r)
    {
        int p = r.RowCount;
        var smc = new double[p];
        var chol = TryCholesky(r);
        if (chol is not null)
        {
            var inv = chol.Solve(Matrix<double>.Build.DenseIdentity(p));
            for (int j = 0; j < p; j++) smc[j] = Math.Clamp(1.0 - 1.0 / inv[j, j], 0.0, 1.0);
            return smc;
        }
        for (int j = 0; j < p; j++)
        {
            double m = 0;
            for (int l = 0; l < p; l++) if (l != j) m = Math.Max(m, Math.Abs(r[j, l]));
            smc[j] = m;
        }
        return smc;
    }

    public static MathNet.Numerics.LinearAlgebra.Factorization.Cholesky<double>? TryCholesky(Matrix<double> a)
    {
        try
        {
            var c = a.Cholesky();
            for (int i = 0; i < a.RowCount; i++) if (!(c.Factor[i, i] > 1e-12)) return null;
            return c;
        }
        catch (ArgumentException)
        {
            return null;
        }
    }

    /// <summary>Row sums of squares (communalities of orthogonal loadings).</summary>
    public static double[] RowSumSquares(Matrix<double> l)
    {
        var h = new double[l.RowCount];
        for (int j = 0; j < l.RowCount; j++)
            for (int f = 0; f < l.ColumnCount; f++) h[j] += l[j, f] * l[j, f];
        return h;
    }

    /// <summary>Loadings Vₖ · diag(sqrt(max(eₖ, 0))) from the first k eigenpairs.</summary>
    public static Matrix<double> PrincipalLoadings(double[] values, Matrix<double> vectors, int k)
    {
        int p = vectors.RowCount;
        var l = Matrix<double>.Build.Dense(p, k);
        for (int f = 0; f < k; f++)
        {
            double s = Math.Sqrt(Math.Max(values[f], 0.0));
            for (int j = 0; j < p; j++) l[j, f] = vectors[j, f] * s;
        }
        return l;
    }
}
