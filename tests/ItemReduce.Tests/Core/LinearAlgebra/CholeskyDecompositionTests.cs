using ItemReduce.Core.LinearAlgebra;
using static ItemReduce.Tests.Core.Dimensions.DimensionsReferenceData;

namespace ItemReduce.Tests.Core.LinearAlgebra;

public class CholeskyDecompositionTests
{
    [Fact]
    public void Inverse_times_matrix_is_identity_and_log_determinant_matches_eigenvalues()
    {
        // Identities: A·A⁻¹ = I; ln det A = Σ ln λ_i with λ from numpy (make_eigen_fixtures.py).
        var r = Matrix("iris_correlation.csv");
        var inv = CholeskyDecomposition.Inverse(r);
        for (int i = 0; i < 4; i++)
            for (int j = 0; j < 4; j++)
            {
                double s = 0;
                for (int k = 0; k < 4; k++) s += r[i, k] * inv[k, j];
                Assert.Equal(i == j ? 1.0 : 0.0, s, 1e-12);
            }
        double expected = Vector("iris_correlation_eigenvalues.csv").Sum(Math.Log);
        Assert.Equal(expected, CholeskyDecomposition.LogDeterminant(r), 1e-12);
    }

    [Fact]
    public void Indefinite_matrix_throws_the_specific_exception()
    {
        var a = new double[,] { { 1, 0.9, 0 }, { 0.9, 1, 0.9 }, { 0, 0.9, 1 } }; // eigenvalue 1 − 0.9·√2 < 0
        Assert.Throws<MatrixNotPositiveDefiniteException>(() => CholeskyDecomposition.Inverse(a));
    }
}
