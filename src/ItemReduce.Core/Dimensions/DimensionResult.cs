using ItemReduce.Core.Correlation;

namespace ItemReduce.Core.Dimensions;

/// <summary>Counts suggested by each rule.</summary>
/// <param name="Parallel">Parallel analysis on the full correlation matrix (components).</param>
/// <param name="ParallelReduced">Parallel analysis on the reduced (SMC-diagonal) matrix (factors), or null when not computed.</param>
/// <param name="Map">Velicer's MAP (squared partial correlations).</param>
/// <param name="MapRevised">Revised MAP with fourth powers (Velicer, Eaton &amp; Fava, 2000).</param>
/// <param name="Kaiser">Eigenvalues above 1 (for comparison only).</param>
/// <param name="EmpiricalKaiser">Empirical Kaiser criterion (Braeken &amp; van Assen, 2017).</param>
/// <param name="ComparisonData">Comparison data (Ruscio &amp; Roche, 2012), or null when not computed (fewer than 3 items).</param>
public sealed record RuleCounts(int Parallel, int? ParallelReduced, int Map, int MapRevised, int Kaiser, int EmpiricalKaiser, int? ComparisonData)
{
    /// <summary>Parallel analysis on the full matrix against the mean (not the percentile) of the reference.</summary>
    public int? ParallelMean { get; init; }

    /// <summary>Parallel analysis on the reduced matrix against the mean of the reference, or null.</summary>
    public int? ParallelReducedMean { get; init; }

    /// <summary>The Hull method (Lorenzo-Seva, Timmerman &amp; Kiers, 2011), or null when not computed (fewer than 3 items).</summary>
    public int? Hull { get; init; }

    /// <summary>The combined rule (<see cref="CombinedRetention"/>), or null when not computed (no reduced matrix or
    /// fewer than 3 items).</summary>
    public int? Combined { get; init; }
}

/// <summary>One row per component for tables and charts (scree plot with parallel-analysis reference).</summary>
/// <param name="Component">1-based component number.</param>
/// <param name="Observed">Observed eigenvalue (descending).</param>
/// <param name="ReferenceMean">Mean reference eigenvalue.</param>
/// <param name="ReferencePercentile">Reference eigenvalue at the requested percentile.</param>
/// <param name="Retained">True for the first <see cref="DimensionResult.Retained"/> components.</param>
/// <param name="EmpiricalKaiserReference">Reference eigenvalue of the empirical Kaiser criterion.</param>
/// <param name="ComparisonRmsr">Comparison data fit: mean RMSR of the eigenvalues of samples from a population with
/// exactly this many factors (row c = c factors), or null when that population was not tried.</param>
/// <param name="ComparisonPValue">One-sided Mann–Whitney p-value of "this many factors fit better than one fewer", or null.</param>
public sealed record ComponentRow(int Component, double Observed, double ReferenceMean, double ReferencePercentile, bool Retained,
    double EmpiricalKaiserReference, double? ComparisonRmsr, double? ComparisonPValue);

/// <summary>
/// Everything the dimensions stage found. Conventions: p = number of analysed items; eigenvalue arrays have
/// length p and are in descending order (component 1 first); reference arrays are aligned with them;
/// correlation matrices are p × p with unit diagonal in item order of the input.
/// </summary>
public sealed record DimensionResult
{
    /// <summary>Correlation coefficient used.</summary>
    public required CorrelationKind CorrelationKind { get; init; }

    /// <summary>Missing-data handling used for the correlations.</summary>
    public required MissingDataHandling MissingData { get; init; }

    /// <summary>The correlation matrix analysed (after smoothing, if any), p × p.</summary>
    public required double[,] CorrelationMatrix { get; init; }

    /// <summary>True when the computed matrix was not positive definite and was replaced by the nearest one.</summary>
    public bool SmoothingApplied => Smoothing.Adjusted;

    /// <summary>Details of the positive-definiteness check and any smoothing.</summary>
    public required NearestCorrelationResult Smoothing { get; init; }

