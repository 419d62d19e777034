using ItemReduce.Core.SelfCheck;

namespace ItemReduce.Tests.Core.SelfCheck;

public class WilsonScoreIntervalTests
{
    // Newcombe, R. G. (1998). Two-sided confidence intervals for the single proportion: comparison of seven methods.
    // Statistics in Medicine, 17(8), 857–872, Table II, method 3 (score interval without continuity correction), 95 %.
    // Values quoted from memory to four decimals, and confirmed to four decimals by scipy 1.10.1 (Debian python3-scipy),
    // scipy.stats.binomtest(x, n).proportion_ci(method="wilson"): ReferenceData/SelfCheck/wilson_reference.py and its
    // output wilson_reference.txt.
    [Theory]
    [InlineData(81, 263, 0.2553, 0.3662)]
    [InlineData(15, 148, 0.0624, 0.1605)]
    [InlineData(0, 20, 0.0000, 0.1611)]
    [InlineData(1, 29, 0.0061, 0.1718)]
    public void Matches_the_published_score_intervals(int x, int n, double low, double high)
    {
        var (lo, hi) = WilsonScoreInterval.Compute(x, n);
        Assert.Equal(low, lo, 0.00006);
        Assert.Equal(high, hi, 0.00006);
    }

    [Fact]
    public void Is_symmetric_under_swapping_successes_and_failures_and_rejects_bad_counts()
    {
        // Property of the score interval (common practice, no source): the interval of n − x is the mirror of that of x.
        var (lo, hi) = WilsonScoreInterval.Compute(7, 40);
        var (lo2, hi2) = WilsonScoreInterval.Compute(33, 40);
        Assert.Equal(1 - hi, lo2, 1e-12);
        Assert.Equal(1 - lo, hi2, 1e-12);
        Assert.Throws<ArgumentOutOfRangeException>(() => WilsonScoreInterval.Compute(5, 4));
        Assert.True(double.IsNaN(WilsonScoreInterval.Compute(0, 0).Low));
    }
}
