namespace ItemReduce.Core.Reliability;

/// <summary>
/// Coefficient alpha: Cronbach, L. J. (1951). Coefficient alpha and the internal structure of tests.
/// Psychometrika, 16(3), 297–334. For k items with covariance matrix C,
/// α = k/(k − 1) · (1 − Σⱼ Cⱼⱼ / Σⱼₗ Cⱼₗ) (raw-score alpha). Standardized alpha is the same formula on the
/// correlation matrix, equal to k r̄ / (1 + (k − 1) r̄) with r̄ the mean inter-item correlation (the
/// Spearman–Brown form). Alpha-if-item-deleted recomputes α on the k − 1 remaining items.
/// NaN when k &lt; 2 or the total variance is not positive.
/// </summary>
internal static class CronbachAlpha
{
    /// <summary>Raw alpha from a k × k covariance matrix.</summary>
    public static double FromCovariance(double[,] covariance)
    {
        ArgumentNullException.ThrowIfNull(covariance);
        return FromCovariance(covariance, Enumerable.Range(0, covariance.GetLength(0)).ToArray());
    }

    /// <summary>Raw alpha of the items <paramref name="items"/> (indices into <paramref name="covariance"/>).</summary>
    internal static double FromCovariance(double[,] covariance, IReadOnlyList<int> items)
    {
        int k = items.Count;
        if (k < 2) return double.NaN;
        double diag = 0, total = 0;
        foreach (int a in items)
        {
            diag += covariance[a, a];
            foreach (int b in items) total += covariance[a, b];
        }
        return total > 0 ? k / (k - 1.0) * (1.0 - diag / total) : double.NaN;
    }

    /// <summary>Standardized alpha k r̄ / (1 + (k − 1) r̄) from a k × k correlation matrix.</summary>
    public static double Standardized(double[,] correlation)
    {
        ArgumentNullException.ThrowIfNull(correlation);
        int k = correlation.GetLength(0);
        if (k < 2) return double.NaN;
        double sum = 0;
        for (int a = 0; a < k; a++)
            for (int b = 0; b < k; b++) if (a != b) sum += correlation[a, b];
        double rbar = sum / (k * (k - 1.0));
        return k * rbar / (1.0 + (k - 1.0) * rbar);
    }

    /// <summary>Alpha of the remaining k − 1 items when each item in turn is deleted (length k).</summary>
    public static double[] IfItemDeleted(double[,] covariance)
    {
        ArgumentNullException.ThrowIfNull(covariance);
        int k = covariance.GetLength(0);
        var result = new double[k];
        for (int j = 0; j < k; j++)
            result[j] = FromCovariance(covariance, Enumerable.Range(0, k).Where(i => i != j).ToArray());
        return result;
    }
}
