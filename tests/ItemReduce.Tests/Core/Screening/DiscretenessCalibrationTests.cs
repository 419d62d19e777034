using ItemReduce.Core.Screening;
using ItemReduce.Tests.Support;

namespace ItemReduce.Tests.Core.Screening;

public class DiscretenessCalibrationTests
{
    [Fact]
    public void Factor_matches_a_large_numpy_simulation()
    {
        // Reference: ReferenceData/Screening/ordinal_calibration_reference.py (numpy, 4 × 10⁶ draws): six skewed
        // five-point items from two correlated factors give factor 0.9547 (batch sd 0.0027). Our factor uses 100,000
        // draws (about 100 beyond the 0.999 quantile), whose own Monte Carlo sd is about 0.02; tolerance 0.05.
        var (_, rows) = ReferenceData.Table("Screening", "ordinal_calibration.csv");
        double expected = rows[0][0];
        double[] lam = [.8, .7, .6, .8, .7, .6];
        int[] f = [0, 0, 0, 1, 1, 1];
        var r = new double[36];
        for (int j = 0; j < 6; j++)
            for (int k = 0; k < 6; k++) r[j * 6 + k] = j == k ? 1 : lam[j] * lam[k] * (f[j] == f[k] ? 1 : 0.3);
        var counts = Enumerable.Range(0, 6).Select(_ => new Dictionary<double, long> { [1] = 1000, [2] = 2000, [3] = 4000, [4] = 8000, [5] = 16000 }).ToList();
        var scores = NormalScores.FromCounts(counts);
        Assert.True(DiscretenessCalibration.Applies(scores));
        double factor = DiscretenessCalibration.Factor(r, scores, 0.001);
        Assert.Equal(expected, factor, 0.05);
        Assert.Equal(factor, DiscretenessCalibration.Factor(r, scores, 0.001));   // fixed internal seed: repeatable
    }

    [Fact]
    public void Many_categories_or_one_category_switch_the_calibration_off()
    {
        var wide = new Dictionary<double, long>();
        for (int v = 1; v <= 12; v++) wide[v] = 10;
        Assert.False(DiscretenessCalibration.Applies(NormalScores.FromCounts([wide])));
        Assert.False(DiscretenessCalibration.Applies(NormalScores.FromCounts([new Dictionary<double, long> { [3] = 10 }])));
    }
}
