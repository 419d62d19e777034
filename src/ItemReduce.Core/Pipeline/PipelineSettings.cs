using ItemReduce.Core.Dimensions;
using ItemReduce.Core.Screening;
using ItemReduce.Core.ShortForm;

namespace ItemReduce.Core.Pipeline;

/// <summary>Which stages to run.</summary>
public enum PipelineScope
{
    /// <summary>Respondent screening only.</summary>
    Screen,
    /// <summary>Dimensions only (no screening).</summary>
    Dimensions,
    /// <summary>Dimensions (unless the factor count is fixed), factoring, reliability and short form (no screening).</summary>
    Shorten,
    /// <summary>Screening, then dimensions, factoring, reliability and short form on the retained respondents.</summary>
    All,
}

/// <summary>Settings of every stage. <see cref="Seed"/> overrides the stage options' own seeds.</summary>
public sealed record PipelineSettings
{
    /// <summary>Seed for every random step; default 1.</summary>
    public ulong Seed { get; init; } = 1;

    /// <summary>Stages to run; default all.</summary>
    public PipelineScope Scope { get; init; } = PipelineScope.All;

    /// <summary>Screening options.</summary>
    public ScreeningOptions Screening { get; init; } = new();

    /// <summary>When true, flagged respondents stay in the later stages (default false: they are set aside).</summary>
    public bool KeepFlagged { get; init; }

    /// <summary>Dimension options (the fixed factor count, when set, also fixes the short form's factor count).</summary>
    public DimensionOptions Dimensions { get; init; } = new();

    /// <summary>Factoring, reliability and short-form options.</summary>
    public ShortFormOptions ShortForm { get; init; } = new();
}
