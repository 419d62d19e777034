using System.Runtime.CompilerServices;
using System.Runtime.Intrinsics;
using ItemReduce.Core.Data;

namespace ItemReduce.Core.Correlation;

/// <summary>
/// Exact pairwise-complete sums of integer-valued answers, for every item pair at once, as cross-products of
/// stacked indicator matrices (common practice, no source): with X₀ the answers (missing → 0), M the answered
/// indicators (1/0) and X₀² the squared answers, the matrix Zᵀ Z of Z = [X₀ | M | X₀²] contains
/// <list type="bullet">
/// <item><c>Count[j, k] = Σ_i M_ij M_ik</c> (respondents answering both),</item>
/// <item><c>Sum[j, k] = Σ_i X_ij M_ik</c> (sum of item j over respondents answering j and k),</item>
/// <item><c>SumSquares[j, k] = Σ_i X_ij² M_ik</c>,</item>
/// <item><c>Product[j, k] = Σ_i X_ij X_ik</c> (over respondents answering both).</item>
/// </list>
/// Zᵀ Z is accumulated by the tiled kernel of <see cref="PearsonCorrelation"/>. All terms are integers and every
/// partial sum stays below 2⁵³ (checked by <see cref="Applies"/>), so the sums are exact whatever the summation
/// order or thread count. The pairwise-complete centred moments then follow exactly from
/// <c>m·C_jk = m·P_jk − S_jk·S_kj</c> in 128-bit integers, with a single rounding at the end.
/// </summary>
internal sealed class PairwiseSums
{
    private readonly int _p;
    private readonly double[] _zz;   // lower triangle of Zᵀ Z, leading dimension _padded
    private readonly int _padded;

    private PairwiseSums(int p, double[] zz, int padded)
    {
        _p = p;
        _zz = zz;
        _padded = padded;
    }

    /// <summary>Largest |answer|^2 · n for which every sum of Zᵀ Z that we use is an exact double (with a margin).</summary>
    private const double ExactLimit = 1L << 50;

    /// <summary>True when the data are compact, integer-valued and small enough for exact double sums.</summary>
    public static bool Applies(ResponseMatrix data)
    {
        if (data.IntegerMagnitudeBound() is not double b) return false;
        double big = Math.Max(b, 1);
        // Sum of squares and products: n · b²; the unused X₀²ᵀX₀² block may be inexact, which does not matter.
        return (double)data.RespondentCount * big * big < ExactLimit;
    }

    /// <summary>Respondents answering items j and k.</summary>
    public long Count(int j, int k) => (long)(j >= k ? At(_p + j, _p + k) : At(_p + k, _p + j));

    /// <summary>Σ of item j over respondents answering j and k.</summary>
    public long Sum(int j, int k) => (long)At(_p + k, j);

    /// <summary>Σ of item j squared over respondents answering j and k.</summary>
    public long SumSquares(int j, int k) => (long)At(2 * _p + j, _p + k);

    /// <summary>Σ x_j x_k over respondents answering j and k.</summary>
    public long Product(int j, int k) => (long)(j >= k ? At(j, k) : At(k, j));

    /// <summary><c>m · Σ (x_j − x̄_j|jk)(x_k − x̄_k|jk)</c> over the m respondents answering both, exactly
    /// (the means are the pair's own; j = k gives m · Σ (x_j − x̄_j)²).</summary>
    public Int128 ScaledCentredProduct(int j, int k)
    {
        long m = Count(j, k);
        Int128 sp = j == k ? SumSquares(j, j) : Product(j, k);
        return m * sp - (Int128)Sum(j, k) * Sum(k, j);
    }

    /// <summary><c>m · Σ (x_j − x̄_j|jk)²</c> over the respondents answering j and k, exactly.</summary>
    public Int128 ScaledCentredSquares(int j, int k)
    {
        long m = Count(j, k);
        return m * (Int128)SumSquares(j, k) - (Int128)Sum(j, k) * Sum(j, k);
    }

    private double At(int row, int col) => _zz[row * _padded + col];

    /// <summary>Accumulates Zᵀ Z over all rows (parallel over fixed row segments; exact, so the result does not
    /// depend on the thread count). Call only when <see cref="Applies"/> is true.</summary>
    public static PairwiseSums Compute(ResponseMatrix data, int maxDegreeOfParallelism)
    {
        // Matrices are immutable, so sums computed once for a matrix (dimensions, pairwise counts and the short form
        // all use the same analysed matrix) can be reused; the table holds its keys weakly.
        return Cache.GetValue(data, d => FromParent(d, maxDegreeOfParallelism) ?? Accumulate(d, maxDegreeOfParallelism));
    }

