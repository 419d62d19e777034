using ItemReduce.Report.Formatting;

namespace ItemReduce.Tests.Report;

// Expected strings follow the usual reporting conventions of psychology journals (APA-style numbers:
// no leading zero for values that cannot exceed 1, "p < .001" below .001, exact p to three decimals).
// Common practice, no source.
public class NumberFormatTests
{
    private const string M = "\u2212"; // typographic minus

    [Theory]
    [InlineData(0.85, 2, ".85")]
    [InlineData(-0.12, 2, M + ".12")]
    [InlineData(0.849, 2, ".85")]
    [InlineData(0.845, 2, ".85")]     // midpoint rounds away from zero
    [InlineData(0.7071, 3, ".707")]
    [InlineData(1.0, 2, "1.00")]
    [InlineData(-1.0, 2, M + "1.00")]
    [InlineData(0.999, 2, "1.00")]
    [InlineData(-0.004, 2, ".00")]    // rounds to zero: no sign
    [InlineData(0.0, 3, ".000")]
    public void Bounded_values_drop_the_leading_zero(double value, int decimals, string expected)
        => Assert.Equal(expected, NumberFormat.Bounded(value, decimals));

    [Theory]
    [InlineData(1.2)]
    [InlineData(-1.0001)]
    [InlineData(double.PositiveInfinity)]
    public void Bounded_rejects_values_beyond_one(double value)
    {
        var ex = Assert.Throws<ArgumentOutOfRangeException>(() => NumberFormat.Bounded(value));
        Assert.Contains("[-1, 1]", ex.Message);
    }

    [Theory]
    [InlineData(0.0004, "< .001")]
    [InlineData(0.0, "< .001")]
    [InlineData(0.001, ".001")]
    [InlineData(0.034, ".034")]
    [InlineData(0.0345, ".035")]
    [InlineData(0.5, ".500")]
    [InlineData(0.9996, "> .999")]
    [InlineData(1.0, "> .999")]
    public void P_values_use_three_decimals_and_a_floor_of_point_001(double p, string expected)
        => Assert.Equal(expected, NumberFormat.PValue(p));

    [Fact]
    public void P_statements_for_running_text()
    {
        Assert.Equal("p < .001", NumberFormat.PStatement(1e-12));
        Assert.Equal("p = .034", NumberFormat.PStatement(0.034));
    }

    [Theory]
    [InlineData(-0.1)]
    [InlineData(1.5)]
    public void P_values_outside_unit_interval_are_rejected(double p)
        => Assert.Throws<ArgumentOutOfRangeException>(() => NumberFormat.PValue(p));

    [Theory]
    [InlineData(12.345, 2, "12.35")]
    [InlineData(-3.14159, 3, M + "3.142")]
    [InlineData(0.5, 0, "1")]
    [InlineData(-0.001, 2, "0.00")]
    [InlineData(1234567.0, 1, "1234567.0")]
    public void Fixed_keeps_the_leading_zero_and_uses_invariant_digits(double value, int decimals, string expected)
        => Assert.Equal(expected, NumberFormat.Fixed(value, decimals));

    [Fact]
    public void Missing_and_special_values()
    {
        Assert.Equal(NumberFormat.Missing, NumberFormat.Fixed(double.NaN));
        Assert.Equal(NumberFormat.Missing, NumberFormat.Bounded(double.NaN));
        Assert.Equal(NumberFormat.Missing, NumberFormat.PValue(double.NaN));
        Assert.Equal("12.5%", NumberFormat.Percent(0.125));
        Assert.Equal(M + "42", NumberFormat.Integer(-42));
        Assert.Equal(M + "9223372036854775808", NumberFormat.Integer(long.MinValue));
    }

    [Fact]
    public void Formatting_ignores_the_current_culture()
    {
        var saved = System.Globalization.CultureInfo.CurrentCulture;
        try
        {
            // The build uses invariant globalization, so a comma-decimal culture is made by hand.
            var comma = (System.Globalization.CultureInfo)System.Globalization.CultureInfo.InvariantCulture.Clone();
            comma.NumberFormat.NumberDecimalSeparator = ",";
            comma.NumberFormat.NegativeSign = "~";
            System.Globalization.CultureInfo.CurrentCulture = comma;
            Assert.Equal(M + "1.25", NumberFormat.Fixed(-1.25));
            Assert.Equal("3.50", NumberFormat.Fixed(3.5));
            Assert.Equal(".35", NumberFormat.Bounded(0.35));
        }
        finally
        {
            System.Globalization.CultureInfo.CurrentCulture = saved;
        }
    }

    [Fact]
    public void Decimals_outside_zero_to_six_are_rejected()
    {
        Assert.Throws<ArgumentOutOfRangeException>(() => NumberFormat.Fixed(1, 7));
        Assert.Throws<ArgumentOutOfRangeException>(() => NumberFormat.Bounded(0.1, -1));
    }
}
