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
        Assert.Equal("\"'=a,b\"", SafeCsvWriter.Text("=a,b"));
    }

    [Theory]
    [InlineData("two\nlines", "two\\u000Alines")]
    [InlineData("nul\0id", "nul\\u0000id")]
    [InlineData("tab\tin", "tab\\u0009in")]
    [InlineData("cr\r", "cr\\u000D")]
    [InlineData("\u0085next", "\\u0085next")]
    public void Control_characters_from_user_text_never_reach_a_csv_raw(string input, string expected)
    {
        // Our rule (documented in the README's Outputs): a control character in text is written as \uXXXX, so every
        // output row is one physical line without NUL or other control bytes.
        string cell = SafeCsvWriter.Text(input);
        Assert.Equal(expected, cell);
        Assert.DoesNotContain(cell, char.IsControl);
    }

    [Theory]
    [InlineData("=SUM(A1)")]
    [InlineData("+x")]
    [InlineData("-x")]
    [InlineData("@cmd")]
    [InlineData("plain")]
    [InlineData("-5")]
    public void Neutralised_text_reads_back_as_written(string name) =>
        Assert.Equal(name, SafeCsvWriter.Unneutralise(SafeCsvWriter.Neutralise(name)));

    [Fact]
    public void Numbers_are_invariant_and_nan_is_empty()
    {
        Assert.Equal("0.1", SafeCsvWriter.Number(0.1));
        Assert.Equal("", SafeCsvWriter.Number(double.NaN));
        Assert.Equal("1E-05", SafeCsvWriter.Number(1e-5));
    }
}
