using ItemReduce.Core.Correlation;
using ItemReduce.Core.Factoring;
using ItemReduce.Core.Reliability;

namespace ItemReduce.Core.ShortForm;

/// <summary>Which item set a reliability row describes.</summary>
public enum ScaleForm
{
    /// <summary>All items of the scale.</summary>
    Full,
    /// <summary>The selected items.</summary>
    Short,
}

/// <summary>Which respondents a reliability row was computed on.</summary>
public enum SampleRole
{
    /// <summary>All respondents (no holdout).</summary>
    All,
    /// <summary>The respondents the items were chosen on (holdout mode).</summary>
    Selection,
    /// <summary>The held-out respondents, not used for choosing items.</summary>
    Holdout,
}

/// <summary>Reliability of one scale in one form on one sample.</summary>
/// <param name="Scale">Scale name.</param>
/// <param name="Form">Full or short.</param>
/// <param name="Sample">Respondents used.</param>
/// <param name="FormLabel">Compact label: "full", "short", "full-holdout", "short-holdout".</param>
/// <param name="Items">Number of items.</param>
/// <param name="Respondents">Respondents complete on the items (listwise within the scale).</param>
/// <param name="Alpha">Raw Cronbach's alpha.</param>
/// <param name="AlphaCiLow">Feldt lower bound.</param>
/// <param name="AlphaCiHigh">Feldt upper bound.</param>
/// <param name="StandardizedAlpha">Standardized alpha.</param>
/// <param name="Omega">Omega total (one-factor minres, correlation metric); NaN for &lt; 3 items.</param>
/// <param name="ShortFullCorrelation">Short rows: overlap-corrected short/full correlation
/// (<see cref="Reliability.LevyOverlapCorrection"/>); NaN for full rows.</param>
/// <param name="ShortFullCorrelationObserved">Short rows: uncorrected short/full correlation; NaN for full rows.</param>
public sealed record ReliabilityRow(
    string Scale, ScaleForm Form, SampleRole Sample, string FormLabel, int Items, int Respondents, double Alpha, double AlphaCiLow,
    double AlphaCiHigh, double StandardizedAlpha, double Omega, double ShortFullCorrelation, double ShortFullCorrelationObserved);

/// <summary>One scale of the short form.</summary>
/// <param name="Scale">Scale name (declared subscale or factor label).</param>
/// <param name="HomeFactor">0-based factor of the full solution the scale is scored on.</param>
/// <param name="Target">Requested length.</param>
/// <param name="FullItems">Item names of the full scale, in data order.</param>
/// <param name="SelectedItems">Chosen item names, in order of choice (strongest first).</param>
public sealed record ShortFormScale(string Scale, int HomeFactor, int Target, IReadOnlyList<string> FullItems, IReadOnlyList<string> SelectedItems);

/// <summary>The correlation matrix the factor solutions were fitted to.</summary>
/// <param name="Kind">Coefficient.</param>
/// <param name="MissingData">Missing-data handling.</param>
/// <param name="Matrix">p × p in the data's item order, unit diagonal, after any smoothing.</param>
/// <param name="Respondents">n given to the factoring: all rows, the complete rows (listwise) or the harmonic mean of the
/// pairwise counts (see <see cref="CorrelationOptions.EffectiveRespondents"/>).</param>
/// <param name="SampleRespondents">Respondents of the sample correlated (the selection part with a holdout).</param>
public sealed record CorrelationUsed(CorrelationKind Kind, MissingDataHandling MissingData, double[,] Matrix, int Respondents, int SampleRespondents);

/// <summary>
/// Result of <see cref="ShortFormBuilder.Build"/>. All loadings refer to the data the items were chosen on
/// (the selection part when a holdout is used).
/// </summary>
public sealed record ShortFormResult
{
    /// <summary>Factor solution of all items (p × k).</summary>
    public required FactorSolution FullSolution { get; init; }

    /// <summary>The correlation matrix <see cref="FullSolution"/> and <see cref="ShortSolution"/> were fitted to.</summary>
    public required CorrelationUsed Correlation { get; init; }

    /// <summary>One judgement per item, in data order.</summary>
    public required IReadOnlyList<ItemJudgement> Judgements { get; init; }

    /// <summary>Scales with their chosen items, in order of first appearance.</summary>
    public required IReadOnlyList<ShortFormScale> Scales { get; init; }

    /// <summary>Column indices (into the data given) of the short form's items, in data order.</summary>
    public required IReadOnlyList<int> SelectedIndices { get; init; }

    /// <summary>Factor solution refitted on the short form's items (same k); null when it could not be fitted
    /// (see <see cref="Warnings"/>).</summary>
    public FactorSolution? ShortSolution { get; init; }

    /// <summary>Omega hierarchical of all items from a Schmid–Leiman orthogonalisation of <see cref="FullSolution"/>
    /// (<see cref="ItemReduce.Core.Reliability.OmegaHierarchical"/>); null unless the solution has three or more oblique factors.</summary>
    public OmegaHierarchicalResult? OmegaHierarchical { get; init; }

    /// <summary>Reliability rows: per scale, full and short form on the selection sample (or all respondents),
    /// then — with a holdout — full and short form on the held-out respondents.</summary>
    public required IReadOnlyList<ReliabilityRow> Reliability { get; init; }

    /// <summary>Respondents used to choose items.</summary>
    public required int SelectionRespondents { get; init; }

    /// <summary>Respondents held out (0 without holdout).</summary>
    public required int HoldoutRespondents { get; init; }

    /// <summary>Row indices of the held-out respondents (ascending); empty without holdout.</summary>
    public required IReadOnlyList<int> HoldoutRows { get; init; }

    /// <summary>Problems and cautions in plain words; always includes <see cref="ShortFormBuilder.ValidationCaution"/>.</summary>
    public required IReadOnlyList<AnalysisWarning> Warnings { get; init; }
}
