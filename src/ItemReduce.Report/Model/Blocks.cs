using ItemReduce.Report.Charts;

namespace ItemReduce.Report.Model;

/// <summary>One unit of appendix content. The set of kinds is closed (the records in this file).</summary>
public abstract record Block;

/// <summary>Section heading. <paramref name="Level"/> is 1 (section) or 2 (subsection).</summary>
public sealed record HeadingBlock(int Level, string Text) : Block
{
    public int Level { get; } = Level is 1 or 2
        ? Level
        : throw new ArgumentOutOfRangeException(nameof(Level), Level, "Heading level must be 1 or 2.");
}

/// <summary>
/// Running text, word-wrapped to the page width. Spans written as <c>**text**</c> are set in bold;
/// no other markup is interpreted.
/// </summary>
public sealed record ParagraphBlock(string Text) : Block;

/// <summary>Bulleted list; each item is a paragraph (same inline markup as <see cref="ParagraphBlock"/>).</summary>
public sealed record BulletListBlock(IReadOnlyList<string> Items) : Block;

/// <summary>Horizontal alignment of a table column.</summary>
public enum ColumnAlignment
{
    Left,
    Center,
    /// <summary>Right alignment; the usual choice for numbers with the same count of decimals.</summary>
    Right,
}

/// <summary>How a table row is marked.</summary>
public enum RowMark
{
    None,
    /// <summary>Shaded background (e.g. items kept in a short form).</summary>
    Highlighted,
    /// <summary>Text struck through and greyed (e.g. items dropped).</summary>
    Struck,
}

/// <summary>Table column: header text and alignment of header and cells.</summary>
public sealed record TableColumn(string Header, ColumnAlignment Alignment = ColumnAlignment.Left);

/// <summary>Table row: one string per column, already formatted (see <see cref="Formatting.NumberFormat"/>).</summary>
public sealed record TableRow(IReadOnlyList<string> Cells, RowMark Mark = RowMark.None);

/// <summary>
/// Numbered table ("Table <see cref="Number"/>") with a title above, a header row, body rows and an optional
/// note below. In the PDF a table longer than the page continues on the next page with its header row repeated.
/// </summary>
/// <param name="Number">1-based table number, unique within the document.</param>
/// <param name="Title">Title printed under the number.</param>
/// <param name="Columns">Column definitions (at least one).</param>
/// <param name="Rows">Body rows; each must have exactly one cell per column.</param>
/// <param name="Note">Text printed under the table after "Note." (null: no note).</param>
public sealed record TableBlock(
    int Number,
    string Title,
    IReadOnlyList<TableColumn> Columns,
    IReadOnlyList<TableRow> Rows,
    string? Note = null) : Block
{
    /// <summary>Throws <see cref="ArgumentException"/> if the shape is inconsistent.</summary>
    public void Validate()
    {
        if (Number < 1)
            throw new ArgumentException($"Table number must be at least 1, got {Number}.", nameof(Number));
        if (Columns.Count == 0)
            throw new ArgumentException($"Table {Number} has no columns.", nameof(Columns));
        for (int i = 0; i < Rows.Count; i++)
        {
            if (Rows[i].Cells.Count != Columns.Count)
                throw new ArgumentException(
                    $"Table {Number}, body row {i + 1} has {Rows[i].Cells.Count} cells; expected {Columns.Count} (one per column).",
                    nameof(Rows));
        }
    }
}

/// <summary>Numbered figure ("Figure <see cref="Number"/>") with a caption and a chart drawn as vector graphics.</summary>
public sealed record FigureBlock(int Number, string Caption, ChartSpec Chart) : Block;

/// <summary>One label/value line of a <see cref="KeyValueBlock"/>.</summary>
public sealed record KeyValueEntry(string Label, string Value);

/// <summary>Two-column list of labels and values (e.g. the reproducibility record: seed, versions, input files).</summary>
public sealed record KeyValueBlock(IReadOnlyList<KeyValueEntry> Entries) : Block;

/// <summary>Forces the following content onto a new page (no effect at the top of a page or at the end of the document).</summary>
internal sealed record PageBreakBlock : Block;

/// <summary>Reference list; each entry is a fully formatted citation, printed with a hanging indent.</summary>
public sealed record ReferenceListBlock(IReadOnlyList<string> Entries) : Block;
