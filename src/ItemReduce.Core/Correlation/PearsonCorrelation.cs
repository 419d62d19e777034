using System.Numerics;
using System.Runtime.CompilerServices;
using System.Runtime.InteropServices;
using System.Runtime.Intrinsics;
using System.Runtime.Intrinsics.X86;
using ItemReduce.Core.Data;

namespace ItemReduce.Core.Correlation;

/// <summary>
/// Pearson product-moment correlation matrix of the items (Pearson, 1896, "Mathematical contributions to
/// the theory of evolution III", Phil. Trans. R. Soc. A 187, 253–318). Pairwise: each pair uses the
/// respondents who answered both items, with that pair's own means and SDs (two-pass). Listwise: only
/// complete rows. Returns a p × p symmetric matrix with unit diagonal; a pair with fewer than 3 joint
/// answers or zero variance gives NaN.
/// <para>
/// Complete data take a fast path: columns are centred with two-pass means, then the lower triangle of the
/// cross-product matrix XcᵀXc is accumulated in cache-sized tiles of observations with a 4 × 2 register-blocked
/// SIMD kernel (fused multiply-add). Observations are split into a fixed number of segments that depend only
/// on n (not on the thread count); segment sums are added in segment order, so results are identical for any
/// degree of parallelism.
/// </para>
/// </summary>
public static class PearsonCorrelation
{
    /// <summary>Observations per tile of the complete-data kernel (tile = p × 256 doubles, fits in L2).</summary>
    internal const int TileRows = 256;

    /// <summary>Correlation matrix of the columns of <paramref name="data"/>.</summary>
    public static double[,] Compute(ResponseMatrix data, MissingDataHandling handling = MissingDataHandling.Pairwise)
        => Compute(data, handling, -1);

    /// <summary>As <see cref="Compute(ResponseMatrix, MissingDataHandling)"/> with a cap on threads
    /// (−1 = all cores, 1 = sequential).</summary>
    internal static double[,] Compute(ResponseMatrix data, MissingDataHandling handling, int maxDegreeOfParallelism)
    {
        ArgumentNullException.ThrowIfNull(data);
        if (handling == MissingDataHandling.Listwise || !data.HasMissing())
        {
            var rows = CompleteRows(data);
            var complete = rows.Length == data.RespondentCount ? data : data.SelectRespondents(rows);
            return Complete(complete.Rows, rows.Length, data.ItemCount, maxDegreeOfParallelism);
        }
        return Pairwise(data, maxDegreeOfParallelism);
    }

    /// <summary>Indices of the respondents who answered every item.</summary>
    internal static int[] CompleteRows(ResponseMatrix data)
    {
        var rows = new List<int>(data.RespondentCount);
        for (int i = 0; i < data.RespondentCount; i++)
            if (data.IsComplete(i)) rows.Add(i);
        return rows.ToArray();
    }

    /// <summary>Correlations of complete row-major n × p data <paramref name="v"/> (no NaN).</summary>
    internal static double[,] Complete(double[] v, int n, int p, int maxDegreeOfParallelism = -1)
        => Complete((first, count, _) => v.AsSpan(first * p, count * p), n, p, maxDegreeOfParallelism);

    /// <summary>Correlations of complete n × p data (no NaN) read in row blocks from <paramref name="source"/>.</summary>
    internal static double[,] Complete(RowBlockSource source, int n, int p, int maxDegreeOfParallelism = -1)
    {
        var cp = CentredCrossProducts(source, n, p, maxDegreeOfParallelism, out int pp);
        var r = new double[p, p];
        for (int j = 0; j < p; j++)
        {
            for (int k = 0; k < j; k++)
            {
                double den = Math.Sqrt(cp[j * pp + j] * cp[k * pp + k]);
                double c = den > 0 && n >= 3 ? cp[j * pp + k] / den : double.NaN;
                r[j, k] = r[k, j] = c;
            }
            r[j, j] = 1.0;
        }
        return r;
    }

