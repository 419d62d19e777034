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
        Assert.Contains(@"\caption{Loadings \& 95\% limits}\label{tab:4}\\", tex);
        Assert.Contains(@"\begin{longtable}{@{}lrc@{}}", tex);
        Assert.Contains(@"Item\_code & $\lambda$ & Flag \\", tex);
        Assert.Contains(@"\textbf{a\_1} & \textbf{.71} & \textbf{yes} \\", tex);
        Assert.Contains(@"\textit{a\_2} & \textit{$-$.05} &  \\", tex);
        Assert.Contains(@"\textit{Note.} p \textless{} .001 for all.", tex);
        // The header is repeated on continuation pages (once for the first page, once for the others).
        Assert.Equal(2, CountOf(tex, @"Item\_code & $\lambda$ & Flag \\"));
        Assert.Equal(CountOf(tex, @"\begin{longtable}"), CountOf(tex, @"\end{longtable}"));
        Assert.Equal(CountOf(tex, @"\begingroup"), CountOf(tex, @"\endgroup"));
    }

    // Greek letters and signs have no glyph in the default text fonts of pdflatex; math mode has them: common practice, no source.
    [Theory]
    [InlineData("α", @"$\alpha$")]
    [InlineData("ω", @"$\omega$")]
    [InlineData("χ²", @"$\chi$$^{2}$")]
    [InlineData("≥ .30", @"$\geq$ .30")]
    [InlineData("h²", @"h$^{2}$")]
    [InlineData("Σ", @"$\Sigma$")]
    public void Greek_letters_and_signs_are_set_in_math_mode(string input, string expected)
        => Assert.Equal(expected, LatexText.Escape(input));

    [Fact]
    public void Double_hyphens_of_option_names_stay_two_hyphens()
        => Assert.Equal("-{}-cutoff-p", LatexText.Escape("--cutoff-p"));

    [Fact]
    public void Wide_tables_get_wrapping_columns_whose_shares_fill_the_line()
    {
        string wording = string.Join(" ", Enumerable.Repeat("a rather long questionnaire wording", 4));
        var t = new TableBlock(1, "Items", [new TableColumn("Item"), new TableColumn("Wording"), new TableColumn("Loading", ColumnAlignment.Right)],
            [new TableRow(["q1", wording, ".71"]), new TableRow(["q2", "short", ".40"])], "");
        var specs = LatexTablesWriter.ColumnSpecs(t);
        Assert.All(specs, s => Assert.Contains(@"p{\dimexpr(\linewidth-4\tabcolsep)*", s));
        int total = specs.Sum(s => int.Parse(s.Split(")*")[1].Split('/')[0], System.Globalization.CultureInfo.InvariantCulture));
        Assert.InRange(total, 990, 1000);
        Assert.Contains(@"\raggedright", specs[1]);
        Assert.Contains(@"\raggedleft", specs[2]);
    }

    [Fact]
    public void Every_table_of_the_demo_document_is_written_once_and_nothing_else()
    {
        string tex = LatexTablesWriter.Write(DemoAppendix.Build());
        Assert.Equal(2, CountOf(tex, @"\begin{longtable}"));
        Assert.Contains(@"\label{tab:1}", tex);
        Assert.Contains(@"\label{tab:2}", tex);
        // Rows end in \\ or \\* (no page break after the first row or before the last): rows + 2 headers per table.
        Assert.Equal(DemoAppendix.LongTableRows + 2 + 2 * 2, CountOf(tex, @" \\" + "\n") + CountOf(tex, @" \\*" + "\n"));
    }

    internal static int CountOf(string text, string part)
    {
        int count = 0;
        for (int i = text.IndexOf(part, StringComparison.Ordinal); i >= 0; i = text.IndexOf(part, i + part.Length, StringComparison.Ordinal)) count++;
        return count;
    }
}
