using ItemReduce.Core.ShortForm;

namespace ItemReduce.Core.SelfCheck;

/// <summary>A rate counted over simulated respondents or surveys, with its 95 % Wilson score interval
/// (<see cref="WilsonScoreInterval"/>; the Monte Carlo uncertainty of the rate for this design).</summary>
/// <param name="Events">Events counted (flags, recoveries, keeps).</param>
/// <param name="Trials">Respondents or surveys counted.</param>
public sealed record RateEstimate(long Events, long Trials)
{
    /// <summary>Events ÷ trials; NaN without trials.</summary>
    public double Rate => Trials == 0 ? double.NaN : Events / (double)Trials;

    /// <summary>95 % Wilson score interval.</summary>
    public (double Low, double High) Interval => WilsonScoreInterval.Compute(Events, Trials);
}

/// <summary>A quantity's distribution over the simulated surveys: median and 5th–95th percentiles (Hyndman &amp; Fan type
/// 7), from the finite values.</summary>
/// <param name="Values">The value of each simulated survey that produced one, in survey order.</param>
public sealed record Spread(IReadOnlyList<double> Values)
{
    private double[] Sorted => Values.Where(double.IsFinite).Order().ToArray();

    /// <summary>Surveys with a finite value.</summary>
    public int Count => Values.Count(double.IsFinite);

    /// <summary>Median; NaN without values.</summary>
    public double Median => Quantile(0.5);

    /// <summary>5th percentile.</summary>
    public double Low => Quantile(0.05);

    /// <summary>95th percentile.</summary>
    public double High => Quantile(0.95);

    private double Quantile(double q)
    {
        var s = Sorted;
        return s.Length == 0 ? double.NaN : Dimensions.ParallelAnalysis.Quantile(s, q);
    }
}

/// <summary>Recall of one planted careless kind.</summary>
/// <param name="Kind">"random", "straight-line" or "alternating".</param>
/// <param name="Recall">Planted respondents of the kind flagged, over all simulated surveys.</param>
public sealed record CarelessRecall(string Kind, RateEstimate Recall);

/// <summary>How often one item of this survey's short form was kept again.</summary>
/// <param name="Item">Item name.</param>
/// <param name="Scale">Its scale in this survey's short form.</param>
/// <param name="KeptAgain">Simulated surveys whose short form kept it (any scale).</param>
public sealed record ItemStability(string Item, string Scale, RateEstimate KeptAgain);

/// <summary>One short-form scale's reliability across the simulated surveys, on one sample.</summary>
/// <param name="Scale">Scale name.</param>
/// <param name="Sample">All analysed respondents (no holdout), the selection part or the holdout.</param>
/// <param name="Alpha">Cronbach's α of the short form.</param>
/// <param name="Omega">McDonald's ω of the short form.</param>
/// <param name="ShortFull">Overlap-corrected short–full correlation.</param>
/// <param name="ObservedAlpha">This survey's value, for comparison (NaN when absent).</param>
/// <param name="ObservedOmega">This survey's value.</param>
/// <param name="ObservedShortFull">This survey's value.</param>
public sealed record ScaleSpread(string Scale, SampleRole Sample, Spread Alpha, Spread Omega, Spread ShortFull,
    double ObservedAlpha, double ObservedOmega, double ObservedShortFull);

/// <summary>
/// Result of <see cref="DesignSelfCheck.Run"/>: how the tool's own decisions behave on surveys simulated from this
/// survey's fitted model. Properties of the procedure under that model, not evidence that the model is right.
/// </summary>
public sealed record SelfCheckResult
{
    /// <summary>Simulated surveys requested.</summary>
    public required int Requested { get; init; }

    /// <summary>Simulated surveys on which every stage ran (the others are counted in <see cref="Stopped"/>).</summary>
    public required int Completed { get; init; }

    /// <summary>Surveys on which a stage stopped, by reason (first sentence of the stop message).</summary>
    public required IReadOnlyDictionary<string, int> Stopped { get; init; }

    /// <summary>Respondents per simulated survey.</summary>
    public required int Respondents { get; init; }

    /// <summary>Items per simulated survey.</summary>
    public required int Items { get; init; }

    /// <summary>Respondents of each careless kind planted per simulated survey (0 when screening did not run).</summary>
    public required int PlantedEach { get; init; }

    /// <summary>Attentive simulated respondents flagged; null when screening did not run.</summary>
    public RateEstimate? FalseFlags { get; init; }

    /// <summary>Recall per planted kind (empty when screening did not run).</summary>
    public required IReadOnlyList<CarelessRecall> Recall { get; init; }

    /// <summary>Factors of the fitted solution used as the truth.</summary>
    public required int FittedFactors { get; init; }

    /// <summary>Surveys whose decision rule picked <see cref="FittedFactors"/>; null when the count was fixed by the user.</summary>
    public RateEstimate? DimensionRecovery { get; init; }

    /// <summary>How many surveys the rule picked each number of factors (ascending; empty when fixed).</summary>
    public required IReadOnlyList<KeyValuePair<int, int>> DimensionPicks { get; init; }

    /// <summary>Per kept item of this survey's short form, how often it was kept again (short-form order).</summary>
    public required IReadOnlyList<ItemStability> Stability { get; init; }

    /// <summary>Median over this short form's items of the share of simulated surveys keeping the item again; NaN when none.</summary>
    public double MedianKeptAgain => new Spread(Stability.Select(s => s.KeptAgain.Rate).ToArray()).Median;

    /// <summary>The kept item kept again least often (first in short-form order among ties), or null.</summary>
    public ItemStability? LeastStable => Stability.Where(s => double.IsFinite(s.KeptAgain.Rate)).MinBy(s => s.KeptAgain.Rate);

    /// <summary>Short-form reliability per scale: on all analysed respondents (or the selection part) and, with a holdout,
    /// on the holdout.</summary>
    public required IReadOnlyList<ScaleSpread> Scales { get; init; }

    /// <summary>Problems met (e.g. stopped surveys, loadings reduced to keep the model valid).</summary>
    public required IReadOnlyList<AnalysisWarning> Warnings { get; init; }
}