    /// <summary>
    /// Lower triangle (row-major, leading dimension <paramref name="pp"/> = p rounded up to 4) of the centred
    /// cross-product matrix Σ_i (x_i − x̄)(x_i − x̄)ᵀ of complete data.
    /// </summary>
    internal static double[] CentredCrossProducts(RowBlockSource source, int n, int p, int maxDegreeOfParallelism, out int pp)
        => CentredCrossProducts(source, n, p, maxDegreeOfParallelism, out pp, out _);

    /// <summary>As above, also giving the column means (summed in row order).</summary>
    internal static double[] CentredCrossProducts(RowBlockSource source, int n, int p, int maxDegreeOfParallelism, out int pp, out double[] mean)
    {
        mean = new double[p];
        var scratch = new double[TileRows * p];
        for (int t0 = 0; t0 < n; t0 += TileRows)
        {
            int rows = Math.Min(TileRows, n - t0);
            var block = source(t0, rows, scratch);
            for (int t = 0; t < rows; t++) AddRow(block.Slice(t * p, p), mean);
        }
        for (int j = 0; j < p; j++) mean[j] /= n;

        int padded = (p + 3) & ~3;
        pp = padded;
        var centre = mean;
        return AccumulateSegments(source, n, p, padded, maxDegreeOfParallelism,
            (block, rows, tile) => FillCentredTile(block, p, centre, rows, tile));
    }

    /// <summary>Writes the variable-major tile (padded × <see cref="TileRows"/>) of a row-major block of rows.</summary>
    internal delegate void TileFill(ReadOnlySpan<double> block, int rows, double[] tile);

    /// <summary>
    /// Σ over all rows of zᵢ zᵢᵀ (lower triangle, leading dimension <paramref name="padded"/>) where <paramref name="fill"/>
    /// turns row blocks into tiles of z. Rows are split into a fixed number of segments that depend only on n; segment
    /// sums are added in segment order, so the result does not depend on the thread count.
    /// </summary>
    internal static double[] AccumulateSegments(RowBlockSource source, int n, int p, int padded, int maxDegreeOfParallelism, TileFill fill)
        => AccumulateSegments(source, n, p, [padded], maxDegreeOfParallelism, (block, rows, _, tile) => fill(block, rows, tile))[0];

    /// <summary>Writes tile number <paramref name="set"/> (variable-major, padded[set] × <see cref="TileRows"/>, unused
    /// entries 0) of a row-major block of rows.</summary>
    internal delegate void MultiTileFill(ReadOnlySpan<double> block, int rows, int set, double[] tile);

    /// <summary>
    /// As <see cref="AccumulateSegments(RowBlockSource, int, int, int, int, TileFill)"/> for several vectors z⁽ˢ⁾ per row
    /// at once: each block of rows is read (decoded) once and turned into one tile per set s, whose Σ zᵢ⁽ˢ⁾ zᵢ⁽ˢ⁾ᵀ is
    /// accumulated separately (leading dimension padded[s], a multiple of 4). Same fixed segments and merge order.
    /// </summary>
    internal static double[][] AccumulateSegments(RowBlockSource source, int n, int p, int[] padded, int maxDegreeOfParallelism, MultiTileFill fill)
    {
        int segments = Math.Clamp((n + 4 * TileRows - 1) / (4 * TileRows), 1, 16);
        int sets = padded.Length, widest = padded.Length == 0 ? 0 : padded.Max();
        var partial = new double[segments][][];
        var options = new ParallelOptions { MaxDegreeOfParallelism = maxDegreeOfParallelism };
        Parallel.For(0, segments, options, [MethodImpl(MethodImplOptions.AggressiveOptimization)] (s) =>
        {
            int r0 = (int)((long)n * s / segments), r1 = (int)((long)n * (s + 1) / segments);
            var acc = new double[sets][];
            for (int q = 0; q < sets; q++) acc[q] = new double[padded[q] * padded[q]];
            var tile = new double[widest * TileRows];
            var rowScratch = new double[TileRows * p];
            for (int t0 = r0; t0 < r1; t0 += TileRows)
            {
                int rows = Math.Min(TileRows, r1 - t0);
                var block = source(t0, rows, rowScratch);
                for (int q = 0; q < sets; q++)
                {
                    fill(block, rows, q, tile);
                    AccumulateTile(tile, padded[q], acc[q]);
                }
            }
            partial[s] = acc;
        });
        var total = partial[0];
        for (int s = 1; s < segments; s++)
            for (int q = 0; q < sets; q++)
            {
                double[] sum = total[q], ps = partial[s][q];
                for (int k = 0; k < sum.Length; k++) sum[k] += ps[k];
            }
        return total;
    }

