using ItemReduce.Report.Charts;
using ItemReduce.Report.Layout;
using ItemReduce.Report.Model;

namespace ItemReduce.Tests.Report;

// Checks on the display lists produced before drawing (geometry of A4: 595.28 × 841.89 pt, ISO 216).
public class AppendixLayoutTests
{
    private static IReadOnlyList<LaidOutPage> Lay(AppendixDocument doc)
    {
        using var fonts = new FontCache();
        return AppendixLayout.Run(doc, PageGeometry.A4, fonts);
    }

    private static AppendixDocument Doc(params Block[] blocks) => new("Layout test", "", DemoAppendix.Created, "test", blocks);

    private static readonly ChartSpec Chart = new(ChartKind.Line, "x", "y", [new ChartSeries("s", [1.0, 2.0, 3.0], [3.0, 2.0, 1.0])]);

    [Fact]
    public void Everything_stays_inside_the_page_and_text_above_the_footer_stays_inside_the_margins()
    {
        var g = PageGeometry.A4;
        foreach (var page in Lay(DemoAppendix.Build()))
        {
            foreach (var t in page.Texts)
            {
                Assert.InRange(t.X, g.ContentLeft - 0.01f, g.ContentRight);
                Assert.InRange(t.Baseline, g.ContentTop, g.Height);
                if (t.Baseline < g.ContentBottom) continue; // footer lies in the bottom margin
                Assert.True(t.Baseline >= g.ContentBottom + 10f, $"text '{t.Text}' overlaps the footer rule");
            }
            foreach (var c in page.Items.OfType<ChartItem>())
            {
                Assert.True(c.Rect.Top >= g.ContentTop && c.Rect.Bottom <= g.ContentBottom + 0.01f);
                Assert.True(c.Rect.Left >= g.ContentLeft - 0.01f && c.Rect.Right <= g.ContentRight + 0.01f);
            }
        }
    }

    /// <summary>Largest number of one-line paragraphs that still fit on the first page.</summary>
    private static int ParagraphsFillingPageOne()
    {
        int n = 1;
        while (Lay(Doc([.. Lines(n + 1)])).Count == 1) n++;
        return n;
    }

    private static IEnumerable<Block> Lines(int n) => Enumerable.Range(0, n).Select(i => (Block)new ParagraphBlock("Line " + i));

    [Fact]
    public void Figure_that_does_not_fit_moves_to_the_next_page_with_its_caption()
    {
        var pages = Lay(Doc([.. Lines(ParagraphsFillingPageOne()), new FigureBlock(1, "A chart", Chart)]));
        Assert.Equal(2, pages.Count);
        Assert.Empty(pages[0].Items.OfType<ChartItem>());
        Assert.Single(pages[1].Items.OfType<ChartItem>());
        Assert.DoesNotContain(pages[1].Texts, t => t.Text.StartsWith("Line", StringComparison.Ordinal));
        var caption = pages[1].Texts.Single(t => t.Text == "Figure 1");
        Assert.True(caption.Baseline < pages[1].Items.OfType<ChartItem>().Single().Rect.Top);
    }

    [Fact]
    public void Heading_moves_with_a_figure_that_does_not_fit_below_it()
    {
        // Eight lines fewer than a full page leave ~150 pt: room for a heading and three lines, not for the chart.
        var pages = Lay(Doc([.. Lines(ParagraphsFillingPageOne() - 8), new HeadingBlock(1, "Charts"), new FigureBlock(1, "A chart", Chart)]));
        Assert.Equal(2, pages.Count);
        Assert.DoesNotContain(pages[0].Texts, t => t.Text == "Charts");
        Assert.Contains(pages[1].Texts, t => t.Text == "Charts");
        Assert.Single(pages[1].Items.OfType<ChartItem>());
    }

    [Theory]
    [InlineData(-1.5, "\u22121.5")]
    [InlineData(2.0, "2")]
    [InlineData(1e-15, "0")]
    [InlineData(0.125, "0.125")]
    public void Chart_tick_labels_are_invariant_with_typographic_minus(double value, string expected)
        => Assert.Equal(System.Text.RegularExpressions.Regex.Unescape(expected), ItemReduce.Report.Charts.ChartPainter.TickLabel(value));

    [Fact]
    public void Split_table_repeats_its_header_and_keeps_rows_in_order()
    {
        var rows = Enumerable.Range(1, 120).Select(i => new TableRow(["row" + i, i.ToString()])).ToList();
        var pages = Lay(Doc(new TableBlock(1, "Long", [new TableColumn("Key"), new TableColumn("Value", ColumnAlignment.Right)], rows, "A note.")));
        Assert.True(pages.Count >= 3);
        var seen = new List<int>();
        foreach (var page in pages)
        {
            Assert.Contains(page.Texts, t => t.Text == "Key" && t.Style.Bold);
            seen.AddRange(page.Texts.Where(t => t.Text.StartsWith("row", StringComparison.Ordinal)).Select(t => int.Parse(t.Text[3..])));
        }
        Assert.Equal(Enumerable.Range(1, 120), seen);
        // The note ends the table on the last page, with at least one row above it.
        Assert.Contains(pages[^1].Texts, t => t.Text == "Note.");
        Assert.Contains(pages[^1].Texts, t => t.Text == "row120");
    }

    [Fact]
    public void Footer_counts_pages_after_layout()
    {
        var pages = Lay(Doc(new ParagraphBlock("one"), new PageBreakBlock(), new ParagraphBlock("two"), new PageBreakBlock(), new PageBreakBlock()));
        Assert.Equal(2, pages.Count); // a page break at the top of a page adds nothing
        Assert.Contains(pages[0].Texts, t => t.Text == "Page 1 of 2");
        Assert.Contains(pages[1].Texts, t => t.Text == "Page 2 of 2");
    }

    [Fact]
    public void Right_aligned_cells_end_at_the_same_x()
    {
        var rows = new[] { ".5", "12.25", "1.0" }.Select(v => new TableRow(["k", v])).ToList();
        var page = Lay(Doc(new TableBlock(1, "T", [new TableColumn("K"), new TableColumn("V", ColumnAlignment.Right)], rows))).Single();
        using var fonts = new FontCache();
        var ends = page.Texts.Where(t => t.Text is ".5" or "12.25" or "1.0")
            .Select(t => t.X + fonts.Measure(t.Text, t.Style)).ToList();
        Assert.Equal(3, ends.Count);
        Assert.All(ends, e => Assert.Equal(ends[0], e, 2));
    }

    [Fact]
    public void Invalid_heading_level_and_chart_are_rejected()
    {
        Assert.Throws<ArgumentOutOfRangeException>(() => new HeadingBlock(3, "x"));
        var bad = new ChartSpec(ChartKind.Scatter, "x", "y", [new ChartSeries("s", [1.0, 2.0], [1.0])]);
        var ex = Assert.Throws<ArgumentException>(() => Lay(Doc(new FigureBlock(1, "c", bad))));
        Assert.Contains("2 x values and 1 y values", ex.Message);
    }
}
