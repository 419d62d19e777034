namespace ItemReduce.Core.Data;

/// <summary>
/// Per-item count of answers, mean and standard deviation (n − 1 denominator), computed in two passes
/// over the non-missing values for numerical stability.
/// </summary>
/// <param name="Counts">Answers per item.</param>
/// <param name="Means">Mean per item (NaN when no answers).</param>
/// <param name="StandardDeviations">SD per item with the n − 1 normaliser (NaN when fewer than 2 answers).</param>
public sealed record ItemMoments(int[] Counts, double[] Means, double[] StandardDeviations)
{
    /// <summary>Computes the moments of every column.</summary>
    public static ItemMoments Compute(ResponseMatrix data)
    {
        ArgumentNullException.ThrowIfNull(data);
        int n = data.RespondentCount, p = data.ItemCount;
        var v = data.Storage;
        var counts = new int[p];
        var sums = new double[p];
        for (int i = 0; i < n; i++)
        {
            int o = i * p;
            for (int j = 0; j < p; j++)
            {
                double x = v[o + j];
                if (double.IsNaN(x)) continue;
                counts[j]++;
                sums[j] += x;
            }
        }
        var means = new double[p];
        for (int j = 0; j < p; j++) means[j] = counts[j] > 0 ? sums[j] / counts[j] : double.NaN;
        var ss = new double[p];
        for (int i = 0; i < n; i++)
        {
            int o = i * p;
            for (int j = 0; j < p; j++)
            {
                double x = v[o + j];
                if (double.IsNaN(x)) continue;
                double d = x - means[j];
                ss[j] += d * d;
            }
        }
        var sd = new double[p];
        for (int j = 0; j < p; j++) sd[j] = counts[j] > 1 ? Math.Sqrt(ss[j] / (counts[j] - 1)) : double.NaN;
        return new ItemMoments(counts, means, sd);
    }
}
