using System.Runtime.Intrinsics;

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
    /// <summary>Rows decoded per block by the passes over the data.</summary>
    internal const int BlockRows = 1024;

    /// <summary>Computes the moments of every column.</summary>
    public static ItemMoments Compute(ResponseMatrix data)
    {
        ArgumentNullException.ThrowIfNull(data);
        if (data.CodeHistogram() is var (codeCounts, decode, _, _)) return FromHistogram(codeCounts, decode, data.ItemCount);
        int n = data.RespondentCount, p = data.ItemCount;
        var counts = new int[p];
        var sums = new double[p];
        // Rows are visited in order, so every column's sum is accumulated in the same order as a plain loop.
        var answered = new double[p]; // whole numbers, exact in a double far beyond int range
        int width = Vector256<double>.Count;
        data.ForEachBlock(BlockRows, (v, rows) =>
        {
            for (int o = 0; o < rows * p; o += p)
            {
                int j = 0;
                // Several columns per instruction; a missing value adds exactly +0 (the sum starts at +0, so it never
                // becomes −0), which leaves each column's sum bit-identical to skipping it.
                for (; j + width <= p; j += width)
                {
                    var x = Vector256.Create(v.Slice(o + j, width));
                    var nan = Vector256.IsNaN(x);
                    (Vector256.Create(answered.AsSpan(j, width)) + Vector256.ConditionalSelect(nan, Vector256<double>.Zero, Vector256<double>.One))
                        .CopyTo(answered.AsSpan(j, width));
                    (Vector256.Create(sums.AsSpan(j, width)) + Vector256.ConditionalSelect(nan, Vector256<double>.Zero, x)).CopyTo(sums.AsSpan(j, width));
                }
                for (; j < p; j++)
                {
                    double x = v[o + j];
                    if (double.IsNaN(x)) continue;
                    answered[j]++;
                    sums[j] += x;
                }
            }
        });
        for (int j = 0; j < p; j++) counts[j] = (int)answered[j];
        var means = new double[p];
        for (int j = 0; j < p; j++) means[j] = counts[j] > 0 ? sums[j] / counts[j] : double.NaN;
        var ss = new double[p];
        data.ForEachBlock(BlockRows, (v, rows) =>
        {
            for (int o = 0; o < rows * p; o += p)
            {
                int j = 0;
                for (; j + width <= p; j += width)
                {
                    var d = Vector256.Create(v.Slice(o + j, width)) - Vector256.Create(means.AsSpan(j, width));
                    (Vector256.Create(ss.AsSpan(j, width)) + Vector256.ConditionalSelect(Vector256.IsNaN(d), Vector256<double>.Zero, d * d))
                        .CopyTo(ss.AsSpan(j, width));
                }
                for (; j < p; j++)
                {
                    double d = v[o + j] - means[j];
                    if (!double.IsNaN(d)) ss[j] += d * d;
                }
            }
        });
        var sd = new double[p];
        for (int j = 0; j < p; j++) sd[j] = counts[j] > 1 ? Math.Sqrt(ss[j] / (counts[j] - 1)) : double.NaN;
        return new ItemMoments(counts, means, sd);
    }

    /// <summary>Moments from the code counts of compact storage (one pass over the bytes, no decoding): the sum is
    /// <c>Σ_c n_c v_c</c> and the centred sum of squares <c>Σ_c n_c (v_c − mean)²</c> over the codes c with value v_c,
    /// the same two-pass formula as for rows, with one term per code instead of one per answer.</summary>
    private static ItemMoments FromHistogram(long[] codeCounts, double[] decode, int p)
    {
        const int size = ResponseMatrix.TableSize;
        var counts = new int[p];
        var means = new double[p];
        var sd = new double[p];
        for (int j = 0; j < p; j++)
        {
            long answered = 0;
            double sum = 0;
            for (int c = 0; c < size; c++)
            {
                long k = codeCounts[j * size + c];
                double v = decode[j * size + c];
                if (k == 0 || double.IsNaN(v)) continue;
                answered += k;
                sum += k * v;
            }
            counts[j] = (int)answered;
            double mean = answered > 0 ? sum / answered : double.NaN;
            double ss = 0;
            for (int c = 0; c < size; c++)
            {
                long k = codeCounts[j * size + c];
                double v = decode[j * size + c];
                if (k == 0 || double.IsNaN(v)) continue;
                ss += k * ((v - mean) * (v - mean));
            }
            means[j] = mean;
            sd[j] = answered > 1 ? Math.Sqrt(ss / (answered - 1)) : double.NaN;
        }
        return new ItemMoments(counts, means, sd);
    }
}
