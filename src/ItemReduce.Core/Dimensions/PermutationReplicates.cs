using System.Runtime.CompilerServices;
using System.Runtime.InteropServices;
using System.Runtime.Intrinsics;
using System.Runtime.Intrinsics.X86;
using ItemReduce.Core.Correlation;
using ItemReduce.Core.Data;
using ItemReduce.Core.Randomness;

namespace ItemReduce.Core.Dimensions;

/// <summary>
/// The replicates of the permutation reference of parallel analysis (Buja &amp; Eyuboglu, 1992, "Remarks on parallel
/// analysis", Multivariate Behavioral Research 27(4), 509–540: every item's answers shuffled independently across
/// respondents, missing answers moving with them) for compact integer answers, computed without a permuted copy of the
/// survey per replicate. Each worker holds one column-major byte copy (n × p bytes); a replicate shuffles every column
/// in place with exactly the Fisher–Yates draws of the plain implementation (<see cref="RandomStream.Shuffle{T}"/>
/// on item j = 0, 1, … of the stream of the replicate), so the permuted data are the same as there, and then
/// <list type="bullet">
/// <item>Pearson: the cross-products Σ w_j w_k of the shifted answers w = x − min + 1 (missing → 0) are accumulated
/// exactly in integers by a byte kernel (8-bit multiplies with 16- and 32-bit sums, flushed before they can overflow),
/// in tiles of rows that stay in cache. The pairwise-complete counts, sums and sums of squares follow from the column
/// totals (which a permutation does not change) minus the few respondents with a missing answer, gathered per row;
/// the correlations are then formed exactly as <see cref="PearsonCorrelation"/> forms them from exact integer sums
/// (m·C_jk = m·P_jk − S_j|k S_k|j in 128-bit integers, one rounding), common practice, no source.</item>
/// <item>Polychoric: the contingency table of every pair is counted from bit sets of the categories of the permuted
/// items (one AND and population count per 64 respondents and cell); the thresholds of an item without missing answers
/// are the same in every replicate and are computed once; each table's two-step estimate is taken by
/// <see cref="TetrachoricSeries"/> (the same maximum-likelihood estimate as <see cref="PolychoricCorrelation"/>).</item>
/// </list>
/// A random table with the pair's margins is not used: it has the right distribution for one pair, but
/// the tables of pairs that share an item are not independent in permuted data, and the eigenvalues depend on that.
/// Every sum is an exact integer, so the result does not depend on the order of summation or the number of threads.
/// </summary>
internal sealed class PermutationReplicates
{
    /// <summary>Rows per tile of the cross-product kernel (p × 4096 bytes stay in the second-level cache).</summary>
    private const int TileRows = 4096;

    /// <summary>Rows per block of the missing-answer pass (transposed to a small row-major block).</summary>
    private const int MissingBlockRows = 64;

    /// <summary>Largest shifted answer w the byte kernel takes (it multiplies unsigned by signed bytes).</summary>
    internal const int MaxShifted = 127;

    private readonly int _n, _p, _nPad, _pp, _pr, _flush;

    /// <summary>The polychoric variant: item j's column holds its category numbers (0 … c_j − 1, 255 missing).</summary>
    internal static PermutationReplicates ForCategories(int n, byte[][] categories, PolychoricTables tables)
        => new(n, categories.Length, categories, 1, tables);
    private readonly byte[][] _shifted;      // item j: w of every respondent in row order (0 = missing)
    private readonly long[] _total, _totalSquares;
    private readonly int[] _missing;
    private readonly bool _anyMissing;
    private readonly PolychoricTables? _polychoric;

    private PermutationReplicates(int n, int p, byte[][] shifted, int maxShifted, PolychoricTables? polychoric = null)
    {
        _polychoric = polychoric;
        _n = n;
        _p = p;
        _nPad = (n + 63) & ~63;
        _pp = (p + 3) & ~3;
        _pr = (p + 31) & ~31;
        _shifted = shifted;
        _flush = Math.Max(1, short.MaxValue / (2 * maxShifted * maxShifted));
        _total = new long[p];
        _totalSquares = new long[p];
        _missing = new int[p];
        for (int j = 0; j < p && polychoric is null; j++)
            foreach (byte w in shifted[j])
            {
                _total[j] += w;
                _totalSquares[j] += w * w;
                if (w == 0) _missing[j]++;
            }
        _anyMissing = _missing.Any(m => m > 0);
    }

