using ItemReduce.Report.Layout;
using ItemReduce.Report.Model;

namespace ItemReduce.Tests.Report;

/// <summary>Where a table breaks across pages: never its title alone at a page foot, never a single row on a page.</summary>
public class TableBreakTests
{
    private static IReadOnlyList<LaidOutPage> Lay(params Block[] blocks)
    {
        using var fonts = new FontCache();
        return AppendixLayout.Run(new AppendixDocument("Layout test", "", DemoAppendix.Created, "test", blocks), PageGeometry.A4, fonts);
    }

    private static IEnumerable<Block> Lines(int n) => Enumerable.Range(0, n).Select(i => (Block)new ParagraphBlock("Line " + i));

    [Fact]
    public void Wherever_the_page_ends_each_page_of_a_table_holds_at_least_two_rows_and_the_title_is_never_alone()
    {
        const int rows = 9;
        var table = new TableBlock(1, "A table", [new TableColumn("Row"), new TableColumn("Value", ColumnAlignment.Right)],
            Enumerable.Range(0, rows).Select(i => new TableRow([$"row{i:00}", ".5"])).ToList(), "A note.");
        int fill = 1;
        while (Lay([.. Lines(fill + 1)]).Count == 1) fill++;
        int broken = 0;
        // Push the table down a line at a time across the foot of page one, so every break position is tried.
        for (int filler = Math.Max(0, fill - rows - 8); filler <= fill; filler++)
        {
            var pages = Lay([.. Lines(filler), table]);
            var perPage = pages.Select(p => p.Texts.Count(t => t.Text.StartsWith("row", StringComparison.Ordinal))).Where(c => c > 0).ToList();
            Assert.Equal(rows, perPage.Sum());
            Assert.All(perPage, c => Assert.True(c >= 2, $"filler {filler}: a page holds {c} row(s) of the table"));
            var titlePage = pages.Single(p => p.Texts.Any(t => t.Text == "Table 1"));
            Assert.Contains(titlePage.Texts, t => t.Text == "row00");
            Assert.Contains(titlePage.Texts, t => t.Text == "row01");
            if (perPage.Count > 1) broken++;
        }
        Assert.True(broken > 0, "no position broke the table; the test did not exercise a break");
    }
}
