using ItemReduce.Report.Export;
using ItemReduce.Report.Model;

namespace ItemReduce.Tests.Report;

public class LatexTablesWriterTests
{
    // The ten characters with special meaning in LaTeX text and their usual literal forms
    // (\& \% \$ \# \_ \{ \} \textasciitilde{} \textasciicircum{} \textbackslash{}): common practice, no source.
    [Theory]
    [InlineData("&", @"\&")]
    [InlineData("%", @"\%")]
    [InlineData("$", @"\$")]
    [InlineData("#", @"\#")]
    [InlineData("_", @"\_")]
    [InlineData("{", @"\{")]
    [InlineData("}", @"\}")]
    [InlineData("~", @"\textasciitilde{}")]
    [InlineData("^", @"\textasciicircum{}")]
    [InlineData(@"\", @"\textbackslash{}")]
    // < and > print as other glyphs in the default OT1 encoding; text commands are safe: common practice, no source.
    [InlineData("<", @"\textless{}")]
    [InlineData(">", @"\textgreater{}")]
    public void Each_special_character_is_escaped(string input, string expected)
        => Assert.Equal(expected, LatexText.Escape(input));

    [Fact]
    public void Escaping_is_done_in_one_pass_so_inserted_backslashes_and_braces_are_not_escaped_again()
    {
        Assert.Equal(@"\textbackslash{}\{x\}", LatexText.Escape(@"\{x}"));
        Assert.Equal(@"50\% of \$10 \& a\_b \#1", LatexText.Escape("50% of $10 & a_b #1"));
        Assert.Equal("plain text, digits 0.5 and ümlauts", LatexText.Escape("plain text, digits 0.5 and ümlauts"));
    }

    [Fact]
    public void Typographic_minus_becomes_a_math_minus()
        => Assert.Equal("$-$.12", LatexText.Escape("\u2212.12"));

    [Fact]
    public void Table_has_caption_label_alignment_rules_rows_and_note()
    {
        var doc = new AppendixDocument("T", "", DemoAppendix.Created, "c",
        [
            new TableBlock(4, "Loadings & 95% limits",
                [new TableColumn("Item_code"), new TableColumn("λ", ColumnAlignment.Right), new TableColumn("Flag", ColumnAlignment.Center)],
                [new TableRow(["a_1", ".71", "yes"], RowMark.Highlighted), new TableRow(["a_2", "\u2212.05", ""], RowMark.Struck)],
                "p < .001 for all."),
        ]);
        string tex = LatexTablesWriter.Write(doc);
        Assert.Contains(@"\caption{Loadings \& 95\% limits}", tex);
        Assert.Contains(@"\label{tab:4}", tex);
        Assert.Contains(@"\begin{tabular}{lrc}", tex);
        Assert.Contains(@"Item\_code & λ & Flag \\", tex);
        Assert.Contains(@"\textbf{a\_1} & \textbf{.71} & \textbf{yes} \\", tex);
        Assert.Contains(@"\sout{a\_2} & \sout{$-$.05} &  \\", tex);
        Assert.Contains(@"\textit{Note.} p \textless{} .001 for all.", tex);
        // Balanced environments.
        Assert.Equal(CountOf(tex, @"\begin{table}"), CountOf(tex, @"\end{table}"));
        Assert.Equal(CountOf(tex, @"\begin{tabular}"), CountOf(tex, @"\end{tabular}"));
    }

    [Fact]
    public void Every_table_of_the_demo_document_is_written_once_and_nothing_else()
    {
        string tex = LatexTablesWriter.Write(DemoAppendix.Build());
        Assert.Equal(2, CountOf(tex, @"\begin{table}"));
        Assert.Contains(@"\label{tab:1}", tex);
        Assert.Contains(@"\label{tab:2}", tex);
        Assert.Equal(DemoAppendix.LongTableRows + 2 + 2, CountOf(tex, @" \\" + "\n")); // rows + 2 headers + short table rows
    }

    internal static int CountOf(string text, string part)
    {
        int count = 0;
        for (int i = text.IndexOf(part, StringComparison.Ordinal); i >= 0; i = text.IndexOf(part, i + part.Length, StringComparison.Ordinal)) count++;
        return count;
    }
}
