using ItemReduce.Core.Dimensions;
using ItemReduce.Core.LinearAlgebra;
using ItemReduce.Core.Randomness;
using ItemReduce.Tests.Support;

namespace ItemReduce.Tests.Core.LinearAlgebra;

/// <summary>The eigenvalues-only path (<see cref="BlockedHouseholderTridiagonalization"/> + <see cref="PalWalkerKahanQl"/>)
/// against scipy and against the unblocked reduction with the implicit-shift QL iteration it replaced.</summary>
public class FullSpectrumTests
{
    [Theory]
    [InlineData("survey150")]
    [InlineData("reduced150")]
    [InlineData("singular90")]
    [InlineData("graded64")]
    public void Eigenvalues_match_scipy_eigvalsh_within_1e_12_of_the_largest(string name)
    {
        // Expected: scipy.linalg.eigvalsh (LAPACK) — ReferenceData/LinearAlgebra/make_full_spectrum_fixtures.py
        // (pairwise correlations of skewed seven-point items with missing answers and careless respondents, their
        // reduced matrix, an exactly rank-deficient correlation matrix, a graded spectrum with condition number 1e12).
        // Both sides are backward stable, so they agree to a multiple of the unit roundoff times ‖A‖, not relatively
        // in the eigenvalues near zero.
        var a = ReferenceData.Matrix("LinearAlgebra", $"spectrum_{name}.csv");
        var expected = ReferenceData.Vector("LinearAlgebra", $"spectrum_{name}_values.csv");
        var actual = SymmetricEigensolver.Eigenvalues(a);
        double scale = expected.Max(Math.Abs);
        Assert.Equal(expected.Length, actual.Length);
        for (int c = 0; c < expected.Length; c++)
            Assert.True(Math.Abs(actual[c] - expected[c]) <= 1e-12 * scale, $"{name} λ{c + 1}: {actual[c]:R} vs {expected[c]:R}");
    }

    [Theory]
    [InlineData(300, 4_999)] // a parallel-analysis replicate of issue 18 (300 items, 5,000 respondents)
    [InlineData(97, 400)]    // not a multiple of the panel width or the kernel blocks
    [InlineData(49, 60)]     // one panel plus the final one
    [InlineData(5, 10)]      // smaller than one panel
    public void Eigenvalues_equal_the_unblocked_reduction_with_implicit_ql_within_1e_12(int p, int df)
    {
        // The path before this change (Martin, Reinsch & Wilkinson 1968 tred1 + Bowdler et al. 1968 tql1, tested against
        // numpy in SymmetricEigensolverTests) on Wishart correlation draws and their reduced matrices.
        for (ulong seed = 1; seed <= 3; seed++)
        {
            var r = BartlettWishartSampler.SampleCorrelation(p, df, new RandomStream(seed));
            foreach (var m in new[] { r, SquaredMultipleCorrelation.ReducedMatrix(r) })
            {
                var expected = Unblocked(m);
                var actual = SymmetricEigensolver.Eigenvalues(m);
                double scale = expected.Max(Math.Abs);
                for (int c = 0; c < p; c++)
                    Assert.True(Math.Abs(actual[c] - expected[c]) <= 1e-12 * scale,
                        $"p = {p}, seed {seed}, λ{c + 1}: {actual[c]:R} vs {expected[c]:R}");
            }
        }
    }

    [Fact]
    public void Root_free_ql_matches_closed_forms_on_tridiagonal_matrices()
    {
        // The n × n tridiagonal Toeplitz matrix with diagonal a and off-diagonal b has eigenvalues
        // a + 2b cos(kπ/(n+1)), k = 1..n (a classical result, e.g. Golub & Van Loan 2013, §4.8); a zero off-diagonal
        // splits the matrix into blocks; a 2 × 2 block [[2, 1], [1, 2]] has eigenvalues 3 and 1.
        foreach (int n in new[] { 1, 2, 3, 10, 64 })
        {
            var d = Enumerable.Repeat(2.0, n).ToArray();
            var e = Enumerable.Repeat(-1.0, n).ToArray();
            e[0] = 0;
            PalWalkerKahanQl.Eigenvalues(d, e, n);
            Array.Sort(d);
            var expected = Enumerable.Range(1, n).Select(k => 2 - 2 * Math.Cos(k * Math.PI / (n + 1))).Order().ToArray();
            for (int k = 0; k < n; k++) Assert.True(Math.Abs(d[k] - expected[k]) <= 1e-14 * 4, $"n = {n}, λ{k + 1}: {d[k]:R} vs {expected[k]:R}");
        }
        var split = new[] { 2.0, 2.0, 5.0, 7.0 };
        var sub = new[] { 0.0, 1.0, 0.0, 0.0 };
        PalWalkerKahanQl.Eigenvalues(split, sub, 4);
        Array.Sort(split);
        Assert.Equal([1.0, 3.0, 5.0, 7.0], split.Select(x => Math.Round(x, 13)).ToArray());
    }

    [Fact]
    public void Extreme_scales_are_handled_by_scaling_the_block()
    {
        // The same matrix times 1e-300 and 1e300 (near the ends of the double range): eigenvalues scale exactly in
        // exact arithmetic (property check; the reference is the unscaled computation).
        var a = ReferenceData.Matrix("LinearAlgebra", "spectrum_graded64.csv");
        int n = a.GetLength(0);
        var baseValues = SymmetricEigensolver.Eigenvalues(a);
        foreach (double f in new[] { 1e-300, 1e300 })
        {
            var b = new double[n, n];
            for (int i = 0; i < n; i++) for (int j = 0; j < n; j++) b[i, j] = a[i, j] * f;
            var v = SymmetricEigensolver.Eigenvalues(b);
            for (int c = 0; c < n; c++) Assert.True(Math.Abs(v[c] / f - baseValues[c]) <= 1e-12, $"scale {f}, λ{c + 1}");
        }
    }

    private static double[] Unblocked(double[,] m)
    {
        int n = m.GetLength(0);
        var a = new double[n * n];
        for (int i = 0; i < n; i++) for (int j = 0; j < n; j++) a[i * n + j] = m[i, j];
        var d = new double[n];
        var e = new double[n];
        SymmetricEigensolver.HouseholderTridiagonalize(a, n, d, e, null, new double[2 * n]);
        SymmetricEigensolver.ImplicitQl(d, e, null, n);
        return d.OrderDescending().ToArray();
    }
}
