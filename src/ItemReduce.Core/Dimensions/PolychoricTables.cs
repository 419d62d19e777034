using System.Numerics;
using System.Runtime.CompilerServices;
using System.Runtime.Intrinsics;
using System.Runtime.Intrinsics.X86;
using ItemReduce.Core.Correlation;
using ItemReduce.Core.Data;

namespace ItemReduce.Core.Dimensions;

/// <summary>
/// Polychoric correlations of permuted items for <see cref="PermutationReplicates"/>: the same definition as
/// <see cref="PolychoricCorrelation"/> (categories = an item's distinct observed values in ascending order, pairwise
/// deletion, empty categories of a pair dropped, thresholds from the pair's margins, Olsson's two-step estimate), with
/// the contingency tables counted from bit sets (the respondents in each category of each permuted item, 64 to a word:
/// a cell is the population count of the AND of two bit sets) and the estimates taken by <see cref="TetrachoricSeries"/>,
/// which falls back to the general estimate when it does not apply. For two items without missing answers the pair's
/// margins are the items' own category counts, which a permutation does not change, so their thresholds and series
/// differences are computed once; the last row and column of such a table follow from the margins.
/// </summary>
internal sealed class PolychoricTables
{
    private const byte Missing = ResponseMatrix.MissingCode;
    private const byte Padding = Missing - 1;

    private readonly int _p, _words, _slots;
    private readonly int[] _levels;
    private readonly long[][] _counts;
    private readonly bool[] _complete;
    private readonly double[]?[] _proportions, _differences;

    private PolychoricTables(int n, int[] levels, long[][] counts, bool[] complete)
    {
        _p = levels.Length;
        _words = (n + 63) / 64;
        _levels = levels;
        _slots = levels.Max();
        _counts = counts;
        _complete = complete;
        _proportions = new double[]?[_p];
        _differences = new double[]?[_p];
        for (int j = 0; j < _p; j++)
        {
            if (!complete[j] || levels[j] < 2) continue;
            _proportions[j] = counts[j].Select(c => (double)c / n).ToArray();
            _differences[j] = TetrachoricSeries.Differences(PolychoricCorrelation.Thresholds(counts[j]));
        }
    }

    /// <summary>The polychoric replicates of compact data (codes, their counts and decoding tables per item), or null
    /// when an item has more than <see cref="PolychoricCorrelation.MaxCategories"/> distinct values (the plain path
    /// then reports it).</summary>
    internal static PermutationReplicates? TryCreate(ResponseMatrix data, long[] codeCounts, double[] decode)
    {
        int n = data.RespondentCount, p = data.ItemCount, size = ResponseMatrix.TableSize;
        var categories = new byte[p][];
        var levels = new int[p];
        var counts = new long[p][];
        var complete = new bool[p];
        for (int j = 0; j < p; j++)
        {
            var present = Enumerable.Range(0, size)
                .Where(c => codeCounts[j * size + c] > 0 && !double.IsNaN(decode[j * size + c]))
                .OrderBy(c => decode[j * size + c]).ToArray();
            var values = present.Select(c => decode[j * size + c]).Distinct().ToArray();
            if (values.Length > PolychoricCorrelation.MaxCategories) return null;
            var map = new byte[size];
            Array.Fill(map, Missing);
            foreach (int c in present) map[c] = (byte)Array.IndexOf(values, decode[j * size + c]);
            var column = data.ColumnCodes(j);
            var count = new long[Math.Max(values.Length, 1)];
            bool none = true;
            for (int i = 0; i < n; i++)
            {
                byte k = map[column[i]];
                column[i] = k;
                if (k == Missing) none = false;
                else count[k]++;
            }
            categories[j] = column;
            levels[j] = Math.Max(values.Length, 1);
            counts[j] = count;
            complete[j] = none;
        }
        return PermutationReplicates.ForCategories(n, categories, new PolychoricTables(n, levels, counts, complete));
    }

