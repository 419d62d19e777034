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

    /// <summary>The leading k eigenpairs of a symmetric matrix (values descending, vectors as the columns of a p × k
    /// matrix, same sign convention), by the project's one symmetric eigensolver
    /// (<see cref="LinearAlgebra.SymmetricEigensolver.Leading"/>: Lanczos with full reorthogonalisation).</summary>
    public static (double[] Values, Matrix<double> Vectors) LeadingEigen(Matrix<double> a, int k)
    {
        int p = a.RowCount;
        var (values, rows) = LinearAlgebra.SymmetricEigensolver.Leading(a.ToRowMajorArray(), p, k);
        return (values, Matrix<double>.Build.Dense(p, k, (i, c) => rows[c * p + i]));
    }

    /// <summary>Starting communalities (<see cref="Dimensions.SquaredMultipleCorrelation.StartingCommunalities"/>).</summary>
    public static double[] SquaredMultipleCorrelations(Matrix<double> r) => Dimensions.SquaredMultipleCorrelation.StartingCommunalities(r.ToArray());

    /// <summary>True when R is positive definite with every Cholesky factor diagonal element above 1e-12 (unit diagonal).</summary>
    public static bool IsPositiveDefinite(Matrix<double> r, out double logDeterminant) =>
        LinearAlgebra.CholeskyDecomposition.TryLogDeterminant(
            r.ToArray(), Dimensions.SquaredMultipleCorrelation.SingularPivotTolerance, out logDeterminant);

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
