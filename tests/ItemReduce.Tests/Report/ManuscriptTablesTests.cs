using System.Diagnostics;
using System.Text;
using DocumentFormat.OpenXml.Packaging;
using DocumentFormat.OpenXml.Validation;
using DocumentFormat.OpenXml.Wordprocessing;
using ItemReduce.Report.Export;
using ItemReduce.Tests.Cli;
using ItemReduce.Tests.Support;

namespace ItemReduce.Tests.Report;

/// <summary>A test that runs only where pdflatex is installed; elsewhere it is skipped with the reason and the check
/// script to run by hand.</summary>
public sealed class PdflatexFactAttribute : FactAttribute
{
    public PdflatexFactAttribute()
    {
        if (!Pdflatex.Available)
            Skip = "pdflatex is not installed (Debian: texlive-latex-base, texlive-latex-recommended, texlive-latex-extra); "
                + "check by hand with tools/check-latex-tables.sh RESULTS_DIR";
    }
}

internal static class Pdflatex
{
    public static readonly bool Available = (Environment.GetEnvironmentVariable("PATH") ?? "").Split(':')
        .Any(d => d.Length > 0 && File.Exists(Path.Combine(d, "pdflatex")));
}

/// <summary>tables.tex compiles and fits; tables.docx is valid Office Open XML and holds the tables of tables.md.</summary>
public class ManuscriptTablesTests(PresentationTests.SampleRun run) : IClassFixture<PresentationTests.SampleRun>
{
    private string Results => Path.Combine(run.Folder, "results");

    private static (int Code, string Out, string Err) CheckScript(string resultsDir)
    {
        var psi = new ProcessStartInfo("bash") { RedirectStandardOutput = true, RedirectStandardError = true, UseShellExecute = false };
        psi.ArgumentList.Add(Path.Combine(PresentationTests.Root(), "tools", "check-latex-tables.sh"));
        psi.ArgumentList.Add(resultsDir);
        using var p = Process.Start(psi)!;
        var o = p.StandardOutput.ReadToEndAsync();
        var e = p.StandardError.ReadToEndAsync();
        p.WaitForExit();
        return (p.ExitCode, o.Result, e.Result);
    }

    // pdflatex itself is the outside judge: the file compiles in a plain article with the packages its header names,
    // and no table is wider than the text (no "Overfull \hbox" in the log).
    [PdflatexFact]
    public void Sample_tables_tex_compiles_with_pdflatex_and_fits_the_text_width()
    {
        Assert.True(run.Result.Code == 0, run.Result.Err);
        var r = CheckScript(Results);
        Assert.True(r.Code == 0, r.Out + r.Err);
        Assert.Contains("compiles", r.Out);
    }

