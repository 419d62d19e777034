namespace ItemReduce.Core.Factoring;

/// <summary>
/// Model fit of a maximum-likelihood solution. All values from the correlation matrix and n respondents.
/// </summary>
/// <param name="ChiSquare">Likelihood-ratio χ² with Bartlett's (1950) correction:
/// (n − 1 − (2p + 5)/6 − 2k/3) · F_min.</param>
/// <param name="Df">Degrees of freedom ((p − k)² − (p + k)) / 2 (common practice, no source). May be ≤ 0.</param>
/// <param name="P">Upper-tail χ² probability; NaN when Df ≤ 0.</param>
/// <param name="Rmsea">Root mean square error of approximation sqrt(max(χ² − df, 0) / (df (n − 1)))
/// (Steiger &amp; Lind, 1980); NaN when Df ≤ 0.</param>
/// <param name="Tli">Tucker–Lewis index ((χ²₀/df₀) − (χ²/df)) / ((χ²₀/df₀) − 1) against the independence
/// model (Tucker &amp; Lewis, 1973); NaN when Df ≤ 0 or the independence model fits perfectly.</param>
/// <param name="MinimumDiscrepancy">F_min, the minimised ML discrepancy ln|Σ̂| − ln|R| + tr(RΣ̂⁻¹) − p.</param>
public sealed record FactorModelFit(double ChiSquare, double Df, double P, double Rmsea, double Tli, double MinimumDiscrepancy);

/// <summary>
/// A fitted, rotated and aligned common-factor solution on the correlation metric.
/// Shapes: p items × k factors. Conventions: factor columns are ordered by <see cref="VarianceExplained"/>
/// (descending) and each column of <see cref="Pattern"/> is signed so that its sum is ≥ 0.
/// For orthogonal solutions Pattern = Structure and <see cref="FactorCorrelations"/> = I.
/// </summary>
public sealed record FactorSolution
{
    /// <summary>Pattern loadings (p × k): regression weights of items on factors.</summary>
    public required double[,] Pattern { get; init; }

    /// <summary>Structure loadings (p × k) = Pattern · Φ: item–factor correlations.</summary>
    public required double[,] Structure { get; init; }

    /// <summary>Factor correlation matrix Φ (k × k, unit diagonal).</summary>
    public required double[,] FactorCorrelations { get; init; }

    /// <summary>Unrotated loadings from the extraction (p × k), before sign/order alignment.</summary>
    public required double[,] Unrotated { get; init; }

    /// <summary>Communality h²ⱼ = diag(Pattern Φ Patternᵀ), length p (rotation-invariant).</summary>
    public required double[] Communalities { get; init; }

    /// <summary>Uniqueness ψⱼ = 1 − h²ⱼ, length p.</summary>
    public required double[] Uniquenesses { get; init; }

    /// <summary>Variance explained per factor, length k: Σⱼ Pattern[j,f] · Structure[j,f]. For orthogonal
    /// rotations this is the column sum of squared loadings; in general the values sum to Σ h² (our
    /// convention for oblique factors, which counts each factor's direct and shared contribution once).</summary>
    public required double[] VarianceExplained { get; init; }

    /// <summary>Column sums of squared pattern loadings, length k (the other common oblique summary).</summary>
    public required double[] SumSquaredPattern { get; init; }

    /// <summary>Extraction method used.</summary>
    public required FactorExtraction Extraction { get; init; }

    /// <summary>Rotation used (None when k = 1).</summary>
    public required FactorRotation Rotation { get; init; }

    /// <summary>True when both extraction and rotation met their tolerance within the iteration cap.</summary>
    public required bool Converged { get; init; }

    /// <summary>Iterations used by the extraction.</summary>
    public required int Iterations { get; init; }

    /// <summary>Iterations used by the rotation (0 when none).</summary>
    public required int RotationIterations { get; init; }

    /// <summary>Indices (0-based) of items with communality ≥ 1 − 1e-3 or uniqueness at the lower bound
    /// (Heywood cases).</summary>
    public required IReadOnlyList<int> HeywoodItems { get; init; }

    /// <summary>Maximum-likelihood fit statistics; null for other extraction methods.</summary>
    public FactorModelFit? Fit { get; init; }

    /// <summary>Factor labels (length k): a subscale name when one dominates the factor, else "F1".. (see
    /// <see cref="FactorAlignment"/>).</summary>
    public required IReadOnlyList<string> FactorLabels { get; init; }

    /// <summary>Home factor (0-based) of each declared subscale: the factor on which the subscale's items have
    /// the largest sum of squared pattern loadings. Empty when no subscales were given.</summary>
    public required IReadOnlyDictionary<string, int> SubscaleFactor { get; init; }

    /// <summary>Recoverable problems (non-convergence, Heywood cases, …) in plain words.</summary>
    public required IReadOnlyList<AnalysisWarning> Warnings { get; init; }

    /// <summary>Number of items p.</summary>
    public int ItemCount => Pattern.GetLength(0);

    /// <summary>Number of factors k.</summary>
    public int FactorCount => Pattern.GetLength(1);

    /// <summary>True for oblique rotations (oblimin, promax).</summary>
    public bool IsOblique => Rotation is FactorRotation.Oblimin or FactorRotation.Promax;
}
