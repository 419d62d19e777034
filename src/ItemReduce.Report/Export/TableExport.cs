using System.Text;
using ItemReduce.Report.Model;

namespace ItemReduce.Report.Export;

/// <summary>What the text exports share: the walk over the tables and the marking of row kinds.</summary>
internal static class TableExport
{
    /// <summary><paramref name="preamble"/>, then each validated table (in document order) after a blank line.</summary>
    public static string Write(AppendixDocument document, string preamble, Action<StringBuilder, TableBlock> writeTable)
    {
        ArgumentNullException.ThrowIfNull(document);
        var sb = new StringBuilder(preamble);
        foreach (var table in document.Tables)
        {
            table.Validate();
            sb.Append('\n');
            writeTable(sb, table);
        }
        return sb.ToString();
    }

    /// <summary>Wraps a non-blank cell in the markers of its row kind: (open, close) for highlighted and struck rows.</summary>
    public static string Mark(string cell, RowMark mark, (string Open, string Close) highlighted, (string Open, string Close) struck)
    {
        if (cell.Trim().Length == 0) return cell;
        return mark switch
        {
            RowMark.Highlighted => highlighted.Open + cell + highlighted.Close,
            RowMark.Struck => struck.Open + cell + struck.Close,
            _ => cell,
        };
    }
}
