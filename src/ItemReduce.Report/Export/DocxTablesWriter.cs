using System.Globalization;
using DocumentFormat.OpenXml;
using DocumentFormat.OpenXml.Packaging;
using DocumentFormat.OpenXml.Wordprocessing;
using ItemReduce.Report.Layout;
using ItemReduce.Report.Model;
using TableRow = DocumentFormat.OpenXml.Wordprocessing.TableRow;

namespace ItemReduce.Report.Export;

/// <summary>
/// Writes every table of a document to a word-processor file (<c>tables.docx</c>, Office Open XML) in the usual
/// manuscript layout of the social sciences: a bold "Table N" line, the title in italics beneath it, horizontal rules
/// only (above and below the header row and below the last row), the note in smaller type under the table beginning
/// with an italic "Note.". Cell texts are those of the document model, whose numbers already drop the leading zero where
/// a value cannot exceed 1. Highlighted rows are bold, struck rows struck through. The title is kept with the table and
/// the header row repeats on continuation pages. Fonts: Times New Roman 12 pt, tables 10 pt, single spacing.
/// </summary>
public static class DocxTablesWriter
{
    private const string Font = "Times New Roman";
    private const string BodySize = "24", TableSize = "20", NoteSize = "20"; // half-points

    /// <summary>Writes the tables of <paramref name="document"/> to <paramref name="stream"/>.</summary>
    public static void Write(AppendixDocument document, Stream stream)
    {
        ArgumentNullException.ThrowIfNull(document);
        ArgumentNullException.ThrowIfNull(stream);
        using var buffer = new MemoryStream();
        using (var word = WordprocessingDocument.Create(buffer, WordprocessingDocumentType.Document))
        {
            var main = word.AddNewPart<MainDocumentPart>("application/vnd.openxmlformats-officedocument.wordprocessingml.document.main+xml", "rIdMain");
            var body = new Body();
            body.Append(Paragraph([new TextRun(document.Title.ReplaceLineEndings(" "), true)], BodySize, keepNext: false, spaceAfter: 240));
            foreach (var table in document.Tables)
            {
                table.Validate();
                AppendTable(body, table);
            }
            body.Append(new SectionProperties(
                new PageSize { Width = 11906, Height = 16838 }, // A4
                new PageMargin { Top = 1440, Bottom = 1440, Left = 1440, Right = 1440, Header = 708, Footer = 708 }));
            main.Document = new Document(body);
            main.Document.Save();
            // No core-properties part: System.IO.Packaging names it with a random GUID, and equal runs should give equal files.
        }
        // Entry times of the package are the run's time stamp, so equal runs give equal files.
        using (var zip = new System.IO.Compression.ZipArchive(buffer, System.IO.Compression.ZipArchiveMode.Update, leaveOpen: true))
            foreach (var entry in zip.Entries) entry.LastWriteTime = document.CreatedUtc;
        buffer.Position = 0;
        buffer.CopyTo(stream);
    }

