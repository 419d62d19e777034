namespace ItemReduce.Core.Factoring;

/// <summary>How factors are extracted from the correlation matrix.</summary>
public enum FactorExtraction
{
    /// <summary>Minimum residual / unweighted least squares (Harman &amp; Jones, 1966). Default.</summary>
    MinimumResidual,
    /// <summary>Principal axis factoring with iterated communalities.</summary>
    PrincipalAxis,
    /// <summary>Maximum likelihood (Jöreskog, 1967; Lawley &amp; Maxwell, 1971).</summary>
    MaximumLikelihood,
}

/// <summary>How the extracted factors are rotated.</summary>
public enum FactorRotation
{
    /// <summary>No rotation: the extraction's principal-axes orientation.</summary>
    None,
    /// <summary>Varimax, orthogonal (Kaiser, 1958).</summary>
    Varimax,
    /// <summary>Direct oblimin by gradient projection (Jennrich, 2002); gamma = 0 is quartimin. Default.</summary>
    Oblimin,
    /// <summary>Promax, oblique (Hendrickson &amp; White, 1964).</summary>
    Promax,
}

/// <summary>
/// Options of <see cref="FactorAnalysis.Fit"/>. Immutable; every property has a documented default.
/// </summary>
public sealed record FactoringOptions
{
    /// <summary>Extraction method. Default <see cref="FactorExtraction.MinimumResidual"/>.</summary>
    public FactorExtraction Extraction { get; init; } = FactorExtraction.MinimumResidual;

    /// <summary>Rotation. Default <see cref="FactorRotation.Oblimin"/>.</summary>
    public FactorRotation Rotation { get; init; } = FactorRotation.Oblimin;

    /// <summary>Oblimin gamma; 0 = quartimin (default). Allowed range [−10, 1]; values near 1 give very oblique
    /// solutions and are rarely sensible.</summary>
    public double ObliminGamma { get; init; }

    /// <summary>Promax power (Hendrickson &amp; White's exponent). Default 4; allowed 2..10.</summary>
    public double PromaxPower { get; init; } = 4.0;

    /// <summary>Row (Kaiser) normalisation of the loadings before rotation, undone afterwards. Default true.</summary>
    public bool KaiserNormalization { get; init; } = true;

    /// <summary>Iteration cap for extraction and for rotation (each). Default 1000; allowed 10..100000.</summary>
    public int MaxIterations { get; init; } = 1000;

    /// <summary>Convergence tolerance (communality change for principal axis, gradient norm for the
    /// optimisers and for oblimin). Default 1e-6; allowed (0, 1e-2].</summary>
    public double Tolerance { get; init; } = 1e-6;

    /// <summary>Lower bound on uniquenesses (correlation metric) for minres and ML. An item whose uniqueness
    /// reaches it is reported as a Heywood case. Default 0.005; allowed (0, 0.1].</summary>
    public double UniquenessLowerBound { get; init; } = 0.005;

    /// <summary>
    /// Optional declared subscale of each item (length p, null entries allowed). Used only to label factors
    /// by their dominant subscale (see <see cref="FactorAlignment"/>); null = label F1..Fk.
    /// </summary>
    public IReadOnlyList<string?>? ItemSubscales { get; init; }

    /// <summary>Optional item names (length p), used only in warnings; null = 1-based item numbers.</summary>
    public IReadOnlyList<string>? ItemNames { get; init; }
}
