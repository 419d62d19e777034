using System.Globalization;
using ItemReduce.Core.Screening;
using ItemReduce.Tests.Support;

namespace ItemReduce.Tests.Core.Screening;

public class BetaDistanceLawTests
{
    [Fact]
    public void Quantiles_and_tails_match_scipy()
    {
        // Reference: ReferenceData/Screening/beta_distance_reference.py (scipy.stats.beta.ppf / beta.sf).
        var (_, rows) = ReferenceData.Table("Screening", "beta_distance.csv");
        foreach (var r in rows)
        {
            double q = r[0];
            int k = (int)r[1], n = (int)r[2];
            Assert.Equal(r[3], BetaDistanceLaw.UpperQuantile(q, k, n), 1e-7 * r[3]);
            Assert.Equal(r[5], BetaDistanceLaw.UpperTail(r[4], k, n), 1e-9 * Math.Max(r[5], 1e-6));
        }
    }

    [Fact]
    public void Beta_quantiles_lie_below_chi_square_and_approach_it()
    {
        // Property of the law (the Beta variable is bounded by (N − 1)² / N): in-sample cutoffs are smaller than the
        // χ² cutoff, increasingly close to it as N grows.
        double chi = ChiSquareTail.UpperQuantile(0.001, 24);
        double previous = 0;
        foreach (int n in new[] { 60, 200, 1000, 5000, 20_000 })
        {
            double b = BetaDistanceLaw.UpperQuantile(0.001, 24, n);
            Assert.True(b < chi && b > previous, string.Create(CultureInfo.InvariantCulture, $"n = {n}: {b} vs χ² {chi}"));
            previous = b;
        }
        Assert.True(chi - previous < 0.01 * chi);
    }
}
