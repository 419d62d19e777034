using ItemReduce.Report.Fonts;
using ScottPlot;
using SkiaSharp;

namespace ItemReduce.Report.Charts;

/// <summary>
/// Draws a <see cref="ChartSpec"/> with ScottPlot 5 directly onto a Skia canvas (for the PDF backend this
/// keeps lines and text as vector graphics). All chart text uses the bundled typeface.
/// </summary>
internal static class ChartPainter
{
    // Print-friendly colours that stay distinguishable in greyscale (dark to mid tones).
    private static readonly Color[] Palette =
    [
        Color.FromHex("#1F1F1F"),
        Color.FromHex("#1B5E9E"),
        Color.FromHex("#C4561D"),
        Color.FromHex("#3A8A3A"),
        Color.FromHex("#7A3F9A"),
    ];

    private static readonly Color ReferenceGrey = Color.FromHex("#8A8A8A");

    private const float LabelSize = 9.5f;
    private const float TickSize = 8f;

    public static void Draw(SKCanvas canvas, SKRect rect, ChartSpec spec)
    {
        spec.Validate();
        ChartFontRegistration.EnsureRegistered();
        using var plot = Build(spec);
        plot.Render(canvas, new PixelRect(rect.Left, rect.Right, rect.Bottom, rect.Top));
    }

    internal static Plot Build(ChartSpec spec)
    {
        // Before any font lookup: ScottPlot caches the typeface it finds for a name, so an unregistered alias would stick
        // to a system font for the rest of the process.
        ChartFontRegistration.EnsureRegistered();
        var plot = new Plot();
        plot.Font.Set(ReportFonts.ChartFamilyAlias);
        plot.FigureBackground.Color = Colors.White;

        for (int i = 0; i < spec.Series.Count; i++)
            AddSeries(plot, spec.Kind, spec.LogY ? spec.Series[i] with { Y = spec.Series[i].Y.Select(Math.Log10).ToList() } : spec.Series[i],
                Palette[i % Palette.Length]);

        if (spec.IdentityLine && FiniteRange(spec) is var (lo, hi))
        {
            var line = plot.Add.Line(lo, lo, hi, hi);
            line.LineColor = ReferenceGrey;
            line.LineWidth = 1f;
            line.LinePattern = LinePattern.Dashed;
            line.MarkerSize = 0;
            line.LegendText = "y = x";
        }

        if (spec.Marker is { } marker)
        {
            var v = plot.Add.VerticalLine(marker.X, 1.2f, ReferenceGrey, LinePattern.Dotted);
            v.Text = marker.Label;
            v.LabelOppositeAxis = true;
            v.LabelFontName = ReportFonts.ChartFamilyAlias;
            v.LabelFontSize = TickSize;
            v.LabelBackgroundColor = Colors.White;
            v.LabelFontColor = Color.FromHex("#1F1F1F");
            // Leave room on the right so a marker at the last data point keeps its label on the page.
            plot.Axes.AutoScale();
            var limits = plot.Axes.GetLimits();
            double span = limits.Right - limits.Left;
            if (span > 0 && marker.X > limits.Right - 0.15 * span)
                plot.Axes.SetLimitsX(limits.Left, marker.X + 0.15 * span);
        }

        if (spec.YLimits is { } yl) plot.Axes.SetLimitsY(yl.Low, yl.High);
        plot.XLabel(spec.XLabel, LabelSize);
        plot.YLabel(spec.YLabel, LabelSize);
        foreach (var axis in plot.Axes.GetAxes())
        {
            if (axis.TickGenerator is ScottPlot.TickGenerators.NumericAutomatic ticks)
                ticks.LabelFormatter = TickLabel;
            axis.Label.FontName = ReportFonts.ChartFamilyAlias;
            axis.TickLabelStyle.FontName = ReportFonts.ChartFamilyAlias;
            axis.TickLabelStyle.FontSize = TickSize;
        }
        plot.Axes.Title.Label.FontName = ReportFonts.ChartFamilyAlias;
        if (spec.LogY)
        {
            // Series hold log10 values; ticks at whole powers of ten with minor ticks between (ScottPlot's log recipe).
            plot.Axes.Left.TickGenerator = new ScottPlot.TickGenerators.NumericAutomatic
            {
                MinorTickGenerator = new ScottPlot.TickGenerators.LogMinorTickGenerator(),
                IntegerTicksOnly = true,
                LabelFormatter = PowerOfTenLabel,
            };
        }

        bool legend = spec.Series.Count > 1 || spec.IdentityLine;
        if (legend)
        {
            // Line charts here mostly fall from left to right; Q–Q style scatters rise. Put the legend where the data is not.
            if (spec.YLimits is not null) plot.ShowLegend(Edge.Right);
            else plot.ShowLegend(spec.Kind == ChartKind.Line ? Alignment.UpperRight : Alignment.UpperLeft);
            plot.Legend.FontName = ReportFonts.ChartFamilyAlias;
            plot.Legend.FontSize = TickSize;
        }
        else
        {
            plot.HideLegend();
        }
        return plot;
    }

