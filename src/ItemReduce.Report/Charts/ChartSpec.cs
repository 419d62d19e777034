namespace ItemReduce.Report.Charts;

/// <summary>Chart type; decides how series with <see cref="SeriesStyle.Auto"/> are drawn.</summary>
public enum ChartKind
{
    /// <summary>Series drawn as connected lines (e.g. eigenvalues against component number).</summary>
    Line,
    /// <summary>Series drawn as unconnected markers (e.g. a Q–Q plot).</summary>
    Scatter,
}

/// <summary>How one series is drawn.</summary>
public enum SeriesStyle
{
    /// <summary>Line for <see cref="ChartKind.Line"/>, markers for <see cref="ChartKind.Scatter"/>.</summary>
    Auto,
    Line,
    Markers,
    LineAndMarkers,
    /// <summary>Dashed line without markers (e.g. a reference curve).</summary>
    Dashed,
}

/// <summary>One data series: paired x and y values of equal length (non-finite pairs are skipped).</summary>
public sealed record ChartSeries(string Name, IReadOnlyList<double> X, IReadOnlyList<double> Y, SeriesStyle Style = SeriesStyle.Auto);

/// <summary>Vertical line at <paramref name="X"/> with a short label (e.g. "this survey: 34 items").</summary>
public sealed record VerticalMarker(double X, string Label);

/// <summary>
/// Chart description independent of the plotting library. Drawn with ScottPlot onto the PDF page,
/// so it stays vector graphics.
/// </summary>
/// <param name="Kind">Line or scatter chart.</param>
/// <param name="XLabel">Horizontal axis label.</param>
/// <param name="YLabel">Vertical axis label.</param>
/// <param name="Series">Series in legend order (at least one).</param>
public sealed record ChartSpec(ChartKind Kind, string XLabel, string YLabel, IReadOnlyList<ChartSeries> Series)
{
    /// <summary>Optional vertical marker line with label.</summary>
    public VerticalMarker? Marker { get; init; }

    /// <summary>Draw the diagonal reference line y = x across the x range of the data (for Q–Q plots), so the axes
    /// fit the points rather than the line.</summary>
    public bool IdentityLine { get; init; }

    /// <summary>Vertical axis on a logarithmic (base 10) scale; values ≤ 0 are not drawn.</summary>
    public bool LogY { get; init; }

    /// <summary>Fixed vertical axis range (e.g. 0 to 1 for shares), or null for automatic; the legend then goes to the
    /// right of the plot so it never covers data.</summary>
    public (double Low, double High)? YLimits { get; init; }

    /// <summary>Height of the chart as a fraction of its width (default 0.6; allowed 0.2–1.5).</summary>
    public double AspectRatio { get; init; } = 0.6;

    /// <summary>Throws <see cref="ArgumentException"/> if the specification cannot be drawn.</summary>
    public void Validate()
    {
        if (Series.Count == 0)
            throw new ArgumentException("A chart needs at least one series.", nameof(Series));
        foreach (var s in Series)
        {
            if (s.X.Count != s.Y.Count)
                throw new ArgumentException(
                    $"Series '{s.Name}' has {s.X.Count} x values and {s.Y.Count} y values; they must be paired.",
                    nameof(Series));
        }
        if (YLimits is { } y && !(y.Low < y.High && double.IsFinite(y.Low) && double.IsFinite(y.High)))
            throw new ArgumentException($"YLimits ({y.Low}, {y.High}) must be finite with Low < High.", nameof(YLimits));
        if (!(AspectRatio >= 0.2 && AspectRatio <= 1.5))
            throw new ArgumentException($"AspectRatio {AspectRatio} is outside the allowed range 0.2–1.5.", nameof(AspectRatio));
    }
}
