using ItemReduce.Core.LinearAlgebra;
using static ItemReduce.Tests.Core.Dimensions.DimensionsReferenceData;

namespace ItemReduce.Tests.Core.LinearAlgebra;

public class SymmetricEigensolverTests
{
    [Fact]
    public void Iris_correlation_eigenvalues_match_numpy()
    {
        // Expected: np.linalg.eigvalsh(np.corrcoef(iris)) — ReferenceData/Dimensions/make_eigen_fixtures.py
        // (Fisher's 1936 iris data, public domain, from sklearn.datasets.load_iris).
        var r = Matrix("iris_correlation.csv");
        AssertClose(Vector("iris_correlation_eigenvalues.csv"), SymmetricEigensolver.Eigenvalues(r), 1e-13);
    }

    [Theory]
    [InlineData("gaussian1")]
    [InlineData("gaussian2")]
    [InlineData("gaussian5")]
    [InlineData("gaussian17")]
    [InlineData("gaussian60")]
    [InlineData("repeated7")]
    [InlineData("tridiagonal9")]
    [InlineData("diagonal6")]
    public void Eigenvalues_of_symmetric_matrices_match_numpy(string name)
    {
        // Expected: np.linalg.eigvalsh (LAPACK) of matrices from numpy default_rng(20261202) — make_eigen_fixtures.py.
        var a = Matrix($"symmetric_{name}.csv");
        var expected = Vector($"symmetric_{name}_eigenvalues.csv");
        double scale = 1 + expected.Max(Math.Abs);
        AssertClose(expected, SymmetricEigensolver.Eigenvalues(a), 1e-12 * scale * a.GetLength(0));
        AssertClose(expected, SymmetricEigensolver.Decompose(a).Values, 1e-12 * scale * a.GetLength(0));
    }

    [Theory]
    [InlineData("gaussian17")]
    [InlineData("gaussian60")]
    [InlineData("repeated7")]
    [InlineData("diagonal6")]
    public void Decomposition_satisfies_AV_equals_V_Lambda_with_orthonormal_vectors(string name)
    {
        // Identities of the symmetric eigendecomposition (property check).
        var a = Matrix($"symmetric_{name}.csv");
        var copy = (double[,])a.Clone();
        var (values, v) = SymmetricEigensolver.Decompose(a);
        int n = values.Length;
        Assert.Equal(copy, a); // input untouched
        for (int c = 1; c < n; c++) Assert.True(values[c - 1] >= values[c]); // descending
        for (int i = 0; i < n; i++)
            for (int c = 0; c < n; c++)
            {
                double av = 0;
                for (int k = 0; k < n; k++) av += a[i, k] * v[k, c];
                Assert.True(Math.Abs(av - values[c] * v[i, c]) < 1e-11 * (1 + Math.Abs(values[0])), $"A v != λ v at ({i},{c})");
            }
        for (int c = 0; c < n; c++)
        {
            int big = 0;
            for (int k = 0; k < n; k++)
                if (Math.Abs(v[k, c]) > Math.Abs(v[big, c])) big = k;
            Assert.True(v[big, c] > 0); // sign rule
            for (int d = 0; d < n; d++)
            {
                double dot = 0;
                for (int k = 0; k < n; k++) dot += v[k, c] * v[k, d];
                Assert.Equal(c == d ? 1.0 : 0.0, dot, 1e-12);
            }
        }
    }

    [Fact]
    public void Non_symmetric_or_non_finite_input_is_rejected()
    {
        Assert.Throws<ArgumentException>(() => SymmetricEigensolver.Eigenvalues(new double[,] { { 1, 2 }, { 3, 1 } }));
        Assert.Throws<ArgumentException>(() => SymmetricEigensolver.Eigenvalues(new double[,] { { 1, double.NaN }, { double.NaN, 1 } }));
        Assert.Throws<ArgumentException>(() => SymmetricEigensolver.Eigenvalues(new double[2, 3]));
    }
}
