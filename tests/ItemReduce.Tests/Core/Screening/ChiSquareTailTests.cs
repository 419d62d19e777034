using ItemReduce.Core.Screening;

namespace ItemReduce.Tests.Core.Screening;

public class ChiSquareTailTests
{
    [Theory]
    // Upper-tail critical values of the chi-square distribution as printed (3 decimals) in the NIST/SEMATECH
    // e-Handbook of Statistical Methods, section 1.3.6.7.4 "Critical values of the chi-square distribution" —
    // values from memory of that table; each one also agrees with scipy.stats.chi2.isf in chi2_upper_quantiles.csv.
    [InlineData(10, 0.001, 29.588)]
    [InlineData(1, 0.05, 3.841)]
    [InlineData(1, 0.001, 10.828)]
    [InlineData(2, 0.05, 5.991)]
    [InlineData(5, 0.01, 15.086)]
    [InlineData(20, 0.001, 45.315)]
    [InlineData(30, 0.05, 43.773)]
    [InlineData(100, 0.001, 149.449)]
    public void Upper_quantile_matches_the_printed_critical_value_table(int df, double q, double expected)
    {
        Assert.Equal(expected, ChiSquareTail.UpperQuantile(q, df), 0.0006);
    }

    [Fact]
    public void Upper_quantile_matches_scipy_isf_for_df_1_to_300_and_tails_down_to_1e_minus_10()
    {
        // Expected: scipy.stats.chi2.isf(q, df), written by chi2_reference.py.
        var (_, rows) = ScreeningFixtures.Read("chi2_upper_quantiles.csv");
        Assert.True(rows.Length > 2700);
        double worst = 0;
        foreach (var r in rows)
        {
            double x = ChiSquareTail.UpperQuantile(r[1], r[0]);
            worst = Math.Max(worst, Math.Abs(x - r[2]) / r[2]);
        }
        Assert.True(worst < 1e-9, $"largest relative error {worst}");
    }

    [Fact]
    public void Upper_tail_matches_scipy_sf_including_the_far_tail()
    {
        // Expected: scipy.stats.chi2.sf(x, df), written by chi2_reference.py; values reach 1e-46, where 1 − CDF gives 0.
        var (_, rows) = ScreeningFixtures.Read("chi2_upper_tail.csv");
        foreach (var r in rows)
        {
            double q = ChiSquareTail.UpperTail(r[1], r[0]);
            Assert.True(Math.Abs(q - r[2]) <= 1e-9 * r[2], $"df={r[0]} x={r[1]}: {q} vs {r[2]}");
        }
    }

    [Theory]
    [InlineData(1, 1e-12)]
    [InlineData(7, 0.3)]
    [InlineData(50, 1e-8)]
    [InlineData(1000, 0.001)]
    public void Quantile_and_tail_are_inverse(int df, double q)
    {
        // Identity: Q(Q⁻¹(q)) = q.
        double x = ChiSquareTail.UpperQuantile(q, df);
        Assert.Equal(1.0, ChiSquareTail.UpperTail(x, df) / q, 1e-10);
    }

    [Fact]
    public void Invalid_arguments_are_rejected()
    {
        Assert.Throws<ArgumentOutOfRangeException>(() => ChiSquareTail.UpperQuantile(0, 3));
        Assert.Throws<ArgumentOutOfRangeException>(() => ChiSquareTail.UpperQuantile(1, 3));
        Assert.Throws<ArgumentOutOfRangeException>(() => ChiSquareTail.UpperQuantile(0.01, 0));
        Assert.True(double.IsNaN(ChiSquareTail.UpperTail(double.NaN, 3)));
    }
}
