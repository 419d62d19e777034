using ItemReduce.Core.Correlation;
using ItemReduce.Core.Data;
using MathNet.Numerics.LinearAlgebra;

namespace ItemReduce.Core.Screening;

/// <summary>
/// Location and covariance for the classical distances when answers may be missing.
/// <list type="bullet">
/// <item>Location: each item's mean over every respondent who answered it.</item>
/// <item>Covariance: pairwise-complete — the entry for items j, k uses the respondents who answered both,
/// centred at that pair's own means, with the <c>m_jk − 1</c> normaliser (two passes). With complete data this
/// is the ordinary sample covariance (n − 1 normaliser).</item>
/// <item>A pairwise matrix need not be positive definite. When its Cholesky factorisation fails, the matrix is
/// repaired by raising every eigenvalue below <see cref="EigenvalueFloorShare"/> × (trace / p) to that floor and
/// rebuilding <c>V Λ Vᵀ</c>; a warning is returned. Every principal sub-matrix of the repaired matrix is then
/// positive definite, so each missing-data pattern can be factorised.</item>
/// <item>A pair with fewer than 2 joint answers has no covariance; it is set to 0 with a warning.</item>
/// </list>
/// </summary>
internal static class PairwiseCovariance
{
    /// <summary>Eigenvalue floor, as a share of the mean eigenvalue, used by the repair.</summary>
    internal const double EigenvalueFloorShare = 1e-6;

    /// <summary>Item means (over answered values) and the pairwise-complete covariance (p × p).</summary>
    public static (double[] Mean, double[,] Covariance, int PairsWithoutOverlap) Compute(ResponseMatrix data)
    {
        int n = data.RespondentCount, p = data.ItemCount;
        if (!data.HasMissing())
        {
            if (n < 2) return (new double[p].Select(_ => double.NaN).ToArray(), Nan(p), p * (p + 1) / 2);
            var (m, flat) = RowMoments.MeanCovariance(data, n - 1);
            var full = new double[p, p];
            for (int j = 0; j < p; j++)
                for (int k = 0; k < p; k++) full[j, k] = flat[j * p + k];
            return (m, full, 0);
        }

        var mean = ItemMoments.Compute(data).Means;
        var (cov, without) = PairwiseSums.Applies(data) ? FromExactSums(PairwiseSums.Compute(data, -1), p) : PairwiseCrossProducts(data);
        return (mean, cov, without);
    }

    /// <summary>The same covariances from exact integer sums (compact integer-valued data): m·C_jk is exact, then
    /// divided once by m (m − 1).</summary>
    private static (double[,] Cov, int PairsWithoutOverlap) FromExactSums(PairwiseSums sums, int p)
    {
        var cov = new double[p, p];
        int without = 0;
        for (int j = 0; j < p; j++)
            for (int k = 0; k <= j; k++)
            {
                long m = sums.Count(j, k);
                double c = 0;
                if (m < 2) without++;
                else c = (double)sums.ScaledCentredProduct(j, k) / ((double)m * (m - 1));
                cov[j, k] = cov[k, j] = c;
            }
        return (cov, without);
    }

    /// <summary>Rows decoded at a time inside a block.</summary>
    private const int DecodeRows = 512;

    /// <summary>Preferred rows per block of the pairwise passes.</summary>
    private const int PreferredBlockRows = 16_384;

    /// <summary>Bound on blocks × p² (doubles per accumulator array), about 32 MB per array.</summary>
    private const long BlockMemoryDoubles = 4L << 20;

    /// <summary>
    /// Pairwise-complete covariances in two row-major passes (cache-friendly for long data): pass 1 counts joint
    /// answers m_jk and sums x_j over the rows answering both j and k (the pair's own mean of j); pass 2 adds the
    /// centred cross-products. Blocks of rows are processed in parallel and combined in block order.
    /// </summary>
    private static (double[,] Cov, int PairsWithoutOverlap) PairwiseCrossProducts(ResponseMatrix v)
    {
        int n = v.RespondentCount, p = v.ItemCount;
        // The block layout depends only on n and p (never on the thread count), so the sums are reproducible.
        long byMemory = Math.Max(1, BlockMemoryDoubles / ((long)p * p));
        int blocks = (int)Math.Max(1, Math.Min((n + PreferredBlockRows - 1) / PreferredBlockRows, byMemory));
        int blockRows = (n + blocks - 1) / blocks;
        // Pass 1: counts (lower triangle) and sums S[j, k] = Σ x_j over rows answering j and k (full square).
        var (counts, sums) = Accumulate(v, n, p, blocks, blockRows, null);
        var count = new long[p * p];
        var pairMean = new double[p * p];
        for (int b = 0; b < blocks; b++)
            for (int k = 0; k < p * p; k++) { count[k] += counts[b][k]; pairMean[k] += sums[b][k]; }
        for (int j = 0; j < p; j++)
            for (int k = 0; k < p; k++)
            {
                long m = j >= k ? count[j * p + k] : count[k * p + j];
                pairMean[j * p + k] = m > 0 ? pairMean[j * p + k] / m : 0;
            }

        // Pass 2: Σ (x_j − mean_j|jk)(x_k − mean_k|jk) over rows answering both (lower triangle).
        var (_, products) = Accumulate(v, n, p, blocks, blockRows, pairMean);
        var cov = new double[p, p];
        int without = 0;
        for (int j = 0; j < p; j++)
            for (int k = 0; k <= j; k++)
            {
                long m = count[j * p + k];
                double sum = 0;
                for (int b = 0; b < blocks; b++) sum += products[b][j * p + k];
                if (m < 2) { without++; sum = 0; }
                else sum /= m - 1;
                cov[j, k] = cov[k, j] = sum;
            }
        return (cov, without);
    }

