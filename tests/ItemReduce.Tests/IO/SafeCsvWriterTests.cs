using ItemReduce.IO;

namespace ItemReduce.Tests.IO;

public class SafeCsvWriterTests
{
    [Theory]
    // Formula-injection neutralisation: OWASP "CSV Injection" guidance (common practice, no source).
    [InlineData("=1+1", "'=1+1")]
    [InlineData("+SUM(A1)", "'+SUM(A1)")]
    [InlineData("-2+3", "'-2+3")]
    [InlineData("@cmd", "'@cmd")]
    [InlineData("\tx", "'\tx")]
    [InlineData("-1.5", "-1.5")]
    [InlineData("+3", "+3")]
    [InlineData("plain", "plain")]
    public void Neutralises_formula_like_text(string input, string expected) => Assert.Equal(expected, SafeCsvWriter.Neutralise(input));

    [Fact]
    public void Quotes_per_rfc4180()
    {
        // RFC 4180 §2.6–2.7: fields with commas, quotes or line breaks are quoted, quotes doubled.
        Assert.Equal("\"a,b\"", SafeCsvWriter.Text("a,b"));
        Assert.Equal("\"say \"\"hi\"\"\"", SafeCsvWriter.Text("say \"hi\""));
        Assert.Equal("\"two\nlines\"", SafeCsvWriter.Text("two\nlines"));
        Assert.Equal("\"'=a,b\"", SafeCsvWriter.Text("=a,b"));
    }

    [Fact]
    public void Numbers_are_invariant_and_nan_is_empty()
    {
        Assert.Equal("0.1", SafeCsvWriter.Number(0.1));
        Assert.Equal("", SafeCsvWriter.Number(double.NaN));
        Assert.Equal("1E-05", SafeCsvWriter.Number(1e-5));
    }
}