    private static void AddRow(ReadOnlySpan<double> row, double[] sum)
    {
        for (int j = 0; j < row.Length; j++) sum[j] += row[j];
    }

    /// <summary>Transposes a row-major block of <paramref name="rows"/> rows into variable-major tile rows, centred; pads with zeros.</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    internal static void FillCentredTile(ReadOnlySpan<double> v, int p, double[] mean, int rows, double[] tile)
    {
        if (rows < TileRows) Array.Clear(tile);
        // Variable-outer order: contiguous writes; the strided reads revisit the same 64-byte lines
        // for 8 consecutive variables, which stay in L1.
        for (int j = 0; j < p; j++)
        {
            var dst = tile.AsSpan(j * TileRows, rows);
            double m = mean[j];
            int o = j;
            for (int t = 0; t < dst.Length; t++, o += p) dst[t] = v[o] - m;
        }
    }

    /// <summary>acc[j, k] += Σ_t tile[j, t] tile[k, t] for the 4 × 2 blocks on or below the diagonal.</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    internal static void AccumulateTile(double[] tile, int padded, double[] acc)
    {
        if (Fma.IsSupported && Vector256.IsHardwareAccelerated)
        {
            AccumulateTileFma(tile, padded, acc);
            return;
        }
        var vt = MemoryMarshal.Cast<double, Vector<double>>(tile.AsSpan());
        int w = TileRows / Vector<double>.Count; // vectors per variable
        for (int j = 0; j < padded; j += 4)
        {
            for (int k = 0; k < j + 4; k += 2)
            {
                Vector<double> s00 = default, s01 = default, s10 = default, s11 = default,
                               s20 = default, s21 = default, s30 = default, s31 = default;
                for (int t = 0; t < w; t++)
                {
                    var x0 = vt[k * w + t];
                    var x1 = vt[(k + 1) * w + t];
                    var y = vt[j * w + t];
                    s00 += y * x0; s01 += y * x1;
                    y = vt[(j + 1) * w + t];
                    s10 += y * x0; s11 += y * x1;
                    y = vt[(j + 2) * w + t];
                    s20 += y * x0; s21 += y * x1;
                    y = vt[(j + 3) * w + t];
                    s30 += y * x0; s31 += y * x1;
                }
                Store(acc, j * padded + k, padded, Vector.Sum(s00), Vector.Sum(s01), Vector.Sum(s10), Vector.Sum(s11),
                    Vector.Sum(s20), Vector.Sum(s21), Vector.Sum(s30), Vector.Sum(s31));
            }
        }
    }

