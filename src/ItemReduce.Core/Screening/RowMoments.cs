using System.Runtime.CompilerServices;
using System.Runtime.Intrinsics;

namespace ItemReduce.Core.Screening;

/// <summary>Mean vector and covariance of selected complete rows (two passes for numerical stability).</summary>
internal static class RowMoments
{
    /// <summary>Two-pass mean and cross-product matrix of every (complete) row of <paramref name="data"/> divided by
    /// <paramref name="divisor"/>; row-major p × p. Rows are decoded in blocks, in order, so the sums equal those of
    /// <see cref="MeanCovariance(double[], int, int[], int)"/> on the decoded array.</summary>
    public static (double[] Mean, double[] Cov) MeanCovariance(ItemReduce.Core.Data.ResponseMatrix data, int divisor)
    {
        int n = data.RespondentCount, p = data.ItemCount;
        const int blockRows = 1024;
        var mean = new double[p];
        data.ForEachBlock(blockRows, (x, rows) =>
        {
            for (int o = 0; o < rows * p; o += p)
                for (int j = 0; j < p; j++) mean[j] += x[o + j];
        });
        for (int j = 0; j < p; j++) mean[j] /= n;
        var cov = new double[p * p];
        var d = new double[p];
        data.ForEachBlock(blockRows, (x, rows) =>
        {
            for (int o = 0; o < rows * p; o += p)
            {
                for (int j = 0; j < p; j++) d[j] = x[o + j] - mean[j];
                AddOuter(d, cov, p);
            }
        });
        for (int j = 0; j < p; j++)
            for (int k = 0; k <= j; k++) cov[k * p + j] = cov[j * p + k] /= divisor;
        return (mean, cov);
    }

    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private static void AddOuter(double[] d, double[] cov, int p)
    {
        // Each entry gets the same single multiply-add as an element-by-element loop (vectorised across k only, no
        // fused multiply-add), so the sums are bit-identical to the plain loop in the same row order.
        int width = Vector256<double>.Count;
        for (int j = 0; j < p; j++)
        {
            double dj = d[j];
            var vj = Vector256.Create(dj);
            int o = j * p;
            int k = 0;
            for (; k + width <= j + 1; k += width)
            {
                var acc = Vector256.Create(cov.AsSpan(o + k, width));
                (acc + vj * Vector256.Create(d.AsSpan(k, width))).CopyTo(cov.AsSpan(o + k, width));
            }
            for (; k <= j; k++) cov[o + k] += dj * d[k];
        }
    }

    /// <summary>Two-pass mean and cross-product matrix of the given rows divided by <paramref name="divisor"/>; row-major p × p.</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public static (double[] Mean, double[] Cov) MeanCovariance(double[] x, int p, int[] rows, int divisor)
    {
        if (rows.Length >= KernelRows) return MeanCovarianceByTiles(x, p, rows, divisor);
        var mean = new double[p];
        foreach (int r in rows)
            for (int j = 0; j < p; j++) mean[j] += x[r * p + j];
        for (int j = 0; j < p; j++) mean[j] /= rows.Length;
        var cov = new double[p * p];
        var d = new double[p];
        foreach (int r in rows)
        {
            for (int j = 0; j < p; j++) d[j] = x[r * p + j] - mean[j];
            AddOuter(d, cov, p);
        }
        for (int j = 0; j < p; j++)
            for (int k = 0; k <= j; k++) cov[k * p + j] = cov[j * p + k] /= divisor;
        return (mean, cov);
    }

    /// <summary>Row count from which <see cref="MeanCovariance(double[], int, int[], int)"/> uses the tiled cross-product kernel.</summary>
    internal const int KernelRows = 2048;

    /// <summary>The same moments for many rows: the mean in row order, then the centred cross-products by the tiled,
    /// parallel kernel of <see cref="ItemReduce.Core.Correlation.PearsonCorrelation"/> (fixed row segments, so the result
    /// does not depend on the thread count; it differs from the row loop only by rounding).</summary>
    private static (double[] Mean, double[] Cov) MeanCovarianceByTiles(double[] x, int p, int[] rows, int divisor)
    {
        ReadOnlySpan<double> Source(int first, int count, Span<double> scratch)
        {
            for (int r = 0; r < count; r++) x.AsSpan(rows[first + r] * p, p).CopyTo(scratch.Slice(r * p, p));
            return scratch[..(count * p)];
        }
        var lower = ItemReduce.Core.Correlation.PearsonCorrelation.CentredCrossProducts(Source, rows.Length, p, -1, out int pp, out var mean);
        var cov = new double[p * p];
        for (int j = 0; j < p; j++)
            for (int k = 0; k <= j; k++) cov[k * p + j] = cov[j * p + k] = lower[j * pp + k] / divisor;
        return (mean, cov);
    }
}