    /// <summary>
    /// One pass over the row blocks in parallel. Without <paramref name="pairMean"/>: joint counts (lower triangle)
    /// and pair-restricted sums (full square). With it: centred cross-products (lower triangle) in the second array.
    /// </summary>
    private static (long[][] Counts, double[][] Sums) Accumulate(ResponseMatrix data, int n, int p, int blocks, int blockRows, double[]? pairMean)
    {
        var counts = new long[blocks][];
        var sums = new double[blocks][];
        Parallel.For(0, blocks, b =>
        {
            var c = new long[pairMean is null ? p * p : 0];
            var s = new double[p * p];
            var idx = new int[p];
            var scratch = new double[DecodeRows * p];
            int end = Math.Min(n, (b + 1) * blockRows);
            ReadOnlySpan<double> v = default;
            for (int i = b * blockRows, i0 = i; i < end; i++)
            {
                if (i == i0 || i - i0 == DecodeRows)
                {
                    i0 = i;
                    v = data.Rows(i0, Math.Min(DecodeRows, end - i0), scratch);
                }
                int o = (i - i0) * p, q = Answered(v, o, p, idx);
                for (int a = 0; a < q; a++)
                {
                    int ja = idx[a];
                    double xa = v[o + ja];
                    for (int t = 0; t <= a; t++)
                    {
                        int jb = idx[t];
                        if (pairMean is null)
                        {
                            c[ja * p + jb]++;
                            s[ja * p + jb] += xa;
                            if (jb != ja) s[jb * p + ja] += v[o + jb];
                        }
                        else s[ja * p + jb] += (xa - pairMean[ja * p + jb]) * (v[o + jb] - pairMean[jb * p + ja]);
                    }
                }
            }
            counts[b] = c;
            sums[b] = s;
        });
        return (counts, sums);
    }

    /// <summary>Writes the answered item indices of the row at <paramref name="offset"/> into <paramref name="idx"/>; returns their count.</summary>
    private static int Answered(ReadOnlySpan<double> v, int offset, int p, int[] idx)
    {
        int q = 0;
        for (int j = 0; j < p; j++) if (!double.IsNaN(v[offset + j])) idx[q++] = j;
        return q;
    }

    private static double[,] Nan(int p)
    {
        var m = new double[p, p];
        for (int j = 0; j < p; j++)
            for (int k = 0; k < p; k++) m[j, k] = double.NaN;
        return m;
    }

    /// <summary>
    /// Returns <paramref name="cov"/> unchanged when positive definite, otherwise the eigenvalue-floored
    /// repair described on the type; <c>Repaired</c> tells which, <c>SmallestEigenvalue</c> is the smallest
    /// eigenvalue before repair (NaN when no decomposition was needed).
    /// </summary>
    public static (double[,] Matrix, bool Repaired, double SmallestEigenvalue) EnsurePositiveDefinite(double[,] cov)
    {
        if (ScreeningCholesky.TryFactor(cov) is not null) return (cov, false, double.NaN);
        int p = cov.GetLength(0);
        var m = Matrix<double>.Build.DenseOfArray(cov);
        var evd = m.Evd(Symmetricity.Symmetric);
        var values = evd.EigenValues.Select(c => c.Real).ToArray();
        double trace = 0;
        for (int j = 0; j < p; j++) trace += Math.Max(cov[j, j], 0);
        double floor = Math.Max(EigenvalueFloorShare * trace / p, double.Epsilon);
        double smallest = values.Min();
        var clipped = Vector<double>.Build.Dense(values.Select(l => Math.Max(l, floor)).ToArray());
        var rebuilt = evd.EigenVectors * Matrix<double>.Build.DiagonalOfDiagonalVector(clipped) * evd.EigenVectors.Transpose();
        var r = new double[p, p];
        for (int j = 0; j < p; j++)
            for (int k = 0; k < p; k++) r[j, k] = 0.5 * (rebuilt[j, k] + rebuilt[k, j]);
        return (r, true, smallest);
    }
}
