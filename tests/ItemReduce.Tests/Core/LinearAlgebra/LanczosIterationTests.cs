using ItemReduce.Core.LinearAlgebra;
using ItemReduce.Tests.Support;

namespace ItemReduce.Tests.Core.LinearAlgebra;

public class LanczosIterationTests
{
    private static double[,] Fixture(string file) => ReferenceData.Matrix("LinearAlgebra", file);

    [Theory]
    [InlineData("factor120", 1)]
    [InlineData("factor120", 6)]
    [InlineData("factor120", 8)]
    [InlineData("random80", 1)]
    [InlineData("random80", 8)]
    [InlineData("close30", 3)]
    [InlineData("close30", 8)]
    public void Leading_eigenvalues_match_numpy_eigh(string name, int k)
    {
        // Expected: np.linalg.eigh (LAPACK) — ReferenceData/LinearAlgebra/make_leading_eigen_fixtures.py.
        var a = Fixture($"leading_{name}.csv");
        var expected = ReferenceData.Vector("LinearAlgebra", $"leading_{name}_values.csv");
        var (values, _) = SymmetricEigensolver.LeadingDecompose(a, k);
        Assert.Equal(k, values.Length);
        double scale = Math.Abs(expected[0]);
        for (int c = 0; c < k; c++) Assert.True(Math.Abs(values[c] - expected[c]) <= 1e-11 * scale, $"{name} λ{c + 1}: {values[c]} vs {expected[c]}");
    }

    [Theory]
    [InlineData("factor120", 6)] // the six factor eigenvalues stand well apart
    [InlineData("close30", 8)]   // 10, 9.999, 9.99: gaps of 1e-3 and 9e-3
    public void Leading_eigenvectors_match_numpy_eigh(string name, int k)
    {
        // Expected: np.linalg.eigh eigenvectors with the same sign rule — make_leading_eigen_fixtures.py. The vector
        // error of a Ritz pair is about residual / gap (Golub & Van Loan 2013, §8.1), so the bound widens with 1/gap.
        var a = Fixture($"leading_{name}.csv");
        var expected = Fixture($"leading_{name}_vectors.csv");
        var values = ReferenceData.Vector("LinearAlgebra", $"leading_{name}_values.csv");
        var (_, v) = SymmetricEigensolver.LeadingDecompose(a, k);
        int n = a.GetLength(0);
        for (int c = 0; c < k; c++)
        {
            double gap = Math.Min(c > 0 ? values[c - 1] - values[c] : double.PositiveInfinity, values[c] - values[c + 1]);
            double bound = 1e-10 * Math.Abs(values[0]) / gap;
            for (int i = 0; i < n; i++) Assert.True(Math.Abs(v[i, c] - expected[c, i]) <= bound, $"{name} v{c + 1}[{i}]");
        }
    }

    [Theory]
    [InlineData("factor120", 12)]
    [InlineData("random80", 10)]
    [InlineData("close30", 30)]
    public void Leading_pairs_satisfy_AV_equals_V_Lambda_with_orthonormal_vectors(string name, int k)
    {
        // Identities of a symmetric eigendecomposition (property check): ‖A v − λ v‖ within the stated residual
        // tolerance 1e-12 ‖A‖_F (a little slack for the rounding of this check), VᵀV = I, descending values,
        // the sign rule, input unchanged.
        var a = Fixture($"leading_{name}.csv");
        var copy = (double[,])a.Clone();
        var (values, v) = SymmetricEigensolver.LeadingDecompose(a, k);
        Assert.Equal(copy, a);
        int n = a.GetLength(0);
        double frobenius = 0;
        foreach (double x in a) frobenius += x * x;
        frobenius = Math.Sqrt(frobenius);
        for (int c = 1; c < k; c++) Assert.True(values[c - 1] >= values[c]);
        for (int c = 0; c < k; c++)
        {
            double residual = 0;
            for (int i = 0; i < n; i++)
            {
                double av = 0;
                for (int j = 0; j < n; j++) av += a[i, j] * v[j, c];
                residual += (av - values[c] * v[i, c]) * (av - values[c] * v[i, c]);
            }
            Assert.True(Math.Sqrt(residual) <= 2e-12 * frobenius, $"{name}: residual of pair {c + 1} is {Math.Sqrt(residual)}");
            int big = 0;
            for (int i = 1; i < n; i++) if (Math.Abs(v[i, c]) > Math.Abs(v[big, c])) big = i;
            Assert.True(v[big, c] > 0);
            for (int d = 0; d < k; d++)
            {
                double dot = 0;
                for (int i = 0; i < n; i++) dot += v[i, c] * v[i, d];
                Assert.Equal(c == d ? 1.0 : 0.0, dot, 1e-12);
            }
        }
    }

    [Fact]
    public void All_pairs_of_a_small_matrix_equal_the_full_decomposition()
    {
        // k = n: the Krylov basis spans the whole space; compare with the project's full solver and with numpy.
        var a = Fixture("leading_close30.csv");
        var expected = ReferenceData.Vector("LinearAlgebra", "leading_close30_values.csv");
        var (values, _) = SymmetricEigensolver.LeadingDecompose(a, 30);
        var full = SymmetricEigensolver.Eigenvalues(a);
        for (int c = 0; c < 30; c++)
        {
            Assert.Equal(expected[c], values[c], 1e-11);
            Assert.Equal(full[c], values[c], 1e-11);
        }
    }

    [Fact]
    public void Results_are_deterministic_and_invalid_k_is_rejected()
    {
        var a = Fixture("leading_random80.csv");
        var one = SymmetricEigensolver.LeadingDecompose(a, 5);
        var two = SymmetricEigensolver.LeadingDecompose(a, 5);
        Assert.Equal(one.Values, two.Values);
        Assert.Equal(one.Vectors, two.Vectors);
        Assert.Throws<ArgumentException>(() => SymmetricEigensolver.LeadingDecompose(a, 0));
        Assert.Throws<ArgumentException>(() => SymmetricEigensolver.LeadingDecompose(a, 81));
    }

    [Fact]
    public void A_diagonal_matrix_with_an_invariant_start_subspace_is_handled()
    {
        // Breakdown path: for a diagonal matrix the Krylov space is invariant once it holds the components of the
        // start vector; eigenvalues are the diagonal (exact; common practice, no source).
        var a = new double[12, 12];
        for (int i = 0; i < 12; i++) a[i, i] = i % 4 == 0 ? 0 : 12 - i;
        var (values, _) = SymmetricEigensolver.LeadingDecompose(a, 4);
        Assert.Equal(new double[] { 11, 10, 9, 7 }, values.Select(x => Math.Round(x, 10)).ToArray());
    }
}
