using System.Globalization;
using ItemReduce.Report.Model;
using SkiaSharp;

namespace ItemReduce.Report.Layout;

internal sealed partial class AppendixLayout
{
    private const float CellPadX = 5f;
    private const float CellPadY = 2.5f;
    private static readonly SKColor HighlightFill = new(0xE6, 0xE6, 0xE6);

    /// <summary>Everything about a table that does not depend on where it lands on the page.</summary>
    private sealed record TableShape(
        float[] Widths,
        List<TextLine>[] Header,
        float HeaderHeight,
        List<TextLine>[][] Cells,
        float[] RowHeights);

    private TableShape ShapeTable(TableBlock t, TextStyle head, TextStyle body)
    {
        int n = t.Columns.Count;
        var natural = new float[n];
        for (int j = 0; j < n; j++)
        {
            float w = LongestLine(t.Columns[j].Header, head);
            foreach (var row in t.Rows) w = Math.Max(w, LongestLine(row.Cells[j], body));
            natural[j] = w + 2 * CellPadX + 0.5f;
        }
        float[] widths = ColumnWidths.Fit(natural, page.ContentWidth);

        List<TextLine> WrapCell(string text, TextStyle style, int j)
            => Wrap([new TextRun(text, style.Bold)], style.Size, widths[j] - 2 * CellPadX, widths[j] - 2 * CellPadX);

        var header = t.Columns.Select((c, j) => WrapCell(c.Header, head, j)).ToArray();
        float headerHeight = header.Max(l => l.Count) * head.LineHeight + 2 * CellPadY;
        var cells = t.Rows.Select(r => r.Cells.Select((c, j) => WrapCell(c, body, j)).ToArray()).ToArray();
        var heights = cells.Select(r => r.Max(l => l.Count) * body.LineHeight + 2 * CellPadY).ToArray();
        return new TableShape(widths, header, headerHeight, cells, heights);
    }

    private float LongestLine(string text, TextStyle style)
        => text.ReplaceLineEndings("\n").Split('\n').Max(line => fonts.Measure(line, style));

    private void Table(TableBlock t)
    {
        t.Validate();
        var head = TextStyle.Strong(TableSize);
        var body = TextStyle.Regular(TableSize);
        var shape = ShapeTable(t, head, body);
        float left = page.ContentLeft;
        float right = left + shape.Widths.Sum();

        var numberStyle = TextStyle.Strong(BodySize);
        var titleStyle = TextStyle.Regular(BodySize);
        var titleLines = Wrap(InlineText.Parse(t.Title), titleStyle.Size, page.ContentWidth, page.ContentWidth);
        float captionHeight = numberStyle.LineHeight + titleLines.Count * titleStyle.LineHeight + 4f;

        Gap(BlockGap);
        // The title, header and first two rows start on one page, so a title never stands alone at a page foot and the
        // first page of a broken table holds more than one row.
        float firstRows = shape.RowHeights.Take(2).Sum();
        Reserve(captionHeight + shape.HeaderHeight + firstRows + 2f);
        SingleLine(TableLabel(t.Number), numberStyle, left);
        FlowLines(titleLines, left, left, titleStyle);
        y += 4f;
        TableHeader(t, shape, head, left, right);

        var note = TextStyle.Regular(NoteSize);
        List<TextLine> noteLines = [];
        if (!string.IsNullOrWhiteSpace(t.Note))
        {
            var runs = new List<TextRun> { new("Note.", true) };
            runs.AddRange(InlineText.Parse(" " + t.Note));
            noteLines = Wrap(runs, note.Size, page.ContentWidth, page.ContentWidth);
        }
        float noteHeight = 4f + noteLines.Count * note.LineHeight;

        for (int i = 0; i < t.Rows.Count; i++)
        {
            // The last row takes the note with it, so a note never stands alone at the top of a page, and the last two
            // rows stay together, so a continuation never holds a single row.
            int last = t.Rows.Count - 1;
            float needed = shape.RowHeights[i] + (i == last ? noteHeight : 0f) + (i == last - 1 ? shape.RowHeights[last] + noteHeight : 0f);
            if (y + needed > page.ContentBottom && i > 1)
            {
                Rule(left, right, y, 0.5f);
                NewPage();
                SingleLine(TableLabel(t.Number) + " (continued)", numberStyle, left);
                y += 4f;
                TableHeader(t, shape, head, left, right);
            }
            TableRowAt(t, shape, i, body, left);
        }
        Rule(left, right, y, 0.8f);
        y += 4f;

        FlowLines(noteLines, left, left, note);
        y += ParagraphGap;
    }