    /// <summary>Per-thread buffers: the bit sets of one replicate and a table.</summary>
    internal sealed class Buffers(byte[] columns, int nPad, ulong[] bits, int cells)
    {
        internal byte[] Columns { get; } = columns;
        internal int ColumnStride { get; } = nPad;
        internal ulong[] Bits { get; } = bits;
        internal int[] Table { get; } = new int[cells];
        internal int[] Compact { get; } = new int[cells];
        internal long[] RowTotals { get; } = new long[PolychoricCorrelation.MaxCategories];
        internal long[] ColumnTotals { get; } = new long[PolychoricCorrelation.MaxCategories];
    }

    /// <summary>Buffers over a worker's column-major copy (item j at [j·nPad, j·nPad + n)); the padding past n is
    /// marked so that it falls in no category.</summary>
    internal Buffers NewWorker(byte[] columns, int n, int nPad)
    {
        for (int j = 0; j < _p; j++) columns.AsSpan(j * nPad + n, nPad - n).Fill(Padding);
        return new Buffers(columns, nPad, new ulong[(long)_p * _slots * _words], _slots * _slots);
    }

    /// <summary>The polychoric correlation matrix (row-major) of the permuted categories in the worker's columns.</summary>
    internal void Correlations(Buffers b, double[] r)
    {
        FillBits(b);
        int p = _p;
        for (int j = 0; j < p; j++)
        {
            r[j * p + j] = 1;
            for (int k = 0; k < j; k++)
            {
                double rho = Pair(b, j, k);
                r[j * p + k] = rho;
                r[k * p + j] = rho;
            }
        }
    }

    /// <summary>Bit set of category a of item j at [(j·slots + a)·words, …): bit i set when respondent i gave it.</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private void FillBits(Buffers b)
    {
        int words = _words, nPad = b.ColumnStride;
        var bits = b.Bits;
        for (int j = 0; j < _p; j++)
        {
            var column = b.Columns.AsSpan(j * nPad, nPad);
            int levels = _levels[j], first = j * _slots * words;
            for (int w = 0; w < words; w++)
            {
                var lo = Vector256.Create<byte>(column.Slice(w * 64, 32));
                var hi = Vector256.Create<byte>(column.Slice(w * 64 + 32, 32));
                for (int a = 0; a < levels; a++)
                {
                    var c = Vector256.Create((byte)a);
                    bits[first + a * words + w] = Vector256.Equals(lo, c).ExtractMostSignificantBits()
                        | ((ulong)Vector256.Equals(hi, c).ExtractMostSignificantBits() << 32);
                }
            }
        }
    }

    /// <summary>Population count of the AND of two bit sets. With AVX2: the nibble-lookup method of Muła, Kurz &amp;
    /// Lemire (2018), "Faster population counts using AVX2 instructions", The Computer Journal 61(1), 111–120 (byte
    /// counts from two table look-ups per byte, added for at most 31 steps, then summed by vpsadbw).</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private static long AndCount(ulong[] bits, int x, int y, int words)
    {
        var a = bits.AsSpan(x, words);
        var b = bits.AsSpan(y, words);
        long s = 0;
        int w = 0;
        if (Avx2.IsSupported)
        {
            var lookup = Vector256.Create((byte)0, 1, 1, 2, 1, 2, 2, 3, 1, 2, 2, 3, 2, 3, 3, 4, 0, 1, 1, 2, 1, 2, 2, 3, 1, 2, 2, 3, 2, 3, 3, 4);
            var nibble = Vector256.Create((byte)0x0F);
            var total = Vector256<ulong>.Zero;
            int whole = words & ~3;
            while (w < whole)
            {
                int end = Math.Min(whole, w + 4 * 31); // a byte gains at most 8 per step
                var counts = Vector256<byte>.Zero;
                for (; w < end; w += 4)
                {
                    var v = (Vector256.Create<ulong>(a.Slice(w, 4)) & Vector256.Create<ulong>(b.Slice(w, 4))).AsByte();
                    var lo = v & nibble;
                    var hi = Avx2.ShiftRightLogical(v.AsUInt16(), 4).AsByte() & nibble;
                    counts += Avx2.Shuffle(lookup, lo) + Avx2.Shuffle(lookup, hi);
                }
                total += Avx2.SumAbsoluteDifferences(counts, Vector256<byte>.Zero).AsUInt64();
            }
            s = (long)Vector256.Sum(total);
        }
        for (; w < words; w++) s += BitOperations.PopCount(a[w] & b[w]);
        return s;
    }