    /// <summary>Respondents used: all rows, complete rows (listwise) or, with pairwise deletion and missing
    /// answers, the harmonic mean of the pairwise counts (rounded down). Used for the normal reference and Bartlett's test.</summary>
    public required int EffectiveRespondents { get; init; }

    /// <summary>Eigenvalues of the correlation matrix, descending (sum = p).</summary>
    public required double[] Eigenvalues { get; init; }

    /// <summary>Eigenvalue / p, descending.</summary>
    public double[] ProportionOfVariance => Eigenvalues.Select(l => l / Eigenvalues.Length).ToArray();

    /// <summary>Squared multiple correlations (reduced-matrix diagonal), or null when not requested.</summary>
    public double[]? SquaredMultipleCorrelations { get; init; }

    /// <summary>Eigenvalues of the reduced matrix (SMC diagonal), descending, or null.</summary>
    public double[]? ReducedEigenvalues { get; init; }

    /// <summary>Parallel-analysis reference (kind, replicates, percentile level and all arrays).</summary>
    public required ParallelAnalysisReference Reference { get; init; }

    /// <summary>Mean reference eigenvalues (length p).</summary>
    public double[] ReferenceMean => Reference.Mean;

    /// <summary>Reference eigenvalues at the requested percentile (length p).</summary>
    public double[] ReferencePercentile => Reference.Percentile;

    /// <summary>Reduced-matrix mean reference eigenvalues, or null.</summary>
    public double[]? ReducedReferenceMean => Reference.ReducedMean;

    /// <summary>Reduced-matrix percentile reference eigenvalues, or null.</summary>
    public double[]? ReducedReferencePercentile => Reference.ReducedPercentile;

    /// <summary>Counts suggested by each rule.</summary>
    public required RuleCounts ByRule { get; init; }

    /// <summary>Number of dimensions to carry forward (0..p).</summary>
    public required int Retained { get; init; }

    /// <summary>Rule that set <see cref="Retained"/>.</summary>
    public required FactorsRule RuleUsed { get; init; }

    /// <summary>One plain-language sentence explaining <see cref="Retained"/>.</summary>
    public required string Reason { get; init; }

    /// <summary>Overall Kaiser–Meyer–Olkin measure of sampling adequacy.</summary>
    public required double Kmo { get; init; }

    /// <summary>Per-item measure of sampling adequacy (length p, item order).</summary>
    public required double[] Msa { get; init; }

    /// <summary>Bartlett's test of sphericity.</summary>
    public required BartlettSphericityResult Bartlett { get; init; }

    /// <summary>Reference eigenvalues of the empirical Kaiser criterion (length p).</summary>
    public required double[] EmpiricalKaiserReferences { get; init; }

    /// <summary>Comparison-data fit curve and tests, or null when not computed (fewer than 3 items).</summary>
    public ComparisonDataResult? ComparisonData { get; init; }

    /// <summary>Hull-method fit curve and selection, or null when not computed (fewer than 3 items).</summary>
    public HullResult? Hull { get; init; }

    /// <summary>The combined rule's features, step probabilities and count, or null when not computed.</summary>
    public CombinedRetentionResult? Combined { get; init; }

    /// <summary>MAP curve (squared partials), index m = components removed, starting at 0.</summary>
    public required double[] MapCurve { get; init; }

    /// <summary>Revised MAP curve (fourth powers), same indexing.</summary>
    public required double[] MapRevisedCurve { get; init; }

    /// <summary>Cautions and notes for the report, in plain language.</summary>
    public required IReadOnlyList<AnalysisWarning> Warnings { get; init; }

    /// <summary>Per-component rows (for an eigenvalue table and a scree / parallel-analysis chart).</summary>
    public IReadOnlyList<ComponentRow> Components =>
        Eigenvalues.Select((l, c) => new ComponentRow(c + 1, l, ReferenceMean[c], ReferencePercentile[c], c < Retained,
            EmpiricalKaiserReferences[c],
            ComparisonData is { } cd && c < cd.MeanRmsr.Length ? cd.MeanRmsr[c] : null,
            ComparisonData is { } cp && c < cp.PValues.Length && c > 0 ? cp.PValues[c] : null)).ToList();
}
