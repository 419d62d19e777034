using ItemReduce.Core.Correlation;
using static ItemReduce.Tests.Core.Dimensions.DimensionsReferenceData;

namespace ItemReduce.Tests.Core.Correlation;

public class BivariateNormalDistributionTests
{
    [Fact]
    public void Cdf_matches_scipy_on_a_grid_including_correlations_near_plus_and_minus_one()
    {
        // Expected: scipy.stats.multivariate_normal.cdf (abseps = releps = 1e-12), each value cross-checked in
        // the script against Owen's (1956) T-function formula — make_polychoric_fixtures.py.
        foreach (var line in Lines("bivariate_normal_cdf.csv").Skip(1))
        {
            var f = line.Split(',').Select(Parse).ToArray();
            double got = BivariateNormalDistribution.Cdf(f[0], f[1], f[2]);
            Assert.True(Math.Abs(got - f[3]) < 1e-13, $"Φ₂({f[0]}, {f[1]}; {f[2]}) = {got:R}, scipy {f[3]:R}");
        }
    }

    [Theory]
    [InlineData(0.3, -0.7, 0.5)]
    [InlineData(-1.2, 0.4, -0.95)]
    public void Infinite_limits_reduce_to_the_univariate_cdf(double h, double k, double rho)
    {
        // Φ₂(h, ∞) = Φ(h), Φ₂(−∞, k) = 0 (definition). Φ(0.3) = 0.6179114221889527, Φ(0.4) = 0.6554217416103242
        // (scipy.stats.norm.cdf).
        Assert.Equal(0, BivariateNormalDistribution.Cdf(double.NegativeInfinity, k, rho));
        Assert.Equal(BivariateNormalDistribution.Cdf(h, 40, rho), BivariateNormalDistribution.Cdf(h, double.PositiveInfinity, rho), 1e-15);
        if (h == 0.3) Assert.Equal(0.6179114221889527, BivariateNormalDistribution.Cdf(h, double.PositiveInfinity, rho), 1e-15);
        if (k == 0.4) Assert.Equal(0.6554217416103242, BivariateNormalDistribution.Cdf(double.PositiveInfinity, k, rho), 1e-15);
    }

    [Fact]
    public void Density_is_the_derivative_of_the_cdf_in_rho()
    {
        // Plackett (1954): ∂Φ₂/∂ρ = φ₂; central difference check.
        double h = 0.4, k = -0.9, rho = 0.35, e = 1e-5;
        double numeric = (BivariateNormalDistribution.Cdf(h, k, rho + e) - BivariateNormalDistribution.Cdf(h, k, rho - e)) / (2 * e);
        Assert.Equal(numeric, BivariateNormalDistribution.Density(h, k, rho), 1e-9);
    }
}
