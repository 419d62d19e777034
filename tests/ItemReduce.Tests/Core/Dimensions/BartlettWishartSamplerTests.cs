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
}
