using System.Globalization;
using System.Text;
using ItemReduce.Report.Layout;
using ItemReduce.Report.Model;

namespace ItemReduce.Report.Export;

/// <summary>
/// Writes every table of a document as Markdown: a bold "Table N" line, the title, a pipe table
/// (alignment in the delimiter row) and the note. Highlighted rows are set in bold, struck rows with
/// <c>~~strikethrough~~</c> (GitHub-flavoured Markdown).
/// </summary>
public static class MarkdownTablesWriter
{
    public static string Write(AppendixDocument document)
    {
        ArgumentNullException.ThrowIfNull(document);
        return TableExport.Write(document, "# " + Inline(document.Title) + "\n", WriteTable);
    }

    private static void WriteTable(StringBuilder sb, TableBlock t)
    {
        sb.Append("**Table ").Append(t.Number.ToString(CultureInfo.InvariantCulture)).Append("**\n\n");
        sb.Append(Inline(t.Title)).Append("\n\n");
        sb.Append("| ").Append(string.Join(" | ", t.Columns.Select(c => Cell(c.Header)))).Append(" |\n");
        sb.Append('|').Append(string.Concat(t.Columns.Select(c => Delimiter(c.Alignment) + "|"))).Append('\n');
        foreach (var row in t.Rows)
        {
            sb.Append("| ").Append(string.Join(" | ", row.Cells.Select(c => TableExport.Mark(Cell(c), row.Mark, ("**", "**"), ("~~", "~~"))))).Append(" |\n");
        }
        if (!string.IsNullOrWhiteSpace(t.Note))
        {
            sb.Append("\n*Note.* ").Append(Inline(t.Note)).Append('\n');
        }
    }

    /// <summary>Text outside tables: line breaks become spaces; **bold** markup is already Markdown.</summary>
    private static string Inline(string text) => text.ReplaceLineEndings(" ");

    /// <summary>Table cell: pipes and backslashes escaped, line breaks become spaces.</summary>
    internal static string Cell(string text)
        => text.ReplaceLineEndings(" ").Replace("\\", "\\\\", StringComparison.Ordinal).Replace("|", "\\|", StringComparison.Ordinal);

    private static string Delimiter(ColumnAlignment a) => a switch
    {
        ColumnAlignment.Right => " ---: ",
        ColumnAlignment.Center => " :---: ",
        _ => " --- ",
    };
}