    [PdflatexFact]
    public void Tables_tex_compiles_when_codebook_wording_holds_special_characters_greek_and_long_text()
    {
        using var s = new TempSurvey();
        string text = "Item α & ω ≥ 50% of $x_1$ {b} ~ ^ \\\\ --opt; " + string.Join(" ", Enumerable.Repeat("a long questionnaire wording that must wrap", 5));
        var cb = new StringBuilder("item,subscale,reverse,min,max,text\n");
        for (int j = 1; j <= 6; j++) cb.Append($"q{j},S{(j + 2) / 3},false,1,5,\"{text.Replace("\"", "\"\"", StringComparison.Ordinal)} {j}\"\n");
        s.WithCodebook(6, cb.ToString()).WithResponses(TempSurvey.ValidResponses(80, 6));
        var run2 = s.Run("--no-pdf", "--items-per-factor", "3");
        Assert.True(run2.Code == 0, run2.Err);
        var r = CheckScript(s.Out);
        Assert.True(r.Code == 0, r.Out + r.Err);
    }

    [Fact]
    public void Tables_docx_is_valid_office_open_xml()
    {
        using var doc = WordprocessingDocument.Open(Path.Combine(Results, "tables.docx"), false);
        // The Open XML SDK's own schema validator (Office 2019 rules).
        var errors = new OpenXmlValidator(DocumentFormat.OpenXml.FileFormatVersions.Office2019).Validate(doc).ToList();
        Assert.True(errors.Count == 0, string.Join("\n", errors.Take(5).Select(e => $"{e.Path?.XPath}: {e.Description}")));
    }

    [Fact]
    public void Tables_docx_holds_the_tables_of_tables_md_with_numbered_titles_rules_and_notes()
    {
        var md = MarkdownTables(File.ReadAllText(Path.Combine(Results, "tables.md")));
        using var doc = WordprocessingDocument.Open(Path.Combine(Results, "tables.docx"), false);
        var body = doc.MainDocumentPart!.Document!.Body!;
        var tables = body.Elements<Table>().ToList();
        Assert.Equal(md.Count, tables.Count);
        for (int k = 0; k < md.Count; k++)
        {
            var t = tables[k];
            var before = t.ElementsBefore().OfType<Paragraph>().Reverse().Take(2).Reverse().ToList();
            Assert.Equal($"Table {md[k].Number}", before[0].InnerText);
            Assert.True(before[0].Descendants<Bold>().Any(), "the number line is bold");
            Assert.Equal(md[k].Title, before[1].InnerText);
            Assert.True(before[1].Descendants<Italic>().Any(), "the title is italic");
            Assert.NotNull(before[1].ParagraphProperties?.KeepNext); // the title stays with its table
            var rows = t.Elements<TableRow>().Select(r => r.Elements<TableCell>().Select(c => c.InnerText).ToList()).ToList();
            Assert.Equal(md[k].Rows.Select(r => r.Cells), rows);
            // Bold rows are the rows tables.md marks bold.
            var bold = t.Elements<TableRow>().Skip(1).Select(r => r.Descendants<Bold>().Any()).ToList();
            Assert.Equal(md[k].Rows.Skip(1).Select(r => r.Bold), bold);
            // Horizontal rules only: top and bottom of the table, below the header; no vertical lines.
            var borders = t.GetFirstChild<TableProperties>()!.GetFirstChild<TableBorders>()!;
            Assert.Equal(DocumentFormat.OpenXml.Wordprocessing.BorderValues.Single, borders.TopBorder!.Val!.Value);
            Assert.Equal(DocumentFormat.OpenXml.Wordprocessing.BorderValues.Single, borders.BottomBorder!.Val!.Value);
            Assert.Equal(DocumentFormat.OpenXml.Wordprocessing.BorderValues.Nil, borders.LeftBorder!.Val!.Value);
            Assert.Equal(DocumentFormat.OpenXml.Wordprocessing.BorderValues.Nil, borders.InsideVerticalBorder!.Val!.Value);
            Assert.All(t.Elements<TableRow>().First().Elements<TableCell>(), c => Assert.NotNull(c.TableCellProperties?.TableCellBorders?.BottomBorder));
            Assert.NotNull(t.Elements<TableRow>().First().TableRowProperties?.GetFirstChild<TableHeader>()); // repeats on new pages
            // The note under the table, beginning with an italic "Note.".
            if (md[k].Note is { } note)
            {
                var after = t.ElementsAfter().OfType<Paragraph>().First();
                Assert.Equal("Note. " + note, after.InnerText);
                Assert.NotNull(after.Elements<Run>().First().RunProperties?.Italic);
            }
        }
        // Leading zeros are dropped where a value cannot exceed 1 (loadings, α): no "0.7" style value in the loadings table.
        var loadings = tables.Single(t => t.ElementsBefore().OfType<Paragraph>().Last().InnerText == "Rotated pattern loadings");
        Assert.Contains(loadings.Descendants<Text>(), x => x.Text.StartsWith('.'));
        Assert.DoesNotContain(loadings.Descendants<Text>(), x => x.Text.StartsWith("0.", StringComparison.Ordinal));
    }

    [Fact]
    public void Notes_say_bold_where_rows_are_bold()
    {
        string md = File.ReadAllText(Path.Combine(Results, "tables.md"));
        Assert.DoesNotContain("are shaded", md);
        Assert.Contains("highlighted (bold", md);
    }

    [Fact]
    public void Writing_twice_gives_the_same_bytes()
    {
        var doc = DemoAppendix.Build();
        using var a = new MemoryStream();
        using var b = new MemoryStream();
        DocxTablesWriter.Write(doc, a);
        DocxTablesWriter.Write(doc, b);
        Assert.Equal(a.ToArray(), b.ToArray());
    }

    private sealed record MdRow(List<string> Cells, bool Bold);

    private sealed record MdTable(int Number, string Title, List<MdRow> Rows, string? Note);

    /// <summary>Reads tables.md back: "**Table N**", the title, the pipe table (header, delimiter row, rows) and
    /// "*Note.* …", undoing the writer's escapes (backslash escapes and the three HTML entities) and row markers.</summary>
    private static List<MdTable> MarkdownTables(string md)
    {
        var lines = md.Split('\n');
        var result = new List<MdTable>();
        for (int i = 0; i < lines.Length; i++)
        {
            if (!lines[i].StartsWith("**Table ", StringComparison.Ordinal)) continue;
            int number = int.Parse(lines[i]["**Table ".Length..^2], System.Globalization.CultureInfo.InvariantCulture);
            string title = Unescape(lines[i + 2]);
            var rows = new List<MdRow>();
            int j = i + 4;
            for (; j < lines.Length && lines[j].StartsWith('|'); j++)
            {
                if (j == i + 5) continue; // delimiter row
                var cells = SplitRow(lines[j]);
                bool bold = cells.Any(c => c.StartsWith("**", StringComparison.Ordinal) && c.EndsWith("**", StringComparison.Ordinal) && c.Length >= 4);
                rows.Add(new MdRow(cells.Select(c => Unescape(Strip(c))).ToList(), bold && j > i + 5));
            }
            string? note = j + 1 < lines.Length && lines[j + 1].StartsWith("*Note.* ", StringComparison.Ordinal) ? Unescape(lines[j + 1]["*Note.* ".Length..]) : null;
            result.Add(new MdTable(number, title, rows, note));
        }
        return result;
    }

    private static string Strip(string c)
    {
        foreach (string m in new[] { "**", "~~" })
            if (c.Length >= 4 && c.StartsWith(m, StringComparison.Ordinal) && c.EndsWith(m, StringComparison.Ordinal)) return c[2..^2];
        return c;
    }

    private static List<string> SplitRow(string line)
    {
        var cells = new List<string>();
        var sb = new StringBuilder();
        string inner = line.Trim()[1..^1];
        for (int k = 0; k < inner.Length; k++)
        {
            if (inner[k] == '\\' && k + 1 < inner.Length) { sb.Append(inner[k]).Append(inner[++k]); continue; }
            if (inner[k] == '|') { cells.Add(sb.ToString().Trim()); sb.Clear(); continue; }
            sb.Append(inner[k]);
        }
        cells.Add(sb.ToString().Trim());
        return cells;
    }

    private static string Unescape(string s)
    {
        var sb = new StringBuilder();
        for (int k = 0; k < s.Length; k++)
        {
            if (s[k] == '\\' && k + 1 < s.Length) { sb.Append(s[++k]); continue; }
            sb.Append(s[k]);
        }
        // Bold spans in titles and notes (**…**) are plain text in the docx runs.
        return sb.ToString().Replace("&lt;", "<", StringComparison.Ordinal).Replace("&gt;", ">", StringComparison.Ordinal)
            .Replace("&amp;", "&", StringComparison.Ordinal).Replace("**", "", StringComparison.Ordinal);
    }
}
