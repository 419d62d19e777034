namespace ItemReduce.Core.Screening;

/// <summary>Mean vector and covariance of selected complete rows (two passes for numerical stability).</summary>
internal static class RowMoments
{
    /// <summary>Two-pass mean and cross-product matrix of the given rows divided by <paramref name="divisor"/>; row-major p × p.</summary>
    public static (double[] Mean, double[] Cov) MeanCovariance(double[] x, int p, int[] rows, int divisor)
    {
        var mean = new double[p];
        foreach (int r in rows)
            for (int j = 0; j < p; j++) mean[j] += x[r * p + j];
        for (int j = 0; j < p; j++) mean[j] /= rows.Length;
        var cov = new double[p * p];
        var d = new double[p];
        foreach (int r in rows)
        {
            for (int j = 0; j < p; j++) d[j] = x[r * p + j] - mean[j];
            for (int j = 0; j < p; j++)
            {
                double dj = d[j];
                int o = j * p;
                for (int k = 0; k <= j; k++) cov[o + k] += dj * d[k];
            }
        }
        for (int j = 0; j < p; j++)
            for (int k = 0; k <= j; k++) cov[k * p + j] = cov[j * p + k] /= divisor;
        return (mean, cov);
    }
}