    internal static string TableLabel(int number) => "Table " + number.ToString(CultureInfo.InvariantCulture);

    internal static string FigureLabel(int number) => "Figure " + number.ToString(CultureInfo.InvariantCulture);

    private void TableHeader(TableBlock t, TableShape shape, TextStyle head, float left, float right)
    {
        Rule(left, right, y, 0.8f);
        CellsAt(t.Columns, shape.Header, shape.Widths, head, left);
        y += shape.HeaderHeight;
        Rule(left, right, y, 0.5f);
    }

    private void TableRowAt(TableBlock t, TableShape shape, int i, TextStyle body, float left)
    {
        var row = t.Rows[i];
        float height = shape.RowHeights[i];
        if (row.Mark == RowMark.Highlighted)
            current.Items.Add(new FillItem(SKRect.Create(left, y, shape.Widths.Sum(), height), HighlightFill));
        var style = row.Mark == RowMark.Struck ? body with { Color = TextStyle.Grey } : body;
        var placed = CellsAt(t.Columns, shape.Cells[i], shape.Widths, style, left);
        if (row.Mark == RowMark.Struck)
        {
            foreach (var (x, top, width) in placed)
            {
                float mid = top + fonts.BaselineOffset(style) - style.Size * 0.3f;
                current.Items.Add(new RuleItem(x, mid, x + width, mid, 0.6f, TextStyle.Grey));
            }
        }
        y += height;
    }

    /// <summary>Draws one table row (header or body) at the cursor; returns each drawn line's position and width.</summary>
    private List<(float X, float Top, float Width)> CellsAt(
        IReadOnlyList<TableColumn> columns, List<TextLine>[] cells, float[] widths, TextStyle style, float left)
    {
        var placed = new List<(float, float, float)>();
        float x0 = left;
        for (int j = 0; j < columns.Count; j++)
        {
            for (int k = 0; k < cells[j].Count; k++)
            {
                var line = cells[j][k];
                float inner = widths[j] - 2 * CellPadX;
                float x = columns[j].Alignment switch
                {
                    ColumnAlignment.Right => x0 + CellPadX + inner - line.Width,
                    ColumnAlignment.Center => x0 + CellPadX + (inner - line.Width) / 2f,
                    _ => x0 + CellPadX,
                };
                float top = y + CellPadY + k * style.LineHeight;
                DrawLine(line, x, top, style);
                if (line.Width > 0) placed.Add((x, top, line.Width));
            }
            x0 += widths[j];
        }
        return placed;
    }

    /// <summary>Caption lines, caption height and chart size of a figure (the chart shrinks to fit one page).</summary>
    private (List<TextLine> CaptionLines, float CaptionHeight, float Width, float Height) FigureSize(FigureBlock f)
    {
        var numberStyle = TextStyle.Strong(BodySize);
        var captionStyle = TextStyle.Regular(BodySize);
        var captionLines = Wrap(InlineText.Parse(f.Caption), captionStyle.Size, page.ContentWidth, page.ContentWidth);
        float captionHeight = numberStyle.LineHeight + captionLines.Count * captionStyle.LineHeight + 6f;
        float aspect = (float)f.Chart.AspectRatio;
        float width = page.ContentWidth;
        float height = width * aspect;
        float maxHeight = page.ContentHeight - captionHeight - 2f;
        if (height > maxHeight)
        {
            height = maxHeight;
            width = height / aspect;
        }
        return (captionLines, captionHeight, width, height);
    }

    private void Figure(FigureBlock f)
    {
        f.Chart.Validate();
        var (captionLines, captionHeight, width, height) = FigureSize(f);
        Gap(BlockGap);
        Reserve(captionHeight + height);
        SingleLine(FigureLabel(f.Number), TextStyle.Strong(BodySize), page.ContentLeft);
        FlowLines(captionLines, page.ContentLeft, page.ContentLeft, TextStyle.Regular(BodySize));
        y += 6f;
        float x = page.ContentLeft + (page.ContentWidth - width) / 2f;
        current.Items.Add(new ChartItem(SKRect.Create(x, y, width, height), f.Chart));
        y += height + ParagraphGap;
    }
}
