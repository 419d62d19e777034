namespace ItemReduce.Report.Model;

/// <summary>
/// A methods appendix as a flat sequence of blocks, independent of the analysis code.
/// The renderers (<see cref="Pdf.PdfAppendixWriter"/>, <see cref="Export.MarkdownTablesWriter"/>,
/// <see cref="Export.LatexTablesWriter"/>) read nothing but this record, so the same document
/// always produces the same output.
/// </summary>
/// <param name="Title">Main title, printed at the top of the first page and stored in the PDF metadata.</param>
/// <param name="Subtitle">Second title line (may be empty).</param>
/// <param name="CreatedUtc">Time stamp of the analysis run. Printed on the first page and written as the
/// PDF creation/modification date; the renderers never read the clock.</param>
/// <param name="Creator">Name and version of the producing program (PDF "Creator").</param>
/// <param name="Blocks">Content in reading order.</param>
public sealed record AppendixDocument(
    string Title,
    string Subtitle,
    DateTimeOffset CreatedUtc,
    string Creator,
    IReadOnlyList<Block> Blocks)
{
    /// <summary>Optional text printed at the left of every page footer (e.g. data file name and seed).
    /// Null or empty: footer shows the page number only.</summary>
    public string? RunningFooter { get; init; }

    /// <summary>Tables in document order.</summary>
    public IEnumerable<TableBlock> Tables => Blocks.OfType<TableBlock>();
}
