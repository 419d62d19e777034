using ItemReduce.Core.Data;
using ItemReduce.Core.Dimensions;
using ItemReduce.Core.Screening;
using ItemReduce.Core.ShortForm;

namespace ItemReduce.Core.Pipeline;

/// <summary>Everything the stages produced. Stages that did not run are null.</summary>
public sealed record PipelineResult
{
    /// <summary>The prepared data (reverse-scored, usable items).</summary>
    public required PreparedData Prepared { get; init; }

    /// <summary>Settings used.</summary>
    public required PipelineSettings Settings { get; init; }

    /// <summary>Screening of all respondents, when run.</summary>
    public ScreeningResult? Screening { get; init; }

    /// <summary>Respondents analysed by the later stages (after setting aside flagged ones unless kept).</summary>
    public required ResponseMatrix Analysed { get; init; }

    /// <summary>Items dropped after screening because they became unusable among the retained respondents.</summary>
    public IReadOnlyList<ExcludedItem> ExcludedAfterScreening { get; init; } = [];

    /// <summary>Dimension analysis, when run.</summary>
    public DimensionResult? Dimensions { get; init; }

    /// <summary>Number of factors used for factoring (≥ 1), when factoring ran.</summary>
    public int? FactorsUsed { get; init; }

    /// <summary>Factoring, reliability and short form, when run.</summary>
    public ShortFormResult? ShortForm { get; init; }

    /// <summary>Confirmatory factor analysis of the full and short forms, when the short form was built and the check could run.</summary>
    public Confirmatory.ConfirmatoryCheckResult? Confirmatory { get; init; }

    /// <summary>The design-matched self-check, when it ran (full runs with a short form and at least one simulated survey).</summary>
    public SelfCheck.SelfCheckResult? SelfCheck { get; init; }

    /// <summary>Pipeline-level warnings (stage warnings stay in their results).</summary>
    public required IReadOnlyList<AnalysisWarning> Warnings { get; init; }
}