    /// <summary>
    /// For a respondent subset of a matrix whose sums are already known (the respondents kept after screening): the
    /// parent's sums minus those of the rows left out, when fewer rows are left out than kept. Every entry is an exact
    /// integer, so the difference equals the directly accumulated sum bit for bit. Null when this does not apply.
    /// </summary>
    private static PairwiseSums? FromParent(ResponseMatrix data, int maxDegreeOfParallelism)
    {
        if (data.Selection is not var (parent, rows) || !Cache.TryGetValue(parent, out var whole)) return null;
        int n = parent.RespondentCount;
        var kept = new bool[n];
        foreach (int i in rows)
        {
            if (kept[i]) return null; // a row chosen twice: not a subset
            kept[i] = true;
        }
        var left = new List<int>(n - rows.Length);
        for (int i = 0; i < n; i++) if (!kept[i]) left.Add(i);
        if (left.Count >= rows.Length) return null;
        var zz = (double[])whole._zz.Clone();
        if (left.Count > 0)
        {
            var removed = Accumulate(parent.SelectRespondents(left), maxDegreeOfParallelism);
            for (int t = 0; t < zz.Length; t++) zz[t] -= removed._zz[t];
        }
        return new PairwiseSums(whole._p, zz, whole._padded);
    }

    private static readonly System.Runtime.CompilerServices.ConditionalWeakTable<ResponseMatrix, PairwiseSums> Cache = new();

    /// <summary>Largest share of missing cells for which <see cref="AccumulateFewMissing"/> is used: its corrections cost
    /// about 3 m p scalar operations for a row missing m answers, against about 4 p² vector operations saved per row.</summary>
    internal const double FewMissingShare = 0.05;

    /// <summary>The sums of this very matrix object if an earlier <see cref="Compute"/> left them in the cache; null
    /// otherwise (never computes).</summary>
    public static PairwiseSums? Cached(ResponseMatrix data) => Cache.TryGetValue(data, out var sums) ? sums : null;

    private static PairwiseSums Accumulate(ResponseMatrix data, int maxDegreeOfParallelism)
    {
        if (MissingShare(data) <= FewMissingShare) return AccumulateFewMissing(data, maxDegreeOfParallelism);
        return AccumulateStacked(data, maxDegreeOfParallelism);
    }

    /// <summary>Share of missing cells among up to 4096 evenly spaced rows. Only the choice of route depends on it, and
    /// both routes give the same exact sums, so an estimate is enough (and it is deterministic).</summary>
    private static double MissingShare(ResponseMatrix data)
    {
        int n = data.RespondentCount, p = data.ItemCount;
        if (n == 0 || p == 0) return 0;
        int step = Math.Max(1, n / 4096);
        var row = new double[p];
        long missing = 0, cells = 0;
        for (int i = 0; i < n; i += step)
        {
            data.CopyRow(i, row);
            foreach (double x in row) if (double.IsNaN(x)) missing++;
            cells += p;
        }
        return missing / (double)cells;
    }