    /// <summary>The fast path for <paramref name="data"/> correlated as <paramref name="correlation"/> says, or null
    /// when it does not apply (dense storage, non-integer answers, answers spanning more than
    /// <see cref="MaxShifted"/> − 1 points, listwise deletion, polychoric correlations, or sums that could overflow).</summary>
    internal static PermutationReplicates? TryCreate(ResponseMatrix data, CorrelationOptions correlation)
    {
        if (correlation.MissingData == MissingDataHandling.Listwise && data.HasMissing()) return null;
        if (data.CodeHistogram() is not var (counts, decode, _, _)) return null;
        if (correlation.Kind == CorrelationKind.Polychoric) return PolychoricTables.TryCreate(data, counts, decode);
        if (correlation.Kind != CorrelationKind.Pearson) return null;
        int n = data.RespondentCount, p = data.ItemCount;
        var table = new byte[p][];
        int widest = 1;
        for (int j = 0; j < p; j++)
        {
            double lo = double.PositiveInfinity, hi = double.NegativeInfinity;
            for (int c = 0; c < ResponseMatrix.TableSize; c++)
            {
                if (counts[j * ResponseMatrix.TableSize + c] == 0) continue;
                double v = decode[j * ResponseMatrix.TableSize + c];
                if (double.IsNaN(v)) continue;
                if (Math.Floor(v) != v) return null;
                lo = Math.Min(lo, v);
                hi = Math.Max(hi, v);
            }
            if (double.IsInfinity(lo)) lo = hi = 0; // an item nobody answered: every w is 0
            if (hi - lo + 1 > MaxShifted) return null;
            widest = Math.Max(widest, (int)(hi - lo + 1));
            table[j] = new byte[ResponseMatrix.TableSize];
            for (int c = 0; c < ResponseMatrix.TableSize; c++)
            {
                double v = decode[j * ResponseMatrix.TableSize + c];
                table[j][c] = double.IsNaN(v) || counts[j * ResponseMatrix.TableSize + c] == 0 ? (byte)0 : (byte)(v - lo + 1);
            }
        }
        // Exact 32-bit partial sums: every per-item total of w² over all rows stays below 2³¹.
        if ((long)n * widest * widest >= int.MaxValue) return null;
        var shifted = new byte[p][];
        for (int j = 0; j < p; j++)
        {
            var codes = data.ColumnCodes(j);
            var map = table[j];
            for (int i = 0; i < n; i++) codes[i] = map[codes[i]];
            shifted[j] = codes;
        }
        return new PermutationReplicates(n, p, shifted, widest);
    }

    /// <summary>Per-thread buffers: the column-major permuted copy and the sums of one replicate.</summary>
    internal sealed class Worker
    {
        internal Worker(PermutationReplicates owner)
        {
            Columns = new byte[(long)owner._pp * owner._nPad];
            if (owner._polychoric is { } tables)
            {
                Tables = tables.NewWorker(Columns, owner._n, owner._nPad);
                Products = [];
                return;
            }
            Products = new long[owner._pp * owner._pp];
            if (owner._anyMissing)
            {
                Block = new byte[MissingBlockRows * owner._pr];
                LessSums = new int[owner._p * owner._pr];
                LessSquares = new int[owner._p * owner._pr];
                BothMissing = new int[owner._p * owner._pr];
                MissingList = new int[owner._p];
            }
        }

        internal byte[] Columns { get; }
        internal long[] Products { get; }
        internal PolychoricTables.Buffers? Tables { get; }
        internal byte[]? Block { get; }
        internal int[]? LessSums { get; }
        internal int[]? LessSquares { get; }
        internal int[]? BothMissing { get; }
        internal int[]? MissingList { get; }
    }

    internal Worker NewWorker() => new(this);

    /// <summary>One replicate: shuffles every item with <paramref name="rng"/> (as the plain implementation does) and
    /// writes the p × p correlation matrix, row-major, into <paramref name="r"/>.</summary>
    internal void Draw(Worker worker, RandomStream rng, double[] r)
    {
        int n = _n, p = _p, nPad = _nPad;
        var cols = worker.Columns;
        for (int j = 0; j < p; j++)
        {
            var column = cols.AsSpan(j * nPad, n);
            _shifted[j].CopyTo(column);
            rng.Shuffle(column);
        }
        if (_polychoric is { } tables)
        {
            tables.Correlations(worker.Tables!, r);
            return;
        }
        var products = worker.Products;
        Array.Clear(products);
        if (Avx2.IsSupported) CrossProductsAvx2(cols, nPad, _pp, _flush, products);
        else CrossProductsScalar(cols, n, nPad, p, _pp, products);
        if (_anyMissing) MissingCorrections(worker);
        Correlations(worker, r);
    }

