using ItemReduce.Report.Charts;
using SkiaSharp;

namespace ItemReduce.Report.Layout;

/// <summary>One drawing instruction on a laid-out page (coordinates in points, origin top-left).</summary>
internal abstract record PageItem;

/// <summary>Text drawn with its left end at <see cref="X"/> on <see cref="Baseline"/>.</summary>
internal sealed record TextItem(float X, float Baseline, string Text, TextStyle Style) : PageItem;

/// <summary>Straight line.</summary>
internal sealed record RuleItem(float X1, float Y1, float X2, float Y2, float Thickness, SKColor Color) : PageItem;

/// <summary>Filled rectangle (drawn before text, e.g. highlighted table rows).</summary>
internal sealed record FillItem(SKRect Rect, SKColor Color) : PageItem;

/// <summary>Chart drawn inside <see cref="Rect"/>.</summary>
internal sealed record ChartItem(SKRect Rect, ChartSpec Spec) : PageItem;

/// <summary>Display list of one page, in drawing order.</summary>
internal sealed class LaidOutPage
{
    public List<PageItem> Items { get; } = [];

    public IEnumerable<TextItem> Texts => Items.OfType<TextItem>();
}