    /// <summary>The same sums with 256-bit fused multiply-add intrinsics (x86 FMA3), register-blocked 4 × 3: twelve
    /// accumulators, seven loads per twelve multiply-adds (4 × 2: eight and six per eight), which keeps both FMA pipes
    /// busy. Every entry is still the 4-lane sum over the tile in order, reduced by <see cref="Vector256.Sum{T}"/> and
    /// added to <paramref name="acc"/> once, so the blocking changes no result; the 1 or 2 columns left over at the
    /// end of a row block take 4 × 1 steps.</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private static void AccumulateTileFma(double[] tile, int padded, double[] acc)
    {
        ref double t0 = ref MemoryMarshal.GetArrayDataReference(tile);
        for (int j = 0; j < padded; j += 4)
        {
            ref double a0 = ref Unsafe.Add(ref t0, j * TileRows);
            int k = 0, end = j + 4;
            for (; k + 3 <= end; k += 3) Block4x3(ref a0, ref Unsafe.Add(ref t0, k * TileRows), acc, j * padded + k, padded);
            for (; k < end; k++) Block4x1(ref a0, ref Unsafe.Add(ref t0, k * TileRows), acc, j * padded + k, padded);
        }
    }

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private static void Block4x3(ref double a0, ref double b0, double[] acc, int o, int padded)
    {
        ref double a1 = ref Unsafe.Add(ref a0, TileRows), a2 = ref Unsafe.Add(ref a0, 2 * TileRows), a3 = ref Unsafe.Add(ref a0, 3 * TileRows);
        ref double b1 = ref Unsafe.Add(ref b0, TileRows);
        ref double b2 = ref Unsafe.Add(ref b1, TileRows);
        Vector256<double> s00 = default, s01 = default, s02 = default, s10 = default, s11 = default, s12 = default,
                          s20 = default, s21 = default, s22 = default, s30 = default, s31 = default, s32 = default;
        for (nuint t = 0; t < TileRows; t += 4)
        {
            var x0 = Vector256.LoadUnsafe(ref b0, t);
            var x1 = Vector256.LoadUnsafe(ref b1, t);
            var x2 = Vector256.LoadUnsafe(ref b2, t);
            var y = Vector256.LoadUnsafe(ref a0, t);
            s00 = Fma.MultiplyAdd(y, x0, s00); s01 = Fma.MultiplyAdd(y, x1, s01); s02 = Fma.MultiplyAdd(y, x2, s02);
            y = Vector256.LoadUnsafe(ref a1, t);
            s10 = Fma.MultiplyAdd(y, x0, s10); s11 = Fma.MultiplyAdd(y, x1, s11); s12 = Fma.MultiplyAdd(y, x2, s12);
            y = Vector256.LoadUnsafe(ref a2, t);
            s20 = Fma.MultiplyAdd(y, x0, s20); s21 = Fma.MultiplyAdd(y, x1, s21); s22 = Fma.MultiplyAdd(y, x2, s22);
            y = Vector256.LoadUnsafe(ref a3, t);
            s30 = Fma.MultiplyAdd(y, x0, s30); s31 = Fma.MultiplyAdd(y, x1, s31); s32 = Fma.MultiplyAdd(y, x2, s32);
        }
        acc[o] += Vector256.Sum(s00); acc[o + 1] += Vector256.Sum(s01); acc[o + 2] += Vector256.Sum(s02); o += padded;
        acc[o] += Vector256.Sum(s10); acc[o + 1] += Vector256.Sum(s11); acc[o + 2] += Vector256.Sum(s12); o += padded;
        acc[o] += Vector256.Sum(s20); acc[o + 1] += Vector256.Sum(s21); acc[o + 2] += Vector256.Sum(s22); o += padded;
        acc[o] += Vector256.Sum(s30); acc[o + 1] += Vector256.Sum(s31); acc[o + 2] += Vector256.Sum(s32);
    }

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private static void Block4x1(ref double a0, ref double b0, double[] acc, int o, int padded)
    {
        ref double a1 = ref Unsafe.Add(ref a0, TileRows), a2 = ref Unsafe.Add(ref a0, 2 * TileRows), a3 = ref Unsafe.Add(ref a0, 3 * TileRows);
        Vector256<double> s0 = default, s1 = default, s2 = default, s3 = default;
        for (nuint t = 0; t < TileRows; t += 4)
        {
            var x0 = Vector256.LoadUnsafe(ref b0, t);
            s0 = Fma.MultiplyAdd(Vector256.LoadUnsafe(ref a0, t), x0, s0);
            s1 = Fma.MultiplyAdd(Vector256.LoadUnsafe(ref a1, t), x0, s1);
            s2 = Fma.MultiplyAdd(Vector256.LoadUnsafe(ref a2, t), x0, s2);
            s3 = Fma.MultiplyAdd(Vector256.LoadUnsafe(ref a3, t), x0, s3);
        }
        acc[o] += Vector256.Sum(s0); o += padded;
        acc[o] += Vector256.Sum(s1); o += padded;
        acc[o] += Vector256.Sum(s2); o += padded;
        acc[o] += Vector256.Sum(s3);
    }

