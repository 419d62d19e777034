using ItemReduce.Report.Fonts;

namespace ItemReduce.Tests.Report;

public class ChartFontRegistrationTests
{
    [Fact]
    public void ScottPlot_resolves_the_alias_to_the_bundled_typefaces()
    {
        ChartFontRegistration.EnsureRegistered();
        ChartFontRegistration.EnsureRegistered(); // idempotent
        Assert.Same(ReportFonts.Regular, ScottPlot.Fonts.GetTypeface(ReportFonts.ChartFamilyAlias, bold: false, italic: false));
        Assert.Same(ReportFonts.Bold, ScottPlot.Fonts.GetTypeface(ReportFonts.ChartFamilyAlias, bold: true, italic: false));
        Assert.Equal(1, ScottPlot.Fonts.FontResolvers.Count(r => r.GetType().Name == "BundledFontResolver"));
    }

    [Fact]
    public void Bundled_typefaces_are_DejaVu_Sans_and_cover_the_characters_we_print()
    {
        Assert.Equal("DejaVu Sans", ReportFonts.Regular.FamilyName);
        Assert.Equal("DejaVu Sans", ReportFonts.Bold.FamilyName);
        Assert.True(ReportFonts.Bold.IsBold);
        // Minus sign, en/em dash, bullet, middle dot, Greek alpha/lambda/omega, chi, squared, less-or-equal, ellipsis.
        foreach (char c in "\u2212\u2013\u2014\u2022\u00B7\u03B1\u03BB\u03C9\u03C7\u00B2\u2264\u2026")
            Assert.True(ReportFonts.Regular.ContainsGlyph(c), $"U+{(int)c:X4} missing");
    }
}
