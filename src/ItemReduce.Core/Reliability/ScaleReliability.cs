using ItemReduce.Core.Correlation;
using ItemReduce.Core.Data;

namespace ItemReduce.Core.Reliability;

/// <summary>
/// Façade: reliability of a scale from (reverse-scored) responses — Cronbach's alpha with Feldt's interval,
/// standardized alpha, McDonald's omega total, corrected item–total correlations and alpha-if-deleted —
/// plus the overlap-corrected short/full correlation (<see cref="LevyOverlapCorrection"/>).
/// Missing data: respondents with any missing answer on the scale's items are left out (listwise within the
/// scale), so every statistic uses the same rows and n is well defined for the interval.
/// </summary>
public static class ScaleReliability
{
    /// <summary>Reliability of all columns of <paramref name="items"/> taken as one scale.</summary>
    public static ReliabilityEstimate Compute(ResponseMatrix items, double confidence = 0.95)
    {
        ArgumentNullException.ThrowIfNull(items);
        var (cov, n) = ListwiseCovariance(items, Enumerable.Range(0, items.ItemCount).ToArray());
        int k = items.ItemCount;
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
        var all = Enumerable.Range(0, fullItems.ItemCount).ToArray();
        var (cov, n) = ListwiseCovariance(fullItems, all);
        return n >= 3 ? LevyOverlapCorrection.FromCovariance(cov, shortItems, all) : (double.NaN, double.NaN);
    }

    /// <summary>Sample covariance (n − 1, two-pass) of the given columns over rows complete on them.</summary>
    internal static (double[,] Covariance, int N) ListwiseCovariance(ResponseMatrix data, IReadOnlyList<int> columns)
    {
        if (columns.Count == data.ItemCount && columns.Select((c, i) => c == i).All(b => b) && PairwiseSums.Applies(data))
            return ExactListwiseCovariance(data);
        int k = columns.Count, p = data.ItemCount;
        var cols = columns.ToArray();
        // Rows are decoded in blocks and visited in order, so the sums run in the same order as a row loop.
        const int blockRows = 1024;
        int n = 0;
        var mean = new double[k];
        data.ForEachBlock(blockRows, (v, rows) =>
        {
            for (int o = 0; o < rows * p; o += p)
            {
                if (!CompleteOn(v, o, cols)) continue;
                n++;
                for (int a = 0; a < k; a++) mean[a] += v[o + cols[a]];
            }
        });
        for (int a = 0; a < k; a++) mean[a] = n > 0 ? mean[a] / n : double.NaN;
        var cov = new double[k, k];
        var d = new double[k];
        data.ForEachBlock(blockRows, (v, rows) =>
        {
            for (int o = 0; o < rows * p; o += p)
            {
                if (!CompleteOn(v, o, cols)) continue;
                for (int a = 0; a < k; a++) d[a] = v[o + cols[a]] - mean[a];
                for (int a = 0; a < k; a++)
                    for (int b = 0; b <= a; b++) cov[a, b] += d[a] * d[b];
            }
        });
        for (int a = 0; a < k; a++)
            for (int b = 0; b <= a; b++)
                cov[a, b] = cov[b, a] = n > 1 ? cov[a, b] / (n - 1) : double.NaN;
        return (cov, n);
    }

    /// <summary>
    /// The same covariance for compact integer-valued data from exact sums over the complete rows: with Z = [X | 1] on
    /// complete rows (zero rows elsewhere), Zᵀ Z holds n, Σx and Σxy as exact integers (accumulated in parallel by the
    /// tiled kernel); <c>n·C_ab = n·Σx_a x_b − Σx_a Σx_b</c> is formed in 128-bit integers and rounded once.
    /// </summary>
    private static (double[,] Covariance, int N) ExactListwiseCovariance(ResponseMatrix data)
    {
        int k = data.ItemCount, rowsTotal = data.RespondentCount, tileRows = PearsonCorrelation.TileRows;
        int padded = (k + 1 + 3) & ~3;
        var zz = PearsonCorrelation.AccumulateSegments(data.Rows, rowsTotal, k, padded, -1, (block, rows, tile) =>
        {
            Array.Clear(tile);
            for (int t = 0; t < rows; t++)
            {
                if (!CompleteOn(block, t * k, k)) continue;
                for (int a = 0; a < k; a++) tile[a * tileRows + t] = block[t * k + a];
                tile[k * tileRows + t] = 1;
            }
        });
        long n = (long)zz[k * padded + k];
        var sum = new long[k];
        for (int a = 0; a < k; a++) sum[a] = (long)zz[k * padded + a];
        var cov = new double[k, k];
        for (int a = 0; a < k; a++)
            for (int b = 0; b <= a; b++)
            {
                Int128 scaled = n * (Int128)(long)zz[a * padded + b] - (Int128)sum[a] * sum[b];
                cov[a, b] = cov[b, a] = n > 1 ? (double)scaled / ((double)n * (n - 1)) : double.NaN;
            }
        return (cov, (int)n);
    }

    private static bool CompleteOn(ReadOnlySpan<double> v, int offset, int count)
    {
        for (int c = 0; c < count; c++) if (double.IsNaN(v[offset + c])) return false;
        return true;
    }

    private static bool CompleteOn(ReadOnlySpan<double> v, int offset, int[] cols)
    {
        foreach (int c in cols) if (double.IsNaN(v[offset + c])) return false;
        return true;
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
