using ItemReduce.Report.Export;
using ItemReduce.Report.Model;

namespace ItemReduce.Tests.Report;

// Pipe-table syntax (header row, delimiter row with ":" for alignment, "\|" for a literal pipe, ~~strike~~)
// as in GitHub-flavoured Markdown: common practice, no source.
public class MarkdownTablesWriterTests
{
    [Fact]
    public void Table_has_number_title_pipe_table_with_alignment_and_note()
    {
        var doc = new AppendixDocument("Demo", "", DemoAppendix.Created, "c",
        [
            new ParagraphBlock("not a table"),
            new TableBlock(3, "Item | wording check",
                [new TableColumn("Item"), new TableColumn("r", ColumnAlignment.Right), new TableColumn("Kept", ColumnAlignment.Center)],
                [new TableRow(["A|B", ".45", "yes"]), new TableRow(["C", ".30", "yes"], RowMark.Highlighted), new TableRow(["D", ".10", ""], RowMark.Struck)],
                "Invented."),
        ]);
        string md = MarkdownTablesWriter.Write(doc);
        string[] lines = md.Split('\n');
        Assert.Contains("**Table 3**", lines);
        Assert.Contains("| Item | r | Kept |", lines);
        Assert.Contains("| --- | ---: | :---: |", lines);
        Assert.Contains(@"| A\|B | .45 | yes |", lines);
        Assert.Contains("| **C** | **.30** | **yes** |", lines);
        Assert.Contains("| ~~D~~ | ~~.10~~ |  |", lines);
        Assert.Contains("*Note.* Invented.", lines);
        Assert.DoesNotContain("not a table", md);
    }

    [Fact]
    public void Every_row_has_as_many_unescaped_pipes_as_the_header()
    {
        string md = MarkdownTablesWriter.Write(DemoAppendix.Build());
        var tableLines = md.Split('\n').Where(l => l.StartsWith('|')).ToList();
        Assert.Equal(DemoAppendix.LongTableRows + 2 + 2 + 2, tableLines.Count); // rows + header/delimiter pairs + short table rows
        static int Pipes(string l) => l.Replace(@"\|", "", StringComparison.Ordinal).Count(c => c == '|');
        Assert.Equal(6, Pipes(tableLines[0]));
        Assert.All(tableLines.Take(DemoAppendix.LongTableRows + 2), l => Assert.Equal(6, Pipes(l)));
    }
}
