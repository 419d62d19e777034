using ItemReduce.Core;
using ItemReduce.Core.Dimensions;
using ItemReduce.Core.LinearAlgebra;
using ItemReduce.Core.Randomness;
using MathNet.Numerics.Distributions;

namespace ItemReduce.Tests.Core.Dimensions;

public class BartlettWishartSamplerTests
{
    [Fact]
    public void Wishart_draws_have_mean_m_times_identity_and_the_known_variances()
    {
        // For W ~ W_p(I, m): E W_ii = m, Var W_ii = 2m, E W_ij = 0, Var W_ij = m (i ≠ j)
        // (Anderson 2003, An Introduction to Multivariate Statistical Analysis, Section 7.2/Theorem 3.4.4).
        int p = 4, m = 9, reps = 20_000;
        double s00 = 0, s00sq = 0, s13 = 0, s13sq = 0, s33 = 0;
        for (int r = 0; r < reps; r++)
        {
            var w = BartlettWishartSampler.SampleWishart(p, m, RandomStream.ForTask(3, r));
            s00 += w[0, 0]; s00sq += w[0, 0] * w[0, 0];
            s13 += w[1, 3]; s13sq += w[1, 3] * w[1, 3];
            s33 += w[3, 3];
            Assert.Equal(w[1, 3], w[3, 1]);
        }
        double mean00 = s00 / reps, var00 = s00sq / reps - mean00 * mean00;
        double mean13 = s13 / reps, var13 = s13sq / reps - mean13 * mean13;
        // Tolerances ≈ 4 Monte-Carlo standard errors.
        Assert.Equal(m, mean00, 4 * Math.Sqrt(2.0 * m / reps));
        Assert.Equal(m, s33 / reps, 4 * Math.Sqrt(2.0 * m / reps));
        Assert.Equal(0, mean13, 4 * Math.Sqrt((double)m / reps));
        Assert.Equal(2.0 * m, var00, 0.1 * 2 * m);
        Assert.Equal(m, var13, 0.1 * m);
    }

    [Theory]
    [InlineData(0.5)]
    [InlineData(2.5)]
    [InlineData(47)]
    public void Chi_square_variates_follow_the_chi_square_distribution(double df)
    {
        // Two-sided one-sample Kolmogorov–Smirnov test against MathNet's ChiSquared CDF; critical value at
        // α = 0.001 ≈ 1.95/√N (asymptotic Kolmogorov distribution, from memory of standard tables).
        int n = 20_000;
        var rng = new RandomStream(99);
        var x = new double[n];
        for (int i = 0; i < n; i++) x[i] = MarsagliaTsangGamma.ChiSquare(rng, df);
        Array.Sort(x);
        double d = 0;
        for (int i = 0; i < n; i++)
        {
            double f = ChiSquared.CDF(df, x[i]);
            d = Math.Max(d, Math.Max(f - (double)i / n, (i + 1.0) / n - f));
        }
        Assert.True(d < 1.95 / Math.Sqrt(n), $"KS distance {d}");
    }

    [Fact]
    public void Correlation_draws_are_valid_correlation_matrices()
    {
        var r = BartlettWishartSampler.SampleCorrelation(6, 10, new RandomStream(1));
        for (int i = 0; i < 6; i++)
        {
            Assert.Equal(1.0, r[i, i]);
            for (int j = 0; j < 6; j++) { Assert.Equal(r[i, j], r[j, i]); Assert.InRange(r[i, j], -1, 1); }
        }
        Assert.True(SymmetricEigensolver.Eigenvalues(r)[^1] > 0);
        Assert.Throws<DataConditionException>(() => BartlettWishartSampler.SampleCorrelation(6, 5, new RandomStream(1)));
    }

    [Theory]
    [InlineData(1, 5)]
    [InlineData(13, 40)] // not a multiple of the 4 × 4 blocks
    [InlineData(50, 200)]
    public void Blocked_products_equal_the_textbook_triple_loops(int p, int df)
    {
        // The draw's matrix products (4 × 4 register-blocked dot products) against plain triple loops in this test on the
        // same Bartlett factor L: R = scale(L Lᵀ) for the identity scale and R = scale(C L Lᵀ Cᵀ) for a general one
        // (Anderson 2003, ch. 7: C W Cᵀ ~ Wishart(Σ, m) when Σ = C Cᵀ), to rounding.
        var c = new double[p * p];
        for (int i = 0; i < p; i++)
            for (int j = 0; j <= i; j++) c[i * p + j] = i == j ? 1 : 0.3 / (1 + i - j);
        foreach (bool general in new[] { false, true })
        {
            var l = new double[p * p];
            BartlettWishartSampler.SampleFactor(p, df, new RandomStream(11), l);
            var a = general ? Multiply(c, l, p, transposeRight: false) : l;
            var expected = Multiply(a, a, p, transposeRight: true);
            var w = new double[p * p];
            if (general) BartlettWishartSampler.SampleCorrelationInto(p, df, c, new RandomStream(11), new double[p * p], new double[p * p], w);
            else BartlettWishartSampler.SampleCorrelationInto(p, df, new RandomStream(11), new double[p * p], w);
            for (int i = 0; i < p; i++)
                for (int j = 0; j < p; j++)
                {
                    double r = expected[i * p + j] / Math.Sqrt(expected[i * p + i] * expected[j * p + j]);
                    Assert.True(Math.Abs(w[i * p + j] - r) <= 1e-13, $"general {general}, p = {p}, ({i}, {j}): {w[i * p + j]:R} vs {r:R}");
                }
        }
    }

    [Theory]
    [InlineData(3, 10)]
    [InlineData(40, 60)]
    [InlineData(120, 4_999)]
    public void Smcs_from_the_bartlett_factor_equal_those_from_the_inverse_of_the_drawn_correlation_matrix(int p, int df)
    {
        // SMC_j = 1 − 1 / (R⁻¹)_jj (Guttman 1956; Dwyer 1939) computed from the drawn R by Cholesky against the shortcut
        // (R⁻¹)_jj = W_jj (W⁻¹)_jj from W's own Bartlett factor: equal to rounding.
        var l = new double[p * p];
        var r = new double[p * p];
        BartlettWishartSampler.SampleCorrelationInto(p, df, new RandomStream(5), l, r);
        var expected = SquaredMultipleCorrelation.Compute(MatrixChecks.FromRowMajor(r, p));
        var actual = ParallelAnalysis.SmcFromBartlettFactor(l, p, new double[p * p], new double[p]);
        for (int j = 0; j < p; j++) Assert.True(Math.Abs(actual[j] - expected[j]) <= 1e-12, $"p = {p}, item {j}: {actual[j]:R} vs {expected[j]:R}");
    }

    private static double[] Multiply(double[] x, double[] y, int p, bool transposeRight)
    {
        var z = new double[p * p];
        for (int i = 0; i < p; i++)
            for (int j = 0; j < p; j++)
            {
                double s = 0;
                for (int k = 0; k < p; k++) s += x[i * p + k] * (transposeRight ? y[j * p + k] : y[k * p + j]);
                z[i * p + j] = s;
            }
        return z;
    }
}
