namespace ItemReduce.Core.Dimensions;

/// <summary>
/// Eigenvalue-greater-than-one rule: Kaiser (1960), "The application of electronic computers to factor
/// analysis", Educational and Psychological Measurement 20(1), 141–151 (after Guttman, 1954). Reported for
/// reference only; simulation studies find it tends to retain too many components when there are many items
/// (Zwick &amp; Velicer, 1986, Psychological Bulletin 99(3), 432–442).
/// </summary>
internal static class KaiserCriterion
{
    /// <summary>Plain-language caution attached to every result that shows this count.</summary>
    public const string Caution =
        "The eigenvalue-above-1 count is shown for comparison only: with many items it usually suggests more dimensions than the data support.";

    /// <summary>Number of eigenvalues strictly greater than 1.</summary>
    public static int Count(IReadOnlyList<double> eigenvalues)
    {
        ArgumentNullException.ThrowIfNull(eigenvalues);
        return eigenvalues.Count(l => l > 1);
    }
}
