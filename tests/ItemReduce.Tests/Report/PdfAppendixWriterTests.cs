using System.Text;
using ItemReduce.Report.Model;
using ItemReduce.Report.Pdf;
using UglyToad.PdfPig;

namespace ItemReduce.Tests.Report;

/// <summary>Renders the demo appendix once and reads it back with PdfPig (an independent PDF parser).</summary>
public sealed class PdfAppendixFixture
{
    public byte[] Bytes { get; }
    public int PagesReported { get; }

    public PdfAppendixFixture()
    {
        using var ms = new MemoryStream();
        PagesReported = PdfAppendixWriter.Write(DemoAppendix.Build(), ms);
        Bytes = ms.ToArray();
    }
}

public class PdfAppendixWriterTests(PdfAppendixFixture fixture) : IClassFixture<PdfAppendixFixture>
{
    private static string Squash(string s) => new(s.Where(c => !char.IsWhiteSpace(c)).ToArray());

    private List<string> PageTexts()
    {
        using var pdf = PdfDocument.Open(fixture.Bytes);
        return pdf.GetPages().Select(p => Squash(p.Text)).ToList();
    }

    [Fact]
    public void Output_is_a_pdf_with_several_pages()
    {
        Assert.Equal("%PDF-", Encoding.ASCII.GetString(fixture.Bytes, 0, 5));
        using var pdf = PdfDocument.Open(fixture.Bytes);
        Assert.True(pdf.NumberOfPages > 1);
        Assert.Equal(pdf.NumberOfPages, fixture.PagesReported);
    }

    [Fact]
    public void Long_table_is_split_and_its_header_row_repeats_on_every_page_it_spans()
    {
        var pages = PageTexts();
        var spanned = Enumerable.Range(0, pages.Count)
            .Where(p => Enumerable.Range(0, DemoAppendix.LongTableRows).Any(i => pages[p].Contains(DemoAppendix.ItemCode(i), StringComparison.Ordinal)))
            .ToList();
        Assert.True(spanned.Count >= 2, $"table should span at least two pages, spans {spanned.Count}");
        foreach (int p in spanned)
        {
            Assert.Contains(Squash(DemoAppendix.LongTableHeader), pages[p]);
            Assert.Contains("Loading", pages[p]);
        }
        // Every row made it into the PDF exactly once.
        for (int i = 0; i < DemoAppendix.LongTableRows; i++)
            Assert.Single(spanned, p => pages[p].Contains(DemoAppendix.ItemCode(i), StringComparison.Ordinal));
        Assert.Contains("Table1(continued)", pages[spanned[1]]);
    }

    [Fact]
    public void Every_page_carries_page_n_of_total()
    {
        var pages = PageTexts();
        for (int i = 0; i < pages.Count; i++)
            Assert.Contains($"Page{i + 1}of{pages.Count}", pages[i]);
    }

    [Fact]
    public void Metadata_comes_from_the_document_model()
    {
        using var pdf = PdfDocument.Open(fixture.Bytes);
        Assert.Equal(DemoAppendix.Title, pdf.Information.Title);
        Assert.Equal(DemoAppendix.Creator, pdf.Information.Creator);
        Assert.Equal(PdfAppendixWriter.Producer, pdf.Information.Producer);
        // PDF date strings start "D:YYYYMMDDHHmm" (PDF 1.7 spec, section 7.9.4).
        Assert.StartsWith("D:202603150930", pdf.Information.CreationDate);
        Assert.StartsWith("D:202603150930", pdf.Information.ModifiedDate);
    }

    [Fact]
    public void All_text_including_chart_labels_uses_the_bundled_font_and_it_is_embedded()
    {
        using var pdf = PdfDocument.Open(fixture.Bytes);
        var fontNames = pdf.GetPages().SelectMany(p => p.Letters).Select(l => l.FontName ?? "").Distinct().ToList();
        // Exactly two font resources (regular, bold). Debian machines also have DejaVu installed system-wide:
        // had ScottPlot picked that copy for the chart labels, Skia would embed it as a third font.
        Assert.Equal(2, fontNames.Count);
        Assert.All(fontNames, n => Assert.Contains("DejaVuSans", n));
        Assert.Contains(fontNames, n => n.EndsWith("DejaVuSans-Bold", StringComparison.Ordinal));
        // An embedded TrueType font program is referenced as /FontFile2 in its font descriptor (PDF 1.7 spec, 9.8.1).
        Assert.Contains("/FontFile2", Encoding.Latin1.GetString(fixture.Bytes));
    }

    [Fact]
    public void Headings_and_chart_axis_labels_are_extractable_text()
    {
        string all = string.Concat(PageTexts());
        foreach (string h in DemoAppendix.Headings) Assert.Contains(Squash(h), all);
        // Axis labels come from ScottPlot drawing on the PDF canvas: present as text means the chart is vector.
        Assert.Contains("Componentnumber", all);
        Assert.Contains("Theoreticalquantile", all);
        Assert.Contains("retained:3", all);
    }

    [Fact]
    public void Charts_are_vector_graphics_not_images()
    {
        using var pdf = PdfDocument.Open(fixture.Bytes);
        Assert.All(pdf.GetPages(), p => Assert.Empty(p.GetImages()));
    }

    [Fact]
    public void Same_document_gives_identical_bytes()
    {
        using var ms = new MemoryStream();
        PdfAppendixWriter.Write(DemoAppendix.Build(), ms);
        Assert.Equal(fixture.Bytes, ms.ToArray());
    }

    [Fact]
    public void Malformed_table_is_rejected_with_its_number_and_row()
    {
        var doc = new AppendixDocument("t", "", DemoAppendix.Created, "c",
            [new TableBlock(3, "bad", [new TableColumn("a"), new TableColumn("b")], [new TableRow(["only one"])])]);
        var ex = Assert.Throws<ArgumentException>(() => PdfAppendixWriter.Write(doc, new MemoryStream()));
        Assert.Contains("Table 3, body row 1 has 1 cells; expected 2", ex.Message);
    }
}