    /// <summary>Lower triangle of Σ_i w_ij w_ik (leading dimension pp) with 8-bit multiplies: 4 × 2 blocks of items,
    /// 16-bit sums flushed into 32-bit sums every <paramref name="flush"/> steps of 32 rows (before they can saturate),
    /// and 32-bit sums added into 64-bit totals once per tile.</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private static void CrossProductsAvx2(byte[] cols, int nPad, int pp, int flush, long[] acc)
    {
        ref byte c0 = ref MemoryMarshal.GetArrayDataReference(cols);
        var ones = Vector256.Create((short)1);
        int step = flush * 32;
        for (int t0 = 0; t0 < nPad; t0 += TileRows)
        {
            int t1 = Math.Min(nPad, t0 + TileRows);
            for (int j = 0; j < pp; j += 4)
            {
                ref byte a0 = ref Unsafe.Add(ref c0, (nint)j * nPad);
                ref byte a1 = ref Unsafe.Add(ref a0, nPad);
                ref byte a2 = ref Unsafe.Add(ref a1, nPad);
                ref byte a3 = ref Unsafe.Add(ref a2, nPad);
                for (int k = 0; k < j + 4; k += 2)
                {
                    ref byte b0 = ref Unsafe.Add(ref c0, (nint)k * nPad);
                    ref byte b1 = ref Unsafe.Add(ref b0, nPad);
                    Vector256<int> i00 = default, i01 = default, i10 = default, i11 = default,
                                   i20 = default, i21 = default, i30 = default, i31 = default;
                    for (int s = t0; s < t1; s += step)
                    {
                        int e = Math.Min(t1, s + step);
                        Vector256<short> h00 = default, h01 = default, h10 = default, h11 = default,
                                         h20 = default, h21 = default, h30 = default, h31 = default;
                        for (int t = s; t < e; t += 32)
                        {
                            var x0 = Vector256.LoadUnsafe(ref b0, (nuint)t).AsSByte();
                            var x1 = Vector256.LoadUnsafe(ref b1, (nuint)t).AsSByte();
                            var y = Vector256.LoadUnsafe(ref a0, (nuint)t);
                            h00 = Avx2.Add(h00, Avx2.MultiplyAddAdjacent(y, x0));
                            h01 = Avx2.Add(h01, Avx2.MultiplyAddAdjacent(y, x1));
                            y = Vector256.LoadUnsafe(ref a1, (nuint)t);
                            h10 = Avx2.Add(h10, Avx2.MultiplyAddAdjacent(y, x0));
                            h11 = Avx2.Add(h11, Avx2.MultiplyAddAdjacent(y, x1));
                            y = Vector256.LoadUnsafe(ref a2, (nuint)t);
                            h20 = Avx2.Add(h20, Avx2.MultiplyAddAdjacent(y, x0));
                            h21 = Avx2.Add(h21, Avx2.MultiplyAddAdjacent(y, x1));
                            y = Vector256.LoadUnsafe(ref a3, (nuint)t);
                            h30 = Avx2.Add(h30, Avx2.MultiplyAddAdjacent(y, x0));
                            h31 = Avx2.Add(h31, Avx2.MultiplyAddAdjacent(y, x1));
                        }
                        i00 = Avx2.Add(i00, Avx2.MultiplyAddAdjacent(h00, ones));
                        i01 = Avx2.Add(i01, Avx2.MultiplyAddAdjacent(h01, ones));
                        i10 = Avx2.Add(i10, Avx2.MultiplyAddAdjacent(h10, ones));
                        i11 = Avx2.Add(i11, Avx2.MultiplyAddAdjacent(h11, ones));
                        i20 = Avx2.Add(i20, Avx2.MultiplyAddAdjacent(h20, ones));
                        i21 = Avx2.Add(i21, Avx2.MultiplyAddAdjacent(h21, ones));
                        i30 = Avx2.Add(i30, Avx2.MultiplyAddAdjacent(h30, ones));
                        i31 = Avx2.Add(i31, Avx2.MultiplyAddAdjacent(h31, ones));
                    }
                    int o = j * pp + k;
                    acc[o] += Vector256.Sum(i00); acc[o + 1] += Vector256.Sum(i01); o += pp;
                    acc[o] += Vector256.Sum(i10); acc[o + 1] += Vector256.Sum(i11); o += pp;
                    acc[o] += Vector256.Sum(i20); acc[o + 1] += Vector256.Sum(i21); o += pp;
                    acc[o] += Vector256.Sum(i30); acc[o + 1] += Vector256.Sum(i31);
                }
            }
        }
    }

    /// <summary>The same sums without vector instructions.</summary>
    private static void CrossProductsScalar(byte[] cols, int n, int nPad, int p, int pp, long[] acc)
    {
        for (int j = 0; j < p; j++)
            for (int k = 0; k < j; k++)
            {
                var a = cols.AsSpan(j * nPad, n);
                var b = cols.AsSpan(k * nPad, n);
                long s = 0;
                for (int i = 0; i < n; i++) s += a[i] * b[i];
                acc[j * pp + k] = s;
            }
    }

