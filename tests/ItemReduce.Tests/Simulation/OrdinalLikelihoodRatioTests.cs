using ItemReduce.Simulation;
using ItemReduce.Tests.Support;

namespace ItemReduce.Tests.Simulation;

/// <summary>The study's likelihood-ratio yardstick against answer-pattern probabilities from scipy.</summary>
public class OrdinalLikelihoodRatioTests
{
    [Fact]
    public void Statistic_matches_box_probabilities_of_the_latent_normal_from_scipy()
    {
        // Expected: T = −m log 3 − log P(pattern), P by scipy.stats.multivariate_normal.cdf and inclusion–exclusion over
        // the pattern's box (ordinal_likelihood_reference.py), for all 81 complete patterns and the 27 with item 3
        // missing. Tolerance 2e-3 on T (relative error of P): the grid integration error of the yardstick, which
        // affects the null and the alternative alike.
        var spec = new FactorModelSpec
        {
            ItemFactor = [0, 0, 1, 1],
            Loadings = [0.5, 0.8, 0.6, 0.7],
            Categories = 3,
            FactorCorrelations = new[,] { { 1.0, 0.3 }, { 0.3, 1.0 } },
            CategoryProbabilities = [1, 2, 4],
        };
        var lr = new OrdinalLikelihoodRatio(spec);
        var (_, rows) = ReferenceData.Table("Screening", "ordinal_likelihood.csv");
        Assert.Equal(81 + 27, rows.Length);
        foreach (var r in rows)
        {
            var x = r.Take(4).Select(v => v == 0 ? double.NaN : v).ToArray();
            Assert.Equal(r[4], lr.Statistic(x), 2e-3);
        }
        Assert.True(double.IsNaN(lr.Statistic([double.NaN, double.NaN, double.NaN, double.NaN])));
    }
}