    /// <summary>
    /// The same sums for data with few missing answers, without the stacked matrix: only <c>X₀ᵀ X₀</c> goes through the
    /// tiled kernel; the other blocks start from the column totals and subtract, for every missing answer of item k, the
    /// respondent's other answers (<c>Sum[j, k] = Σ_i X_ij − Σ_{i: k missing} X_ij</c>, likewise for squares and counts).
    /// Every term is an integer, so the entries equal those of <see cref="AccumulateStacked"/> exactly.
    /// </summary>
    internal static PairwiseSums AccumulateFewMissing(ResponseMatrix data, int maxDegreeOfParallelism)
    {
        int n = data.RespondentCount, p = data.ItemCount, tileRows = PearsonCorrelation.TileRows;
        int pp = (p + 3) & ~3;
        var products = PearsonCorrelation.AccumulateSegments(data.Rows, n, p, pp, maxDegreeOfParallelism,
            (block, rows, tile) => FillAnswerTile(block, p, rows, tile, tileRows));
        // Column totals and corrections, per fixed row segment. Every partial sum is an integer below 2⁵³ (Applies), so
        // double accumulators are exact and the merge order does not matter.
        var total = new double[3 * pp];       // Σ x, Σ x², answers; per item (blocks of pp)
        var removed = new double[3 * p * p];  // [(s · p + k) · p + j]: Σ over rows missing k of x_j, x_j², 1 (s = 0, 1, 2)
        var gate = new Lock();
        const int segmentRows = 1 << 15;
        var options = new ParallelOptions { MaxDegreeOfParallelism = maxDegreeOfParallelism };
        int width = Vector256<double>.Count;
        Parallel.For(0, (n + segmentRows - 1) / segmentRows, options, [MethodImpl(MethodImplOptions.AggressiveOptimization)] (seg) =>
        {
            var t = new double[3 * pp];
            var r = new double[3 * p * p];
            var scratch = new double[tileRows * p];
            var skipped = new int[p];
            int end = Math.Min(n, (seg + 1) * segmentRows);
            for (int i0 = seg * segmentRows; i0 < end; i0 += tileRows)
            {
                int rows = Math.Min(tileRows, end - i0);
                var v = data.Rows(i0, rows, scratch);
                for (int o = 0; o < rows * p; o += p)
                {
                    var row = v.Slice(o, p);
                    int j = 0;
                    // Totals a vector of items at a time; a missing answer adds exactly 0.
                    for (; j + width <= p; j += width)
                    {
                        var x = Vector256.Create(row.Slice(j, width));
                        var nan = Vector256.IsNaN(x);
                        var x0 = Vector256.ConditionalSelect(nan, Vector256<double>.Zero, x);
                        (Vector256.Create(t.AsSpan(j, width)) + x0).CopyTo(t.AsSpan(j, width));
                        (Vector256.Create(t.AsSpan(pp + j, width)) + x0 * x0).CopyTo(t.AsSpan(pp + j, width));
                        (Vector256.Create(t.AsSpan(2 * pp + j, width)) + Vector256.ConditionalSelect(nan, Vector256<double>.Zero, Vector256<double>.One))
                            .CopyTo(t.AsSpan(2 * pp + j, width));
                    }
                    int m = 0;
                    for (int q = 0; q < j; q++) if (double.IsNaN(row[q])) skipped[m++] = q;
                    for (; j < p; j++)
                    {
                        double x = row[j];
                        if (double.IsNaN(x)) { skipped[m++] = j; continue; }
                        t[j] += x;
                        t[pp + j] += x * x;
                        t[2 * pp + j]++;
                    }
                    for (int q = 0; q < m; q++)
                    {
                        int k = skipped[q];
                        for (int c = 0; c < p; c++)
                        {
                            double x = row[c];
                            if (double.IsNaN(x)) continue;
                            r[k * p + c] += x;
                            r[(p + k) * p + c] += x * x;
                            r[(2 * p + k) * p + c]++;
                        }
                    }
                }
            }
            lock (gate)
            {
                for (int u = 0; u < t.Length; u++) total[u] += t[u];
                for (int u = 0; u < r.Length; u++) removed[u] += r[u];
            }
        });
        int padded = (3 * p + 3) & ~3;
        var zz = new double[padded * padded];
        for (int j = 0; j < p; j++)
            for (int k = 0; k <= j; k++) zz[j * padded + k] = products[j * pp + k];
        for (int k = 0; k < p; k++)
            for (int j = 0; j < p; j++)
            {
                zz[(p + k) * padded + j] = total[j] - removed[k * p + j];                        // Sum(j, k)
                zz[(2 * p + j) * padded + p + k] = total[pp + j] - removed[(p + k) * p + j];    // SumSquares(j, k)
                if (j >= k) zz[(p + j) * padded + p + k] = total[2 * pp + j] - removed[(2 * p + k) * p + j]; // Count(j, k)
            }
        return new PairwiseSums(p, zz, padded);
    }

    /// <summary>Writes the variable-major tile of X₀ (answers, missing → 0) for a row-major block; unused rows and padding are 0.</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private static void FillAnswerTile(ReadOnlySpan<double> v, int p, int count, double[] tile, int tileRows)
    {
        if (count < tileRows) Array.Clear(tile);
        for (int j = 0; j < p; j++)
        {
            var x = tile.AsSpan(j * tileRows, count);
            for (int t = 0, o = j; t < count; t++, o += p)
            {
                double a = v[o];
                x[t] = double.IsNaN(a) ? 0 : a;
            }
        }
    }

    /// <summary>All sums from the stacked matrix <c>Z = [X₀ | M | X₀²]</c> through the tiled kernel.</summary>
    internal static PairwiseSums AccumulateStacked(ResponseMatrix data, int maxDegreeOfParallelism)
    {
        int n = data.RespondentCount, p = data.ItemCount, q = 3 * p;
        int tileRows = PearsonCorrelation.TileRows;
        int padded = (q + 3) & ~3;
        var total = PearsonCorrelation.AccumulateSegments(data.Rows, n, p, padded, maxDegreeOfParallelism,
            (block, rows, tile) => FillTile(block, p, rows, tile, tileRows));
        return new PairwiseSums(p, total, padded);
    }

    /// <summary>Writes the variable-major tile of Z = [X₀ | M | X₀²] for a row-major block; unused rows and padding are 0.</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private static void FillTile(ReadOnlySpan<double> v, int p, int count, double[] tile, int tileRows)
    {
        if (count < tileRows) Array.Clear(tile);
        for (int j = 0; j < p; j++)
        {
            var x = tile.AsSpan(j * tileRows, count);
            var m = tile.AsSpan((p + j) * tileRows, count);
            var x2 = tile.AsSpan((2 * p + j) * tileRows, count);
            for (int t = 0, o = j; t < count; t++, o += p)
            {
                double a = v[o];
                bool answered = !double.IsNaN(a);
                x[t] = answered ? a : 0;
                m[t] = answered ? 1 : 0;
                x2[t] = answered ? a * a : 0;
            }
        }
    }
}