    /// <summary>For every item k and the respondents whose answer to k is missing in this replicate: the sums of w_j and
    /// w_j² over them (LessSums, LessSquares [k, j]) and how many of them also miss j (BothMissing [k, j]). Rows are
    /// read in blocks transposed to row-major bytes; each row adds its answers to the sums of each item it misses.</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private void MissingCorrections(Worker worker)
    {
        int n = _n, p = _p, pr = _pr, nPad = _nPad;
        var cols = worker.Columns;
        var block = worker.Block!;
        var less = worker.LessSums!;
        var lessSq = worker.LessSquares!;
        var both = worker.BothMissing!;
        var list = worker.MissingList!;
        Array.Clear(less);
        Array.Clear(lessSq);
        Array.Clear(both);
        for (int t0 = 0; t0 < n; t0 += MissingBlockRows)
        {
            int rows = Math.Min(MissingBlockRows, n - t0);
            for (int j = 0; j < p; j++)
            {
                var src = cols.AsSpan(j * nPad + t0, rows);
                for (int t = 0, o = j; t < src.Length; t++, o += pr) block[o] = src[t];
            }
            for (int t = 0; t < rows; t++)
            {
                var row = block.AsSpan(t * pr, pr);
                int m = 0;
                for (int j = 0; j < p; j++) if (row[j] == 0) list[m++] = j;
                for (int a = 0; a < m; a++)
                {
                    int k = list[a];
                    AddRow(row, less.AsSpan(k * pr, pr), lessSq.AsSpan(k * pr, pr));
                    for (int b = 0; b < m; b++) both[k * pr + list[b]]++;
                }
            }
        }
    }

    /// <summary>sums[j] += row[j], squares[j] += row[j]² for every j (row length a multiple of 32).</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private static void AddRow(ReadOnlySpan<byte> row, Span<int> sums, Span<int> squares)
    {
        if (Vector256.IsHardwareAccelerated)
        {
            var s = MemoryMarshal.Cast<int, Vector256<int>>(sums);
            var q = MemoryMarshal.Cast<int, Vector256<int>>(squares);
            for (int j = 0, v = 0; j < row.Length; j += 32, v += 4)
            {
                var (lo, hi) = Vector256.Widen(Vector256.Create(row.Slice(j, 32)));
                var (a, b) = Vector256.Widen(lo);
                var (c, d) = Vector256.Widen(hi);
                s[v] += a.AsInt32(); s[v + 1] += b.AsInt32(); s[v + 2] += c.AsInt32(); s[v + 3] += d.AsInt32();
                q[v] += (a * a).AsInt32(); q[v + 1] += (b * b).AsInt32(); q[v + 2] += (c * c).AsInt32(); q[v + 3] += (d * d).AsInt32();
            }
            return;
        }
        for (int j = 0; j < row.Length; j++)
        {
            sums[j] += row[j];
            squares[j] += row[j] * row[j];
        }
    }

    /// <summary>Pairwise-complete correlations from the exact sums (the definition of <see cref="PearsonCorrelation"/>:
    /// the pair's own means, at least 3 joint answers, NaN for zero variance).</summary>
    private void Correlations(Worker worker, double[] r)
    {
        int p = _p, pp = _pp, pr = _pr;
        long n = _n;
        var products = worker.Products;
        for (int j = 0; j < p; j++)
        {
            r[j * p + j] = 1;
            for (int k = 0; k < j; k++)
            {
                long m = n, sj = _total[j], sk = _total[k], qj = _totalSquares[j], qk = _totalSquares[k];
                if (_anyMissing)
                {
                    m = n - _missing[j] - _missing[k] + worker.BothMissing![j * pr + k];
                    sj -= worker.LessSums![k * pr + j];
                    sk -= worker.LessSums[j * pr + k];
                    qj -= worker.LessSquares![k * pr + j];
                    qk -= worker.LessSquares[j * pr + k];
                }
                double value = double.NaN;
                if (m >= 3)
                {
                    Int128 cjk = m * (Int128)products[j * pp + k] - (Int128)sj * sk;
                    Int128 cjj = m * (Int128)qj - (Int128)sj * sj;
                    Int128 ckk = m * (Int128)qk - (Int128)sk * sk;
                    double den = Math.Sqrt((double)cjj * (double)ckk);
                    if (den > 0) value = (double)cjk / den;
                }
                r[j * p + k] = value;
                r[k * p + j] = value;
            }
        }
    }
}
