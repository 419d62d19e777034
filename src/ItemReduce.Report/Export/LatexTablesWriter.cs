using System.Globalization;
using System.Text;
using ItemReduce.Report.Model;

namespace ItemReduce.Report.Export;

/// <summary>
/// Writes every table of a document as a LaTeX <c>longtable</c> (caption, label <c>tab:N</c>, booktabs rules, the header
/// repeated on continuation pages, and the note under the table), meant to be <c>\input</c> into an article. Needs
/// <c>\usepackage{booktabs,longtable,array}</c>; the preamble comment of the output says so. Tables that would be wider
/// than the text set their columns as wrapping paragraph columns whose widths are shares of <c>\linewidth</c>;
/// Greek letters and signs are set in math mode (<see cref="LatexText.Escape"/>), so the file compiles with pdflatex.
/// Highlighted rows are set in bold and struck rows in italics (no strike-out package is needed).
/// </summary>
public static class LatexTablesWriter
{
    /// <summary>Text width assumed when choosing column shares, in ems of the tables' \small type: a 345 pt text block
    /// (the standard article class at 10 pt) holds about 38 ems of 9 pt type.</summary>
    internal const double AssumedWidthEm = 38;

    /// <summary>Average width of one character in ems (a generous estimate, so estimated tables are not too narrow).</summary>
    private const double CharEm = 0.55;

    /// <summary>Cells up to this many characters never wrap.</summary>
    private const int ShortCell = 14;

    public static string Write(AppendixDocument document)
    {
        ArgumentNullException.ThrowIfNull(document);
        string preamble = "% Tables of \"" + document.Title.ReplaceLineEndings(" ") + "\"\n"
            + "% \\input this file into a document whose preamble has \\usepackage{booktabs,longtable,array}.\n"
            + "% Each table is a longtable (it breaks across pages) that fits the text width.\n";
        return TableExport.Write(document, preamble, WriteTable);
    }

    private static void WriteTable(StringBuilder sb, TableBlock t)
    {
        string number = t.Number.ToString(CultureInfo.InvariantCulture);
        int n = t.Columns.Count;
        string header = string.Join(" & ", t.Columns.Select(c => LatexText.Escape(c.Header))) + " \\\\\n";
        sb.Append("\\begingroup\\small\\setlength{\\tabcolsep}{4pt}\\setlength{\\LTpre}{\\medskipamount}\\setlength{\\LTpost}{0pt}\n");
        sb.Append("\\begin{longtable}{@{}").Append(string.Concat(ColumnSpecs(t))).Append("@{}}\n");
        sb.Append("\\caption{").Append(LatexText.EscapeInline(t.Title)).Append("}\\label{tab:").Append(number).Append("}\\\\\n");
        sb.Append("\\toprule\n").Append(header).Append("\\midrule\n\\endfirsthead\n");
        sb.Append("\\multicolumn{").Append(n).Append("}{@{}l}{\\textit{Table \\thetable\\ (continued)}}\\\\\n");
        sb.Append("\\toprule\n").Append(header).Append("\\midrule\n\\endhead\n");
        sb.Append("\\midrule\n\\multicolumn{").Append(n).Append("}{r@{}}{\\textit{continued}}\\\\\n\\endfoot\n");
        sb.Append("\\bottomrule\n\\endlastfoot\n");
        for (int i = 0; i < t.Rows.Count; i++)
        {
            var row = t.Rows[i];
            sb.Append(string.Join(" & ", row.Cells.Select(c => Cell(c, row.Mark))));
            // Keep the first two and the last two rows together, so no page holds a single row of a table.
            sb.Append(i < 1 || i >= t.Rows.Count - 2 ? " \\\\*\n" : " \\\\\n");
        }
        sb.Append("\\end{longtable}\n");
        if (!string.IsNullOrWhiteSpace(t.Note))
        {
            sb.Append("\\nopagebreak\\par\\noindent{\\footnotesize \\textit{Note.} ").Append(LatexText.EscapeInline(t.Note)).Append("\\par}\n");
        }
        sb.Append("\\endgroup\n");
    }

    /// <summary>Column specifications: natural l/r/c columns when the table fits <see cref="AssumedWidthEm"/>; otherwise
    /// paragraph columns whose widths are shares of the line width left after the column gaps.</summary>
    internal static IReadOnlyList<string> ColumnSpecs(TableBlock t)
    {
        int n = t.Columns.Count;
        var cellMax = new int[n];
        var headerLen = new int[n];
        var headerWord = new int[n];
        var wraps = new bool[n];
        for (int c = 0; c < n; c++)
        {
            string h = t.Columns[c].Header;
            headerLen[c] = h.Length;
            headerWord[c] = h.Split(' ').Max(w => w.Length);
            cellMax[c] = t.Rows.Count == 0 ? 0 : t.Rows.Max(r => r.Cells[c].Length);
            wraps[c] = cellMax[c] > ShortCell && t.Rows.Any(r => r.Cells[c].Trim().Contains(' ', StringComparison.Ordinal));
        }
        double gaps = 2 * 4.0 / 9 * (n - 1); // \tabcolsep = 4 pt in 9 pt type, none at the outer edges
        double natural = Enumerable.Range(0, n).Sum(c => Math.Max(cellMax[c], headerLen[c]) * CharEm) + gaps;
        if (natural <= AssumedWidthEm)
            return t.Columns.Select(c => c.Alignment switch { ColumnAlignment.Right => "r", ColumnAlignment.Center => "c", _ => "l" }).ToList();

        double available = AssumedWidthEm - gaps;
        var width = new double[n];
        for (int c = 0; c < n; c++) width[c] = (wraps[c] ? Math.Max(headerWord[c], 10) : Math.Max(cellMax[c], headerWord[c])) * CharEm;
        double fixedWidth = Enumerable.Range(0, n).Where(c => !wraps[c]).Sum(c => width[c]);
        double wrapWant = Enumerable.Range(0, n).Where(c => wraps[c]).Sum(c => Math.Min(cellMax[c], 80) * CharEm);
        double rest = available - fixedWidth;
        if (wrapWant > 0 && rest > Enumerable.Range(0, n).Where(c => wraps[c]).Sum(c => width[c]))
            for (int c = 0; c < n; c++)
                if (wraps[c]) width[c] = Math.Min(rest * Math.Min(cellMax[c], 80) * CharEm / wrapWant, Math.Max(cellMax[c], headerLen[c]) * CharEm);
        double total = width.Sum();
        double scale = available / total; // fill the text width
        return Enumerable.Range(0, n).Select(c =>
        {
            int permille = (int)Math.Floor(1000 * width[c] * scale / available);
            string align = t.Columns[c].Alignment switch
            {
                ColumnAlignment.Right => "\\raggedleft",
                ColumnAlignment.Center => "\\centering",
                _ => "\\raggedright",
            };
            return string.Create(CultureInfo.InvariantCulture,
                $">{{{align}\\arraybackslash}}p{{\\dimexpr(\\linewidth-{2 * (n - 1)}\\tabcolsep)*{permille}/1000\\relax}}");
        }).ToList();
    }

    private static string Cell(string text, RowMark mark)
        => TableExport.Mark(LatexText.Escape(text), mark, ("\\textbf{", "}"), ("\\textit{", "}"));
}
