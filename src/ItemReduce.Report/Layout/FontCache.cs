using ItemReduce.Report.Fonts;
using SkiaSharp;

namespace ItemReduce.Report.Layout;

/// <summary>SKFont objects for the bundled typeface, one per (weight, size); used for measuring and drawing.</summary>
internal sealed class FontCache : IDisposable
{
    private readonly Dictionary<(bool Bold, float Size), SKFont> fonts = [];

    public SKFont Get(bool bold, float size)
    {
        if (!fonts.TryGetValue((bold, size), out var font))
        {
            font = new SKFont(ReportFonts.Get(bold), size)
            {
                // Unhinted outlines with sub-pixel positions: widths scale linearly with size, so layout is
                // the same on every machine.
                Subpixel = true,
                LinearMetrics = true,
                Hinting = SKFontHinting.None,
            };
            fonts.Add((bold, size), font);
        }
        return font;
    }

    public float Measure(string text, TextStyle style) => text.Length == 0 ? 0f : Get(style.Bold, style.Size).MeasureText(text);

    public float Measure(string text, bool bold, float size) => text.Length == 0 ? 0f : Get(bold, size).MeasureText(text);

    /// <summary>Baseline offset below the top of a line box of the style's <see cref="TextStyle.LineHeight"/>,
    /// centring ascent + descent in the box.</summary>
    public float BaselineOffset(TextStyle style)
    {
        var m = Get(style.Bold, style.Size).Metrics;
        float ascent = -m.Ascent, descent = m.Descent;
        return (style.LineHeight - (ascent + descent)) / 2f + ascent;
    }

    public void Dispose()
    {
        foreach (var f in fonts.Values) f.Dispose();
        fonts.Clear();
    }
}
