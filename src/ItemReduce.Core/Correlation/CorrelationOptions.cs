using ItemReduce.Core.Data;

namespace ItemReduce.Core.Correlation;

/// <summary>Which correlation coefficient the correlation-based stages use.</summary>
public enum CorrelationKind
{
    /// <summary>Pearson product-moment correlations (default).</summary>
    Pearson,
    /// <summary>Polychoric correlations for ordinal items (Olsson, 1979, two-step ML).</summary>
    Polychoric,
}

/// <summary>
/// How every correlation-based stage (dimensions, factoring, item judgements, short form) correlates the items: one
/// record, given once in <c>PipelineSettings.Correlation</c> and handed to each stage, so the stages cannot disagree.
/// Reliability coefficients of sum scores stay on the observed scores' covariance metric (see
/// <see cref="Reliability.ScaleReliability"/>).
/// </summary>
public sealed record CorrelationOptions
{
    /// <summary>Correlation coefficient; default <see cref="CorrelationKind.Pearson"/>.</summary>
    public CorrelationKind Kind { get; init; } = CorrelationKind.Pearson;

    /// <summary>Missing-answer handling; default <see cref="MissingDataHandling.Pairwise"/>.</summary>
    public MissingDataHandling MissingData { get; init; } = MissingDataHandling.Pairwise;

    /// <summary>Raw (unsmoothed) correlation matrix of the columns of <paramref name="data"/>, p × p.</summary>
    /// <param name="data">Responses, NaN = missing.</param>
    /// <param name="maxDegreeOfParallelism">Thread cap (−1 = all cores); results do not depend on it.</param>
    public double[,] Compute(ResponseMatrix data, int maxDegreeOfParallelism = -1) => Kind switch
    {
        CorrelationKind.Polychoric => PolychoricCorrelation.Compute(data, MissingData, maxDegreeOfParallelism),
        _ => PearsonCorrelation.Compute(data, MissingData, maxDegreeOfParallelism),
    };

    /// <summary>Respondents behind the matrix: all rows without missing answers; the complete rows (listwise); or, with
    /// pairwise deletion and missing answers, the harmonic mean of the pairwise counts rounded down (our choice, common
    /// practice, no source: pairs with fewer joint answers weigh more). Used as n wherever a stage needs one.</summary>
    public int EffectiveRespondents(ResponseMatrix data)
    {
        ArgumentNullException.ThrowIfNull(data);
        if (!data.HasMissing()) return data.RespondentCount;
        if (MissingData == MissingDataHandling.Listwise) return PearsonCorrelation.CompleteRows(data).Length;
        var counts = PearsonCorrelation.PairwiseCounts(data);
        int p = data.ItemCount;
        double inv = 0;
        int pairs = 0;
        for (int j = 0; j < p; j++)
            for (int k = 0; k < j; k++) { inv += 1.0 / Math.Max(counts[j, k], 1); pairs++; }
        return pairs == 0 ? data.RespondentCount : (int)Math.Floor(pairs / inv);
    }

    /// <summary>Name in plain words ("Pearson", "polychoric").</summary>
    public string KindName => Kind == CorrelationKind.Polychoric ? "polychoric" : "Pearson";
}