    private static void AppendTable(Body body, TableBlock t)
    {
        body.Append(Paragraph([new TextRun("Table " + t.Number.ToString(CultureInfo.InvariantCulture), true)], BodySize, keepNext: true, spaceBefore: 240));
        body.Append(Paragraph(InlineText.Parse(t.Title.ReplaceLineEndings(" ")), BodySize, keepNext: true, italic: true, spaceAfter: 120));

        var table = new Table();
        table.Append(new TableProperties(
            new TableWidth { Width = "5000", Type = TableWidthUnitValues.Pct },
            new TableBorders(
                new TopBorder { Val = BorderValues.Single, Size = 8, Color = "000000" },
                new LeftBorder { Val = BorderValues.Nil },
                new BottomBorder { Val = BorderValues.Single, Size = 8, Color = "000000" },
                new RightBorder { Val = BorderValues.Nil },
                new InsideHorizontalBorder { Val = BorderValues.Nil },
                new InsideVerticalBorder { Val = BorderValues.Nil }),
            new TableLayout { Type = TableLayoutValues.Autofit },
            new TableCellMarginDefault(new TopMargin { Width = "0", Type = TableWidthUnitValues.Dxa },
                new StartMargin { Width = "80", Type = TableWidthUnitValues.Dxa },
                new BottomMargin { Width = "0", Type = TableWidthUnitValues.Dxa },
                new EndMargin { Width = "80", Type = TableWidthUnitValues.Dxa })));
        var grid = new TableGrid();
        foreach (var _ in t.Columns) grid.Append(new GridColumn());
        table.Append(grid);

        var header = new TableRow(new TableRowProperties(new TableHeader(), new CantSplit()));
        foreach (var c in t.Columns)
        {
            header.Append(Cell(c.Header, c.Alignment, RowMark.None, keepNext: true, ruleBelow: true));
        }
        table.Append(header);
        for (int i = 0; i < t.Rows.Count; i++)
        {
            var row = new TableRow(new TableRowProperties(new CantSplit()));
            // Keep each row with the next except the last, and the first two rows with the title, so a title never ends
            // a page alone and no page holds a single row of a table: short tables stay whole.
            bool keepNext = i < t.Rows.Count - 1 && (t.Rows.Count <= 25 || i < 1 || i >= t.Rows.Count - 2);
            for (int c = 0; c < t.Columns.Count; c++)
                row.Append(Cell(t.Rows[i].Cells[c], t.Columns[c].Alignment, t.Rows[i].Mark, keepNext));
            table.Append(row);
        }
        body.Append(table);
        if (!string.IsNullOrWhiteSpace(t.Note))
        {
            var runs = new List<TextRun> { new("Note.", false) };
            runs.AddRange(InlineText.Parse(" " + t.Note.ReplaceLineEndings(" ")));
            var p = Paragraph(runs, NoteSize, keepNext: false, spaceBefore: 60, spaceAfter: 240);
            // "Note." in italics.
            var first = p.Elements<Run>().First().RunProperties!;
            first.InsertAfter(new Italic(), first.GetFirstChild<RunFonts>());
            body.Append(p);
        }
    }

    private static TableCell Cell(string text, ColumnAlignment alignment, RowMark mark, bool keepNext, bool ruleBelow = false)
    {
        var p = Paragraph([new TextRun(text.ReplaceLineEndings(" "), mark == RowMark.Highlighted)], TableSize, keepNext, strike: mark == RowMark.Struck,
            justification: alignment switch
            {
                ColumnAlignment.Right => JustificationValues.Right,
                ColumnAlignment.Center => JustificationValues.Center,
                _ => JustificationValues.Left,
            });
        var props = new TableCellProperties();
        if (ruleBelow) props.Append(new TableCellBorders(new BottomBorder { Val = BorderValues.Single, Size = 4, Color = "000000" }));
        props.Append(new TableCellVerticalAlignment { Val = TableVerticalAlignmentValues.Bottom });
        return new TableCell(props, p);
    }

    private static Paragraph Paragraph(IEnumerable<TextRun> runs, string size, bool keepNext, bool italic = false, bool strike = false,
        JustificationValues? justification = null, int spaceBefore = 0, int spaceAfter = 0)
    {
        var props = new ParagraphProperties();
        if (keepNext) props.Append(new KeepNext());
        props.Append(new SpacingBetweenLines
        {
            Before = spaceBefore.ToString(CultureInfo.InvariantCulture),
            After = spaceAfter.ToString(CultureInfo.InvariantCulture),
            Line = "240",
            LineRule = LineSpacingRuleValues.Auto,
        });
        if (justification is { } j) props.Append(new Justification { Val = j });
        var p = new Paragraph(props);
        foreach (var r in runs)
        {
            var rp = new RunProperties(new RunFonts { Ascii = Font, HighAnsi = Font, ComplexScript = Font, EastAsia = Font });
            if (r.Bold) rp.Append(new Bold());
            if (italic) rp.Append(new Italic());
            if (strike) rp.Append(new Strike());
            rp.Append(new FontSize { Val = size });
            p.Append(new Run(rp, new Text(r.Text) { Space = SpaceProcessingModeValues.Preserve }));
        }
        if (!runs.Any()) p.Append(new Run(new Text("")));
        return p;
    }
}
