using ItemReduce.Core.Correlation;
using ItemReduce.Core.Factoring;

namespace ItemReduce.Core.ShortForm;

/// <summary>
/// Thresholds for the item judgements (<see cref="ItemReasonCodes"/>). Defaults are common rules of thumb
/// in scale development (common practice, no single source): primary loading .40, secondary loading .30 and a
/// primary–secondary gap of .20, communality .20, corrected item–total correlation .30.
/// </summary>
public sealed record ItemJudgementThresholds
{
    /// <summary>|primary pattern loading| below this → "weak-primary". Default 0.40; allowed [0, 1].</summary>
    public double MinPrimaryLoading { get; init; } = 0.40;

    /// <summary>|secondary loading| at or above this → "cross-loading". Default 0.30; allowed [0, 1].</summary>
    public double MaxSecondaryLoading { get; init; } = 0.30;

    /// <summary>|primary| − |secondary| below this → "cross-loading". Default 0.20; allowed [0, 1].</summary>
    public double MinLoadingGap { get; init; } = 0.20;

    /// <summary>Communality below this → "low-communality". Default 0.20; allowed [0, 1].</summary>
    public double MinCommunality { get; init; } = 0.20;

    /// <summary>Corrected item–total correlation below this → "weak-item-total". Default 0.30; allowed [−1, 1].</summary>
    public double MinItemTotalCorrelation { get; init; } = 0.30;

    /// <summary>Alpha-if-deleted exceeding the scale's alpha by more than this → "alpha-rises-without".
    /// Default 0.0; allowed [0, 1].</summary>
    public double AlphaRiseMargin { get; init; }
}

/// <summary>Options of <see cref="ShortFormBuilder.Build"/>. Immutable; defaults documented per property.</summary>
public sealed record ShortFormOptions
{
    /// <summary>Extraction/rotation settings. Default: minres + oblimin. <see cref="FactoringOptions.ItemSubscales"/>
    /// is filled in from the data's items by the builder.</summary>
    public FactoringOptions Factoring { get; init; } = new();

    /// <summary>Default of <see cref="ItemsPerFactor"/>.</summary>
    public const int DefaultItemsPerFactor = 4;

    /// <summary>Allowed range of <see cref="ItemsPerFactor"/> and of each <see cref="ScaleTargets"/> value.</summary>
    public const int MinItemsPerFactor = 2, MaxItemsPerFactor = 100;

    /// <summary>Largest allowed <see cref="HoldoutFraction"/>.</summary>
    public const double MaxHoldoutFraction = 0.9;

    /// <summary>Correlation coefficient and missing-data handling of the factor solutions (in a pipeline:
    /// <c>PipelineSettings.Correlation</c>, shared with the dimensions stage); default Pearson, pairwise.</summary>
    public CorrelationOptions Correlation { get; init; } = new();

    /// <summary>Items kept per scale when no per-scale target is given. Default <see cref="DefaultItemsPerFactor"/>;
    /// allowed <see cref="MinItemsPerFactor"/>..<see cref="MaxItemsPerFactor"/>.</summary>
    public int ItemsPerFactor { get; init; } = DefaultItemsPerFactor;

    /// <summary>Optional target length per scale name (overrides <see cref="ItemsPerFactor"/>); each
    /// <see cref="MinItemsPerFactor"/>..<see cref="MaxItemsPerFactor"/>.</summary>
    public IReadOnlyDictionary<string, int>? ScaleTargets { get; init; }

    /// <summary>Judgement thresholds.</summary>
    public ItemJudgementThresholds Thresholds { get; init; } = new();

    /// <summary>Keep the short form's share of reverse-keyed items close to the full scale's (see
    /// <see cref="ItemSelection"/>). Default true.</summary>
    public bool KeepReverseKeyedBalance { get; init; } = true;

    /// <summary>Share of respondents held out for evaluation; items are chosen on the rest. 0 = no holdout
    /// (default); allowed [0, 0.9]; both parts need at least 10 respondents.</summary>
    public double HoldoutFraction { get; init; }

    /// <summary>Seed of the holdout split. Default <see cref="Randomness.RandomStream.DefaultSeed"/> (in a pipeline:
    /// <c>PipelineSettings.Seed</c>).</summary>
    public ulong Seed { get; init; } = Randomness.RandomStream.DefaultSeed;

    /// <summary>Coverage of the alpha confidence intervals. Default 0.95; allowed (0, 1).</summary>
    public double Confidence { get; init; } = 0.95;
}
