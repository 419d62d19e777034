using ItemReduce.Core.Correlation;

namespace ItemReduce.Core.Dimensions;

/// <summary>Rule that decides how many dimensions to retain.</summary>
public enum FactorsRule
{
    /// <summary>Parallel analysis on the full correlation matrix (principal components), 95th-percentile reference.</summary>
    Parallel,
    /// <summary>Parallel analysis on the reduced (SMC-diagonal) matrix (common factors), 95th-percentile reference;
    /// default, chosen by the project's simulation study (<see cref="RetentionStudyAccuracy"/>). Needs
    /// <see cref="DimensionOptions.IncludeReducedMatrix"/>.</summary>
    ParallelReduced,
    /// <summary>Velicer's minimum average partial test (squared partials).</summary>
    Map,
    /// <summary>Eigenvalue above 1 (Kaiser, 1960); not recommended, available for comparison.</summary>
    Kaiser,
    /// <summary>Comparison data (Ruscio &amp; Roche, 2012), see <see cref="Dimensions.ComparisonData"/>.</summary>
    ComparisonData,
    /// <summary>Empirical Kaiser criterion (Braeken &amp; van Assen, 2017), see <see cref="EmpiricalKaiserCriterion"/>.</summary>
    EmpiricalKaiser,
    /// <summary>The Hull method (Lorenzo-Seva, Timmerman &amp; Kiers, 2011), see <see cref="HullMethod"/>.</summary>
    Hull,
    /// <summary>Combined rule (<see cref="CombinedRetention"/>): a fitted model corrects the reduced-matrix
    /// parallel-analysis count using the other rules and eigenvalue margins. Needs <see cref="DimensionOptions.IncludeReducedMatrix"/>.</summary>
    Combined,
    /// <summary>Result only: the count was fixed by <see cref="DimensionOptions.FixedFactors"/>. Not a valid option value.</summary>
    Fixed,
}

/// <summary>Settings of <see cref="DimensionAnalysis.Run"/>; every property maps to one command-line option.</summary>
public sealed record DimensionOptions
{
    /// <summary>Correlation coefficient and missing-data handling (in a pipeline: <c>PipelineSettings.Correlation</c>,
    /// shared with the short form); default Pearson, pairwise.</summary>
    public CorrelationOptions Correlation { get; init; } = new();

    /// <summary>Parallel-analysis replicates; default and range as <see cref="ParallelAnalysisOptions.Replicates"/>.</summary>
    public int Replicates { get; init; } = ParallelAnalysisOptions.DefaultReplicates;

    /// <summary>Reference percentile; default and range as <see cref="ParallelAnalysisOptions.Percentile"/>.</summary>
    public double Percentile { get; init; } = ParallelAnalysisOptions.DefaultPercentile;

    /// <summary>Parallel-analysis reference; default <see cref="ReferenceKind.Normal"/>.</summary>
    public ReferenceKind Reference { get; init; } = ReferenceKind.Normal;

    /// <summary>Seed of every random step; default <see cref="Randomness.RandomStream.DefaultSeed"/> (in a pipeline:
    /// <c>PipelineSettings.Seed</c>).</summary>
    public ulong Seed { get; init; } = Randomness.RandomStream.DefaultSeed;

    /// <summary>Rule that sets <see cref="DimensionResult.Retained"/>; default <see cref="FactorsRule.ParallelReduced"/>.
    /// <see cref="FactorsRule.Fixed"/> is not allowed here (use <see cref="FixedFactors"/>).</summary>
    public FactorsRule FactorsRule { get; init; } = FactorsRule.ParallelReduced;

    /// <summary>When set, retain exactly this many dimensions (1..p) whatever the rules say; default null.</summary>
    public int? FixedFactors { get; init; }

    /// <summary>Also analyse the reduced matrix (SMC diagonal); default true.</summary>
    public bool IncludeReducedMatrix { get; init; } = true;

    /// <summary>Smallest eigenvalue accepted before the matrix is smoothed; default 1e-6, range (0, 0.5].</summary>
    public double EigenvalueFloor { get; init; } = NearestCorrelationMatrix.DefaultEigenvalueFloor;

    /// <summary>Thread cap (−1 = all cores); results do not depend on it.</summary>
    public int MaxDegreeOfParallelism { get; init; } = -1;
}
