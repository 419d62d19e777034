using ItemReduce.Core.Screening;

namespace ItemReduce.Tests.Core.Screening;

public class HalfPeakRegionTests
{
    [Fact]
    public void Share_inside_the_half_peak_region_collapses_with_the_number_of_items()
    {
        // Common practice, no source: about 76 % for k = 1, 50 % for k = 2, under 30 % for k = 3,
        // under 10 % for k = 5, about 1 % by k = 9. Read as "down to 1 % or less by k = 9": the exact values
        // (scipy fixture below) are 1.4 % at k = 7 and 0.21 % at k = 9.
        var t = HalfPeakRegion.Compute(20, 0.001);
        Assert.Equal(0.76, t[0].ShareInsideHalfPeak, 0.005);
        Assert.Equal(0.50, t[1].ShareInsideHalfPeak, 1e-12); // exact: F_χ²(2 ln 2; 2) = 1 − e^(−ln 2) = 1/2
        Assert.True(t[2].ShareInsideHalfPeak < 0.30);
        Assert.True(t[4].ShareInsideHalfPeak < 0.10);
        Assert.Equal(0.01, t[6].ShareInsideHalfPeak, 0.005);
        Assert.True(t[8].ShareInsideHalfPeak < 0.01);
        for (int k = 1; k < t.Count; k++) Assert.True(t[k].ShareInsideHalfPeak < t[k - 1].ShareInsideHalfPeak);
    }

    [Fact]
    public void Shares_match_scipy_and_the_share_beyond_the_cutoff_is_the_cutoff_probability()
    {
        // Expected: scipy.stats.chi2.cdf(2 ln 2, k), written by chi2_reference.py.
        var (_, rows) = ScreeningFixtures.Read("half_peak_region.csv");
        var t = HalfPeakRegion.Compute(100, 0.001);
        Assert.Equal(100, t.Count);
        foreach (var r in rows)
        {
            var row = t[(int)r[0] - 1];
            Assert.Equal((int)r[0], row.Items);
            Assert.True(Math.Abs(row.ShareInsideHalfPeak - r[1]) <= 1e-10 * r[1] + 1e-300, $"k={r[0]}");
            Assert.Equal(0.001, row.ShareBeyondCutoff, 1e-12); // by construction of the χ²_k quantile
        }
    }

    [Fact]
    public void Out_of_range_arguments_are_rejected()
    {
        Assert.Throws<ArgumentOutOfRangeException>(() => HalfPeakRegion.Compute(0, 0.001));
        Assert.Throws<ArgumentOutOfRangeException>(() => HalfPeakRegion.Compute(10, 1.5));
    }
}
