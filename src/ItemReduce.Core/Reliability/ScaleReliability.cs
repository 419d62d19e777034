using ItemReduce.Core.Data;

namespace ItemReduce.Core.Reliability;

/// <summary>
/// Façade: reliability of a scale from (reverse-scored) responses — Cronbach's alpha with Feldt's interval,
/// standardized alpha, McDonald's omega total, corrected item–total correlations and alpha-if-deleted —
/// plus the overlap-corrected short/full correlation (<see cref="LevyOverlapCorrection"/>).
/// Missing data: respondents with any missing answer on the scale's items are left out (listwise within the
/// scale), so every statistic uses the same rows and n is well defined for the interval.
/// </summary>
internal static class ScaleReliability
{
    /// <summary>Reliability of all columns of <paramref name="items"/> taken as one scale.</summary>
    public static ReliabilityEstimate Compute(ResponseMatrix items, double confidence = 0.95)
    {
        ArgumentNullException.ThrowIfNull(items);
        var (cov, n) = ListwiseCovariance(items, Enumerable.Range(0, items.ItemCount).ToArray());
        return FromCovariance(cov, n, confidence);
    }

    /// <summary>
    /// Reliability of a scale from its listwise covariance matrix, for callers that computed it already (several
    /// scales from one read of the data). Gives the same values as <see cref="Compute"/> on the data the covariance
    /// came from.
    /// </summary>
    /// <param name="covariance">k × k sample covariance (n − 1) of the scale's items over the rows complete on them.</param>
    /// <param name="respondents">Number n of those rows, ≥ 0 (below 2 every statistic is NaN).</param>
    /// <param name="confidence">Coverage of the alpha interval, in (0, 1).</param>
    /// <exception cref="ArgumentException">A non-square or empty matrix, or n &lt; 0.</exception>
    public static ReliabilityEstimate FromCovariance(double[,] covariance, int respondents, double confidence = 0.95)
    {
        ValidateCovariance(covariance, respondents);
        var cov = covariance;
        int n = respondents, k = cov.GetLength(0);
        double alpha = n >= 2 ? CronbachAlpha.FromCovariance(cov) : double.NaN;
        var (lo, hi) = FeldtInterval.Compute(alpha, n, k, confidence);
        var corr = ToCorrelation(cov);
        bool usable = n >= 3 && Enumerable.Range(0, k).All(j => cov[j, j] > 0);
        double omega = double.NaN;
        double[] omegaLoadings = [];
        if (usable && k >= 3)
        {
            var (w, model) = McDonaldOmega.FromCorrelation(corr, n);
            omega = w;
            omegaLoadings = Enumerable.Range(0, k).Select(j => model!.Pattern[j, 0]).ToArray();
        }
        return new ReliabilityEstimate(k, n, alpha, lo, hi, confidence,
            usable ? CronbachAlpha.Standardized(corr) : double.NaN, omega, omegaLoadings,
            usable ? CorrectedItemTotalCorrelation.Compute(cov) : Enumerable.Repeat(double.NaN, k).ToArray(),
            usable ? CronbachAlpha.IfItemDeleted(cov) : Enumerable.Repeat(double.NaN, k).ToArray(), cov);
    }

    /// <summary>
    /// Observed and overlap-corrected correlation between the sum of <paramref name="shortItems"/> and the sum
    /// of all columns of <paramref name="fullItems"/> (short items are indices into those columns), listwise
    /// over the full scale's items.
    /// </summary>
    public static (double Observed, double Corrected) ShortFullCorrelation(ResponseMatrix fullItems, IReadOnlyList<int> shortItems)
    {
        ArgumentNullException.ThrowIfNull(fullItems);
        ArgumentNullException.ThrowIfNull(shortItems);
        var (cov, n) = ListwiseCovariance(fullItems, Enumerable.Range(0, fullItems.ItemCount).ToArray());
        return ShortFullCorrelation(cov, n, shortItems);
    }

    /// <summary>As <see cref="ShortFullCorrelation(ResponseMatrix, IReadOnlyList{int})"/> from the full scale's listwise
    /// covariance <paramref name="fullCovariance"/> (k × k, n − 1) over <paramref name="respondents"/> rows; NaN for n &lt; 3.</summary>
    /// <exception cref="ArgumentException">A non-square or empty matrix, or n &lt; 0.</exception>
    public static (double Observed, double Corrected) ShortFullCorrelation(double[,] fullCovariance, int respondents, IReadOnlyList<int> shortItems)
    {
        ValidateCovariance(fullCovariance, respondents);
        ArgumentNullException.ThrowIfNull(shortItems);
        var all = Enumerable.Range(0, fullCovariance.GetLength(0)).ToArray();
        return respondents >= 3 ? LevyOverlapCorrection.FromCovariance(fullCovariance, shortItems, all) : (double.NaN, double.NaN);
    }

    private static void ValidateCovariance(double[,] covariance, int respondents)
    {
        ArgumentNullException.ThrowIfNull(covariance);
        int k = covariance.GetLength(0);
        if (k == 0 || covariance.GetLength(1) != k)
            throw new ArgumentException($"Covariance is {k}×{covariance.GetLength(1)}; a square matrix with at least 1 row is needed.", nameof(covariance));
        if (respondents < 0) throw new ArgumentException($"respondents = {respondents}; must be ≥ 0.", nameof(respondents));
    }

    /// <summary>Sample covariance (n − 1) of the given columns over rows complete on them
    /// (<see cref="ListwiseCovarianceBatch"/> with one set).</summary>
    internal static (double[,] Covariance, int N) ListwiseCovariance(ResponseMatrix data, IReadOnlyList<int> columns)
    {
        var r = ListwiseCovarianceBatch.Compute(data, [columns])[0];
        return (r.Covariance, r.Respondents);
    }

    internal static double[,] ToCorrelation(double[,] cov)
    {
        int k = cov.GetLength(0);
        var r = new double[k, k];
        for (int a = 0; a < k; a++)
            for (int b = 0; b < k; b++)
                r[a, b] = a == b ? 1.0 : cov[a, b] / Math.Sqrt(cov[a, a] * cov[b, b]);
        return r;
    }
}