    /// <summary>Tick labels: invariant digits, at most four decimals, typographic minus (as in the tables).</summary>
    internal static string TickLabel(double value)
    {
        if (Math.Abs(value) < 1e-12) value = 0; // avoid "−0" from floating-point tick positions
        return value.ToString("0.####", System.Globalization.CultureInfo.InvariantCulture)
            .Replace("-", Formatting.NumberFormat.Minus, StringComparison.Ordinal);
    }

    /// <summary>Label of a log-axis tick at 10^<paramref name="exponent"/>: 1, 0.1, 0.01, then 10⁻³, 10⁻⁴, … (and 10, 100, 10³ …).</summary>
    internal static string PowerOfTenLabel(double exponent)
    {
        int e = (int)Math.Round(exponent);
        if (e is >= -2 and <= 2) return TickLabel(Math.Pow(10, e));
        const string superscripts = "⁰¹²³⁴⁵⁶⁷⁸⁹";
        string digits = string.Concat(Math.Abs(e).ToString(System.Globalization.CultureInfo.InvariantCulture).Select(d => superscripts[d - '0']));
        return "10" + (e < 0 ? "⁻" : "") + digits;
    }

    private static void AddSeries(Plot plot, ChartKind kind, ChartSeries series, Color color)
    {
        var xs = new List<double>(series.X.Count);
        var ys = new List<double>(series.Y.Count);
        for (int k = 0; k < series.X.Count; k++)
        {
            if (double.IsFinite(series.X[k]) && double.IsFinite(series.Y[k]))
            {
                xs.Add(series.X[k]);
                ys.Add(series.Y[k]);
            }
        }
        var style = series.Style == SeriesStyle.Auto
            ? (kind == ChartKind.Line ? SeriesStyle.Line : SeriesStyle.Markers)
            : series.Style;

        var scatter = plot.Add.Scatter(xs.ToArray(), ys.ToArray(), color);
        scatter.LegendText = series.Name;
        scatter.LineWidth = style is SeriesStyle.Line or SeriesStyle.LineAndMarkers or SeriesStyle.Dashed ? 1.5f : 0f;
        scatter.LinePattern = style == SeriesStyle.Dashed ? LinePattern.Dashed : LinePattern.Solid;
        scatter.MarkerSize = style is SeriesStyle.Markers or SeriesStyle.LineAndMarkers ? 4.5f : 0f;
    }

    private static (double Lo, double Hi)? FiniteRange(ChartSpec spec)
    {
        double lo = double.PositiveInfinity, hi = double.NegativeInfinity;
        foreach (var s in spec.Series)
        {
            foreach (double v in s.X)
            {
                if (!double.IsFinite(v)) continue;
                lo = Math.Min(lo, v);
                hi = Math.Max(hi, v);
            }
        }
        return lo < hi ? (lo, hi) : null;
    }
}
