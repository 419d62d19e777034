using ItemReduce.Core.Correlation;

namespace ItemReduce.Core.Dimensions;

/// <summary>Rule that decides how many dimensions to retain.</summary>
public enum RetentionRule
{
    /// <summary>Parallel analysis on the full correlation matrix (default).</summary>
    Parallel,
    /// <summary>Velicer's minimum average partial test (squared partials).</summary>
    Map,
    /// <summary>Eigenvalue above 1 (Kaiser, 1960); not recommended, available for comparison.</summary>
    Kaiser,
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

    /// <summary>Rule that sets <see cref="DimensionResult.Retained"/>; default <see cref="RetentionRule.Parallel"/>.
    /// <see cref="RetentionRule.Fixed"/> is not allowed here (use <see cref="FixedFactors"/>).</summary>
    public RetentionRule FactorsRule { get; init; } = RetentionRule.Parallel;

    /// <summary>When set, retain exactly this many dimensions (1..p) whatever the rules say; default null.</summary>
    public int? FixedFactors { get; init; }

    /// <summary>Also analyse the reduced matrix (SMC diagonal); default true.</summary>
    public bool IncludeReducedMatrix { get; init; } = true;

    /// <summary>Smallest eigenvalue accepted before the matrix is smoothed; default 1e-6, range (0, 0.5].</summary>
    public double EigenvalueFloor { get; init; } = NearestCorrelationMatrix.DefaultEigenvalueFloor;

    /// <summary>Thread cap (−1 = all cores); results do not depend on it.</summary>
    public int MaxDegreeOfParallelism { get; init; } = -1;
}