    private static void Store(double[] acc, int o, int padded, double s00, double s01, double s10, double s11,
        double s20, double s21, double s30, double s31)
    {
        acc[o] += s00; acc[o + 1] += s01; o += padded;
        acc[o] += s10; acc[o + 1] += s11; o += padded;
        acc[o] += s20; acc[o + 1] += s21; o += padded;
        acc[o] += s30; acc[o + 1] += s31;
    }

    /// <summary>Rows per block of the pairwise passes (a p × 4096 column-major block of doubles).</summary>
    private const int PairwiseBlockRows = 4096;

    /// <summary>Pairwise-complete correlations (compact integer data: exact sums, see <see cref="PairwiseExact"/>; otherwise
    /// two passes over blocks of rows taken in order (pass 1: joint
    /// counts and sums; pass 2: centred cross-products at the pair's own means). Each block is transposed to
    /// columns and the rows j of the matrix are processed in parallel; every pair's sums run over the respondents
    /// in input order, so the result equals a plain column loop bit for bit and does not depend on the thread count.
    /// Memory is O(p × block), never n × p.</summary>
    private static double[,] Pairwise(ResponseMatrix data, int maxDegreeOfParallelism)
    {
        if (PairwiseSums.Applies(data)) return PairwiseExact(PairwiseSums.Compute(data, maxDegreeOfParallelism), data.ItemCount);
        int n = data.RespondentCount, p = data.ItemCount;
        var count = new int[p * p];
        var sumJ = new double[p * p];   // [j, k]: Σ x_j over rows answering j and k (k < j)
        var sumK = new double[p * p];   // [j, k]: Σ x_k over the same rows
        var cjj = new double[p * p];
        var ckk = new double[p * p];
        var cjk = new double[p * p];
        var meanJ = new double[p * p];
        var meanK = new double[p * p];
        var rowScratch = new double[PairwiseBlockRows * p];
        var cols = new double[p * PairwiseBlockRows];
        var options = new ParallelOptions { MaxDegreeOfParallelism = maxDegreeOfParallelism };
        for (int pass = 0; pass < 2; pass++)
        {
            if (pass == 1)
                for (int q = 0; q < p * p; q++)
                    if (count[q] >= 3) { meanJ[q] = sumJ[q] / count[q]; meanK[q] = sumK[q] / count[q]; }
            for (int i0 = 0; i0 < n; i0 += PairwiseBlockRows)
            {
                int rows = Math.Min(PairwiseBlockRows, n - i0);
                var block = data.Rows(i0, rows, rowScratch);
                for (int j = 0; j < p; j++)
                    for (int t = 0, o = j; t < rows; t++, o += p) cols[j * PairwiseBlockRows + t] = block[o];
                bool first = pass == 0;
                Parallel.For(1, p, options, j =>
                {
                    var cj = new ReadOnlySpan<double>(cols, j * PairwiseBlockRows, rows);
                    for (int k = 0; k < j; k++)
                    {
                        var ck = new ReadOnlySpan<double>(cols, k * PairwiseBlockRows, rows);
                        int q = j * p + k;
                        if (first)
                        {
                            int m = count[q];
                            double sj = sumJ[q], sk = sumK[q];
                            for (int i = 0; i < rows; i++)
                            {
                                double a = cj[i], b = ck[i];
                                if (double.IsNaN(a) || double.IsNaN(b)) continue;
                                m++; sj += a; sk += b;
                            }
                            count[q] = m; sumJ[q] = sj; sumK[q] = sk;
                        }
                        else if (count[q] >= 3)
                        {
                            double mj = meanJ[q], mk = meanK[q], sjj = cjj[q], skk = ckk[q], sjk = cjk[q];
                            for (int i = 0; i < rows; i++)
                            {
                                double a = cj[i], b = ck[i];
                                if (double.IsNaN(a) || double.IsNaN(b)) continue;
                                double da = a - mj, db = b - mk;
                                sjj += da * da; skk += db * db; sjk += da * db;
                            }
                            cjj[q] = sjj; ckk[q] = skk; cjk[q] = sjk;
                        }
                    }
                });
            }
        }
        var r = new double[p, p];
        for (int j = 0; j < p; j++)
        {
            r[j, j] = 1.0;
            for (int k = 0; k < j; k++)
            {
                int q = j * p + k;
                double value = double.NaN;
                if (count[q] >= 3)
                {
                    double den = Math.Sqrt(cjj[q] * ckk[q]);
                    if (den > 0) value = cjk[q] / den;
                }
                r[j, k] = value;
                r[k, j] = value;
            }
        }
        return r;
    }

