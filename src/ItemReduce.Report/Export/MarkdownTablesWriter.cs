using System.Globalization;
using System.Text;
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

    /// <summary>Text outside tables (titles, notes), which may quote codebook names and wording: line breaks become
    /// spaces and every character Markdown or HTML would act on is made inert — backslash, emphasis (<c>*</c>, <c>_</c>,
    /// <c>~</c>), code (backtick) and link/image brackets escaped with a backslash, <c>&lt; &gt; &amp;</c> written as
    /// entities, a leading <c>#</c> escaped — so the text shows as written.</summary>
    internal static string Inline(string text)
    {
        string s = Escape(text.ReplaceLineEndings(" "), "\\*_~`[]");
        return s.StartsWith('#') ? "\\" + s : s;
    }

    /// <summary>Table cell: as <see cref="Inline"/>, and pipes escaped.</summary>
    internal static string Cell(string text) => Escape(text.ReplaceLineEndings(" "), "\\|*_~`[]");

    private static string Escape(string text, string backslashed)
    {
        var sb = new StringBuilder(text.Length + 8);
        foreach (char ch in text)
        {
            switch (ch)
            {
                case '<': sb.Append("&lt;"); break;
                case '>': sb.Append("&gt;"); break;
                case '&': sb.Append("&amp;"); break;
                default:
                    if (backslashed.Contains(ch, StringComparison.Ordinal)) sb.Append('\\');
                    sb.Append(ch);
                    break;
            }
        }
        return sb.ToString();
    }

    private static string Delimiter(ColumnAlignment a) => a switch
    {
        ColumnAlignment.Right => " ---: ",
        ColumnAlignment.Center => " :---: ",
        _ => " --- ",
    };
}
