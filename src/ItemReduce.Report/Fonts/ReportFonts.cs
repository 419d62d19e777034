using SkiaSharp;

namespace ItemReduce.Report.Fonts;

/// <summary>
/// The one typeface family used for all appendix text and chart labels: DejaVu Sans (regular and bold),
/// bundled as embedded resources (licence: Fonts/DejaVu-LICENSE.txt, Bitstream Vera / public-domain
/// changes) so the output does not depend on fonts installed on the machine. Skia's PDF backend embeds
/// the glyphs it uses as a font subset.
/// </summary>
internal static class ReportFonts
{
    /// <summary>Family name under which the bundled typeface is offered to ScottPlot. Deliberately not the
    /// real family name, so that a system-installed DejaVu can never be picked instead.</summary>
    public const string ChartFamilyAlias = "ItemReduce Report Sans";

    private static readonly Lazy<SKTypeface> RegularFace = new(() => Load("DejaVuSans.ttf"));
    private static readonly Lazy<SKTypeface> BoldFace = new(() => Load("DejaVuSans-Bold.ttf"));

    /// <summary>DejaVu Sans (process-wide instance; do not dispose).</summary>
    public static SKTypeface Regular => RegularFace.Value;

    /// <summary>DejaVu Sans Bold (process-wide instance; do not dispose).</summary>
    public static SKTypeface Bold => BoldFace.Value;

    public static SKTypeface Get(bool bold) => bold ? Bold : Regular;

    private static SKTypeface Load(string fileName)
    {
        string resource = "ItemReduce.Report.Fonts." + fileName;
        using Stream stream = typeof(ReportFonts).Assembly.GetManifestResourceStream(resource)
            ?? throw new InvalidOperationException($"Embedded font resource '{resource}' is missing from {typeof(ReportFonts).Assembly.GetName().Name}.");
        // Copy into managed memory: SKTypeface.FromStream reads lazily and the resource stream is disposed here.
        var bytes = new byte[stream.Length];
        stream.ReadExactly(bytes);
        using var data = SKData.CreateCopy(bytes);
        return SKTypeface.FromData(data)
            ?? throw new InvalidOperationException($"Embedded font resource '{resource}' could not be decoded by Skia.");
    }
}
