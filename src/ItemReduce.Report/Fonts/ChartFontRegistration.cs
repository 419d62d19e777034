using ScottPlot;
using SkiaSharp;

namespace ItemReduce.Report.Fonts;

/// <summary>
/// Makes the bundled typeface available to ScottPlot under <see cref="ReportFonts.ChartFamilyAlias"/>.
/// ScottPlot resolves font names through the process-wide list <see cref="ScottPlot.Fonts.FontResolvers"/>;
/// our resolver is inserted once, first in that list, and answers only for the alias (every other name
/// falls through to ScottPlot's own resolvers).
/// </summary>
internal static class ChartFontRegistration
{
    private static readonly object Gate = new();
    private static bool registered;

    public static void EnsureRegistered()
    {
        lock (Gate)
        {
            if (registered) return;
            ScottPlot.Fonts.FontResolvers.Insert(0, new BundledFontResolver());
            registered = true;
        }
    }

    private sealed class BundledFontResolver : IFontResolver
    {
        public SKTypeface? CreateTypeface(string fontName, FontWeight weight, FontSlant slant, FontSpacing width)
            => Matches(fontName) ? ReportFonts.Get(weight >= FontWeight.SemiBold) : null;

        public SKTypeface? CreateTypeface(string fontName, bool bold, bool italic)
            => Matches(fontName) ? ReportFonts.Get(bold) : null;

        private static bool Matches(string fontName)
            => string.Equals(fontName, ReportFonts.ChartFamilyAlias, StringComparison.OrdinalIgnoreCase);
    }
}
