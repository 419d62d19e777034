using ItemReduce.Core.Screening;
using ItemReduce.Tests.Support;

namespace ItemReduce.Tests.Core.Screening;

public class CentreShareByItemsTests
{
    [Fact]
    public void Share_inside_the_half_peak_region_collapses_with_the_number_of_items()
    {
        // Exact values (scipy.stats.chi2.cdf(2 ln 2, k), scipy 1.10.1; the full table is the fixture below): 76.1 % at
        // k = 1, 50 % at k = 2, 7.4 % at k = 5, 1.4 % at k = 7, 0.21 % at k = 9, 0.026 % at k = 11.
        var t = CentreShareByItems.Compute(20, 0.001);
        Assert.Equal(0.50, t[1].ShareInsideHalfPeak, 1e-12); // exact: F_χ²(2 ln 2; 2) = 1 − e^(−ln 2) = 1/2
        Assert.InRange(t[6].ShareInsideHalfPeak, 0.0140, 0.0141);
        Assert.InRange(t[8].ShareInsideHalfPeak, 0.00209, 0.00210);
        for (int k = 1; k < t.Count; k++) Assert.True(t[k].ShareInsideHalfPeak < t[k - 1].ShareInsideHalfPeak);
    }

    [Fact]
    public void Shares_match_scipy_and_the_share_beyond_the_cutoff_is_the_cutoff_probability()
    {
        // Expected: scipy.stats.chi2.cdf(2 ln 2, k), written by chi2_reference.py.
        var (_, rows) = ReferenceData.Table("Screening", "half_peak_region.csv");
        var t = CentreShareByItems.Compute(100, 0.001);
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
        Assert.Throws<ArgumentOutOfRangeException>(() => CentreShareByItems.Compute(0, 0.001));
        Assert.Throws<ArgumentOutOfRangeException>(() => CentreShareByItems.Compute(10, 1.5));
    }
}
