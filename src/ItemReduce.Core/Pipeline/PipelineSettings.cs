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

/// <summary>
/// Settings of every stage. Settings that several stages share are held here once — <see cref="Seed"/> and
/// <see cref="Correlation"/> — and handed to each stage by <see cref="StageOptions"/>, which replaces the stage
/// records' own values; the pipeline runs every stage with exactly what <see cref="StageOptions"/> returns.
/// </summary>
public sealed record PipelineSettings
{
    /// <summary>Seed for every random step; default <see cref="Randomness.RandomStream.DefaultSeed"/>.</summary>
    public ulong Seed { get; init; } = Randomness.RandomStream.DefaultSeed;

    /// <summary>Correlation coefficient and missing-data handling of every correlation-based stage (dimensions,
    /// factoring, item judgements, short form); default Pearson, pairwise.</summary>
    public Correlation.CorrelationOptions Correlation { get; init; } = new();

    /// <summary>Stages to run; default all.</summary>
    public PipelineScope Scope { get; init; } = PipelineScope.All;

    /// <summary>Screening options.</summary>
    public ScreeningOptions Screening { get; init; } = new();

    /// <summary>When true, flagged respondents stay in the later stages (default false: they are set aside).</summary>
    public bool KeepFlagged { get; init; }

    /// <summary>When true, the short and full forms are fitted as confirmatory factor models after the short form is built
    /// (default true; README "Speed" gives its cost).</summary>
    public bool Confirmatory { get; init; } = true;

    /// <summary>The design-matched self-check after a full run (<see cref="SelfCheck.DesignSelfCheck"/>); on by default,
    /// off with 0 simulated surveys.</summary>
    public SelfCheck.SelfCheckOptions SelfCheck { get; init; } = new();

    /// <summary>Dimension options (the fixed factor count, when set, also fixes the short form's factor count).</summary>
    public DimensionOptions Dimensions { get; init; } = new();

    /// <summary>Factoring, reliability and short-form options.</summary>
    public ShortFormOptions ShortForm { get; init; } = new();

    /// <summary>The option records each stage receives: the stage records with the shared settings filled in.</summary>
    public StageOptionSet StageOptions() => new(
        Screening,
        Dimensions with { Seed = Seed, Correlation = Correlation },
        ShortForm with { Seed = Seed, Correlation = Correlation },
        KeepFlagged,
        Confirmatory);
}

/// <summary>What each stage receives (see <see cref="PipelineSettings.StageOptions"/>).</summary>
/// <param name="Screening">Options of the screening stage.</param>
/// <param name="Dimensions">Options of the dimensions stage.</param>
/// <param name="ShortForm">Options of factoring, item judgements, reliability and the short form.</param>
/// <param name="KeepFlagged">Whether flagged respondents stay in the later stages.</param>
/// <param name="Confirmatory">Whether the confirmatory check runs after the short form.</param>
public sealed record StageOptionSet(ScreeningOptions Screening, DimensionOptions Dimensions, ShortFormOptions ShortForm, bool KeepFlagged,
    bool Confirmatory);
