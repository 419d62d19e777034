using ItemReduce.Core.Screening;
using ItemReduce.Report.Charts;

namespace ItemReduce.Tests.Report;

public class ChartAxesTests
{
    [Fact]
    public void Qq_plot_axes_fit_the_points_when_distances_are_far_above_the_quantiles()
    {
        // Quantiles 0–10, distances up to 100: the y = x line spans the x range only, so x runs to about 10, not 100.
        var x = Enumerable.Range(0, 11).Select(i => (double)i).ToList();
        var y = x.Select(v => v * v).ToList();
        var spec = new ChartSpec(ChartKind.Scatter, "q", "d", [new ChartSeries("r", x, y, SeriesStyle.Markers)]) { IdentityLine = true };
        using var plot = ChartPainter.Build(spec);
        plot.Axes.AutoScale();
        var limits = plot.Axes.GetLimits();
        Assert.InRange(limits.Right, 10, 12);
        Assert.True(limits.Top >= 100);
    }

    [Fact]
    public void Log_axis_draws_log10_of_the_values_and_labels_powers_of_ten()
    {
        var spec = new ChartSpec(ChartKind.Line, "k", "share", [new ChartSeries("s", [1, 2, 3], [0.5, 1e-3, 1e-8])]) { LogY = true };
        using var plot = ChartPainter.Build(spec);
        plot.Axes.AutoScale();
        var limits = plot.Axes.GetLimits();
        Assert.InRange(limits.Bottom, -9, -8);   // log10(1e-8) = -8, with a small margin
        Assert.InRange(limits.Top, Math.Log10(0.5), 0.5);
        Assert.Equal("0.01", ChartPainter.PowerOfTenLabel(-2));
        Assert.Equal("10⁻⁶", ChartPainter.PowerOfTenLabel(-6));
        Assert.Equal("10¹²", ChartPainter.PowerOfTenLabel(12));
    }

    [Fact]
    public void Fixed_y_limits_hold_for_shares_that_are_all_one_and_bad_limits_are_refused()
    {
        // Shares of simulated surveys lie in [0, 1]; with every share 1 the automatic range would centre on 1.
        var spec = new ChartSpec(ChartKind.Scatter, "item", "share", [new ChartSeries("a", [1, 2], [1, 1], SeriesStyle.Markers),
            new ChartSeries("b", [3], [1], SeriesStyle.Markers)])
        { YLimits = (0, 1.05) };
        using var plot = ChartPainter.Build(spec);
        var limits = plot.Axes.GetLimits();
        Assert.Equal(0, limits.Bottom, 1e-12);
        Assert.Equal(1.05, limits.Top, 1e-12);
        Assert.Throws<ArgumentException>((spec with { YLimits = (1, 0) }).Validate);
    }

    [Fact]
    public void Upper_tail_probability_is_never_above_one()
    {
        // A respondent of the sample survey with D² = 0.825957 on 34 items printed p = 1.0000000000000002; a probability
        // cannot exceed 1 (definition). scipy.stats.chi2.sf(0.825957, 34) gives 1.0 (scipy 1.10.1, Debian python3).
        Assert.True(ChiSquareTail.UpperTail(0.825957, 34) <= 1);
        for (int k = 1; k <= 60; k++)
            for (double xv = 1e-6; xv < 2; xv *= 1.7)
                Assert.True(ChiSquareTail.UpperTail(xv, k) <= 1, $"k={k}, x={xv}");
    }
}
