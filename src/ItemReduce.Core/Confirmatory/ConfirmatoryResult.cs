namespace ItemReduce.Core.Confirmatory;

/// <summary>Estimator of a confirmatory fit.</summary>
public enum ConfirmatoryEstimator
{
    /// <summary>Normal-theory maximum likelihood on complete rows (all rows complete, or listwise deletion).</summary>
    MaximumLikelihood,
    /// <summary>Full-information (casewise) maximum likelihood with missing answers (Arbuckle 1996).</summary>
    FullInformation,
}

/// <summary>
/// Fit statistics of one confirmatory model (definitions in <see cref="ConfirmatoryFactorAnalysis"/>). NaN where a
/// statistic is undefined (df = 0, a zero denominator).
/// </summary>
/// <param name="Chi2">χ² = N·F_ML (complete data) or −2 ln L difference against the saturated model (casewise).</param>
/// <param name="Df">p(p+1)/2 − free covariance parameters.</param>
/// <param name="PValue">Upper tail of χ²(df).</param>
/// <param name="Cfi">Comparative fit index against the independence model.</param>
/// <param name="Tli">Tucker–Lewis index.</param>
/// <param name="Rmsea">√(max(χ² − df, 0)/(df·N)).</param>
/// <param name="RmseaLow">Lower 90% bound (noncentral χ²).</param>
/// <param name="RmseaHigh">Upper 90% bound.</param>
/// <param name="Srmr">Root mean square of the residual correlations over the lower triangle with the diagonal.</param>
/// <param name="ScaledChi2">χ² / c.</param>
/// <param name="ScalingFactor">c (Satorra–Bentler; Yuan–Bentler with missing answers).</param>
/// <param name="RobustCfi">CFI with χ² − c·df in place of χ² − df (and c₀ for the independence model).</param>
/// <param name="RobustTli">TLI likewise.</param>
/// <param name="RobustRmsea">√(max(χ² − c·df, 0)/(df·N)).</param>
/// <param name="IndependenceChi2">χ²₀ of the independence model.</param>
/// <param name="IndependenceDf">df₀ = p(p−1)/2.</param>
/// <param name="IndependenceScalingFactor">c₀.</param>
/// <param name="RobustRespondents">Respondents the scaling factors c and c₀ were computed from: all of them up to
/// <see cref="SatorraBentlerScaling.RowCap"/>, otherwise that many evenly spaced ones (0 when not computed).</param>
public sealed record ConfirmatoryFitStatistics(
    double Chi2, int Df, double PValue, double Cfi, double Tli, double Rmsea, double RmseaLow, double RmseaHigh, double Srmr,
    double ScaledChi2, double ScalingFactor, double RobustCfi, double RobustTli, double RobustRmsea,
    double IndependenceChi2, int IndependenceDf, double IndependenceScalingFactor, int RobustRespondents);

/// <summary>One estimated parameter: a loading (<see cref="Item"/> set) or a factor correlation (<see cref="Item"/> null,
/// <see cref="Factor"/> "A~B").</summary>
/// <param name="Item">Item name, or null for a factor correlation.</param>
/// <param name="Factor">Factor name, or "A~B" for a correlation.</param>
/// <param name="Estimate">Unstandardized estimate (loadings on the answer metric; correlations).</param>
/// <param name="StandardError">From the inverse expected information.</param>
/// <param name="Standardized">Loading / model-implied item SD; the correlation itself.</param>
public sealed record ConfirmatoryEstimate(string? Item, string Factor, double Estimate, double StandardError, double Standardized);

/// <summary>Result of <see cref="ConfirmatoryFactorAnalysis.Fit"/>.</summary>
public sealed record ConfirmatoryResult
{
    /// <summary>Item names in model order.</summary>
    public required IReadOnlyList<string> Items { get; init; }

    /// <summary>Factor names.</summary>
    public required IReadOnlyList<string> Factors { get; init; }

    /// <summary>0-based factor of each item.</summary>
    public required IReadOnlyList<int> ItemFactor { get; init; }

    /// <summary>Estimator used.</summary>
    public required ConfirmatoryEstimator Estimator { get; init; }

    /// <summary>True when the optimiser met its convergence criterion within the iteration cap.</summary>
    public required bool Converged { get; init; }

    /// <summary>Fisher-scoring iterations used.</summary>
    public required int Iterations { get; init; }

    /// <summary>Rows (of the data given) that entered the likelihood, ascending.</summary>
    public required IReadOnlyList<int> RespondentRows { get; init; }

    /// <summary>N = number of respondents that entered the likelihood.</summary>
    public int Respondents => RespondentRows.Count;

    /// <summary>Loadings then factor correlations.</summary>
    public required IReadOnlyList<ConfirmatoryEstimate> Estimates { get; init; }

    /// <summary>Unique variances ψ in item order.</summary>
    public required IReadOnlyList<double> UniqueVariances { get; init; }

    /// <summary>Composite reliability ω = (Σλ)² / ((Σλ)² + Σψ) per factor, from the unstandardized loadings.</summary>
    public required IReadOnlyList<double> CompositeReliability { get; init; }

    /// <summary>Fit statistics.</summary>
    public required ConfirmatoryFitStatistics Fit { get; init; }

    /// <summary>Non-convergence, Heywood cases and similar problems.</summary>
    public required IReadOnlyList<AnalysisWarning> Warnings { get; init; }
}