    /// <summary>Pairwise-complete correlations of integer-valued data from exact sums (<see cref="PairwiseSums"/>):
    /// r = m·C_jk / √(m·C_jj · m·C_kk) with every m·C exact, rounded once; the same definition as the two-pass path
    /// (pair's own means, at least 3 joint answers, NaN for zero variance), computed more accurately.</summary>
    private static double[,] PairwiseExact(PairwiseSums sums, int p)
    {
        var r = new double[p, p];
        for (int j = 0; j < p; j++)
        {
            r[j, j] = 1.0;
            for (int k = 0; k < j; k++)
            {
                double value = double.NaN;
                if (sums.Count(j, k) >= 3)
                {
                    double den = Math.Sqrt((double)sums.ScaledCentredSquares(j, k) * (double)sums.ScaledCentredSquares(k, j));
                    if (den > 0) value = (double)sums.ScaledCentredProduct(j, k) / den;
                }
                r[j, k] = value;
                r[k, j] = value;
            }
        }
        return r;
    }

    /// <summary>Number of respondents who answered both items, for every pair (diagonal: answers per item).</summary>
    internal static int[,] PairwiseCounts(ResponseMatrix data)
    {
        int n = data.RespondentCount, p = data.ItemCount;
        if (PairwiseSums.Applies(data))
        {
            var sums = PairwiseSums.Compute(data, -1);
            var c = new int[p, p];
            for (int j = 0; j < p; j++)
                for (int k = 0; k < p; k++) c[j, k] = (int)sums.Count(j, k);
            return c;
        }
        var counts = new int[p, p];
        var present = new bool[p];
        data.ForEachBlock(PairwiseBlockRows, (v, rows) =>
        {
            for (int o = 0; o < rows * p; o += p)
            {
                for (int j = 0; j < p; j++) present[j] = !double.IsNaN(v[o + j]);
                for (int j = 0; j < p; j++)
                {
                    if (!present[j]) continue;
                    for (int k = 0; k <= j; k++) if (present[k]) counts[j, k]++;
                }
            }
        });
        for (int j = 0; j < p; j++) for (int k = 0; k < j; k++) counts[k, j] = counts[j, k];
        return counts;
    }
}

/// <summary>Supplies rows first .. first + count − 1 of an n × p data set as a row-major block: either a slice of
/// existing storage or the block decoded into <paramref name="scratch"/> (length ≥ count × p).</summary>
internal delegate ReadOnlySpan<double> RowBlockSource(int first, int count, Span<double> scratch);