    /// <summary>Polychoric correlation of items j and k of the permuted data.</summary>
    private double Pair(Buffers b, int j, int k)
    {
        int rows = _levels[j], cols = _levels[k], words = _words;
        int xj = j * _slots * words, xk = k * _slots * words;
        var t = b.Table;
        var bits = b.Bits;
        bool margins = _complete[j] && _complete[k];
        int countedRows = margins ? rows - 1 : rows, countedCols = margins ? cols - 1 : cols;
        for (int a = 0; a < countedRows; a++)
            for (int c = 0; c < countedCols; c++)
                t[a * cols + c] = (int)AndCount(bits, xj + a * words, xk + c * words, words);
        if (margins)
        {
            // Last column from the row margins, then the last row from the column margins.
            for (int a = 0; a < rows - 1; a++)
            {
                long s = _counts[j][a];
                for (int c = 0; c < cols - 1; c++) s -= t[a * cols + c];
                t[a * cols + cols - 1] = (int)s;
            }
            for (int c = 0; c < cols; c++)
            {
                long s = _counts[k][c];
                for (int a = 0; a < rows - 1; a++) s -= t[a * cols + c];
                t[(rows - 1) * cols + c] = (int)s;
            }
            if (rows < 2 || cols < 2) return double.NaN;
            var alpha = _differences[j]!;
            var beta = _differences[k]!;
            return TetrachoricSeries.Estimate(t.AsSpan(0, rows * cols), rows, cols, _proportions[j], _proportions[k], alpha, beta)
                ?? General(t, rows, cols);
        }
        return WithOwnMargins(b, rows, cols);
    }

    /// <summary>A pair with missing answers: margins, empty categories and thresholds from its own table.</summary>
    private static double WithOwnMargins(Buffers b, int rows, int cols)
    {
        var t = b.Table;
        var rowTotals = b.RowTotals;
        var colTotals = b.ColumnTotals;
        Array.Clear(rowTotals);
        Array.Clear(colTotals);
        for (int a = 0; a < rows; a++)
            for (int c = 0; c < cols; c++) { rowTotals[a] += t[a * cols + c]; colTotals[c] += t[a * cols + c]; }
        var keptRows = Enumerable.Range(0, rows).Where(a => rowTotals[a] > 0).ToArray();
        var keptCols = Enumerable.Range(0, cols).Where(c => colTotals[c] > 0).ToArray();
        if (keptRows.Length < 2 || keptCols.Length < 2) return double.NaN;
        int r = keptRows.Length, q = keptCols.Length;
        var compact = b.Compact;
        for (int a = 0; a < r; a++)
            for (int c = 0; c < q; c++) compact[a * q + c] = t[keptRows[a] * cols + keptCols[c]];
        var rowKept = keptRows.Select(a => rowTotals[a]).ToArray();
        var colKept = keptCols.Select(c => colTotals[c]).ToArray();
        double all = rowKept.Sum();
        var alpha = TetrachoricSeries.Differences(PolychoricCorrelation.Thresholds(rowKept));
        var beta = TetrachoricSeries.Differences(PolychoricCorrelation.Thresholds(colKept));
        var pr = rowKept.Select(x => x / all).ToArray();
        var pc = colKept.Select(x => x / all).ToArray();
        return TetrachoricSeries.Estimate(compact.AsSpan(0, r * q), r, q, pr, pc, alpha, beta) ?? General(compact, r, q);
    }

    /// <summary>The general two-step estimate (<see cref="PolychoricCorrelation"/>) of a row-major table.</summary>
    private static double General(int[] table, int rows, int cols)
    {
        var t = new int[rows, cols];
        for (int a = 0; a < rows; a++)
            for (int c = 0; c < cols; c++) t[a, c] = table[a * cols + c];
        return PolychoricCorrelation.EstimateUnchecked(t);
    }
}
