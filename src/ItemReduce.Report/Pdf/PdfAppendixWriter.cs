using ItemReduce.Report.Layout;
using ItemReduce.Report.Model;
using SkiaSharp;

namespace ItemReduce.Report.Pdf;

/// <summary>
/// Writes an <see cref="AppendixDocument"/> as a PDF (A4, bundled DejaVu Sans embedded as subsets,
/// charts as vector graphics) using Skia's PDF backend.
/// </summary>
public static class PdfAppendixWriter
{
    /// <summary>Value of the PDF "Producer" entry.</summary>
    public const string Producer = "ItemReduce.Report with the Skia PDF backend";

    /// <summary>
    /// Lays out and writes <paramref name="document"/> to <paramref name="output"/> (which is left open).
    /// The bytes depend only on the document: its <see cref="AppendixDocument.CreatedUtc"/> is used for the
    /// creation and modification dates, and the Skia PDF backend (without PDF/A) writes no random file
    /// identifier (checked by a test that renders twice).
    /// </summary>
    /// <returns>Number of pages written.</returns>
    /// <exception cref="ArgumentException">A table or chart in the document is malformed.</exception>
    public static int Write(AppendixDocument document, Stream output)
    {
        ArgumentNullException.ThrowIfNull(document);
        ArgumentNullException.ThrowIfNull(output);
        if (!output.CanWrite) throw new ArgumentException("The output stream is not writable.", nameof(output));

        var geometry = PageGeometry.A4;
        using var fonts = new FontCache();
        var pages = AppendixLayout.Run(document, geometry, fonts);

        var metadata = SKDocumentPdfMetadata.Default;
        metadata.Title = document.Title;
        metadata.Subject = document.Subtitle;
        metadata.Creator = document.Creator;
        metadata.Producer = Producer;
        metadata.Creation = document.CreatedUtc.UtcDateTime;
        metadata.Modified = document.CreatedUtc.UtcDateTime;

        using (var skStream = new SKManagedWStream(output, disposeManagedStream: false))
        using (var pdf = SKDocument.CreatePdf(skStream, metadata))
        {
            foreach (var page in pages)
            {
                var canvas = pdf.BeginPage(geometry.Width, geometry.Height);
                PagePainter.Paint(canvas, page, fonts);
                pdf.EndPage();
            }
            pdf.Close();
        }
        return pages.Count;
    }
}
