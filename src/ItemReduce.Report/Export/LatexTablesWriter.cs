using System.Globalization;
using System.Text;
using ItemReduce.Report.Model;

namespace ItemReduce.Report.Export;

/// <summary>
/// Writes every table of a document as a LaTeX <c>table</c> float (caption, label <c>tab:N</c>,
/// <c>tabular</c> with booktabs rules and a note). Requires <c>\usepackage{booktabs}</c> and, for struck
/// rows, <c>\usepackage[normalem]{ulem}</c>; the preamble comment of the output says so.
/// </summary>
public static class LatexTablesWriter
{
    public static string Write(AppendixDocument document)
    {
        ArgumentNullException.ThrowIfNull(document);
        string preamble = "% Tables of \"" + document.Title.ReplaceLineEndings(" ") + "\"\n"
            + "% Needs \\usepackage{booktabs} and \\usepackage[normalem]{ulem} (struck rows) in the preamble.\n";
        return TableExport.Write(document, preamble, WriteTable);
    }

    private static void WriteTable(StringBuilder sb, TableBlock t)
    {
        string number = t.Number.ToString(CultureInfo.InvariantCulture);
        sb.Append("\\begin{table}[htbp]\n\\centering\n");
        sb.Append("\\caption{").Append(LatexText.EscapeInline(t.Title)).Append("}\n");
        sb.Append("\\label{tab:").Append(number).Append("}\n");
        sb.Append("\\begin{tabular}{").Append(string.Concat(t.Columns.Select(c => AlignmentLetter(c.Alignment)))).Append("}\n");
        sb.Append("\\toprule\n");
        sb.Append(string.Join(" & ", t.Columns.Select(c => LatexText.Escape(c.Header)))).Append(" \\\\\n");
        sb.Append("\\midrule\n");
        foreach (var row in t.Rows)
        {
            sb.Append(string.Join(" & ", row.Cells.Select(c => Cell(c, row.Mark)))).Append(" \\\\\n");
        }
        sb.Append("\\bottomrule\n\\end{tabular}\n");
        if (!string.IsNullOrWhiteSpace(t.Note))
        {
            sb.Append("\\par\\smallskip\n{\\footnotesize \\textit{Note.} ").Append(LatexText.EscapeInline(t.Note)).Append("\\par}\n");
        }
        sb.Append("\\end{table}\n");
    }

    private static string Cell(string text, RowMark mark)
        => TableExport.Mark(LatexText.Escape(text), mark, ("\\textbf{", "}"), ("\\sout{", "}"));

    private static char AlignmentLetter(ColumnAlignment a) => a switch
    {
        ColumnAlignment.Right => 'r',
        ColumnAlignment.Center => 'c',
        _ => 'l',
    };
}
