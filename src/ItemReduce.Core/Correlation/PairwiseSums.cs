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
        return Cache.GetValue(data, d => Accumulate(d, maxDegreeOfParallelism));
    }

    private static readonly System.Runtime.CompilerServices.ConditionalWeakTable<ResponseMatrix, PairwiseSums> Cache = new();

    /// <summary>The sums of this very matrix object if an earlier <see cref="Compute"/> left them in the cache; null
    /// otherwise (never computes).</summary>
    public static PairwiseSums? Cached(ResponseMatrix data) => Cache.TryGetValue(data, out var sums) ? sums : null;

    private static PairwiseSums Accumulate(ResponseMatrix data, int maxDegreeOfParallelism)
    {
        int n = data.RespondentCount, p = data.ItemCount, q = 3 * p;
        int tileRows = PearsonCorrelation.TileRows;
        int padded = (q + 3) & ~3;
        var total = PearsonCorrelation.AccumulateSegments(data.Rows, n, p, padded, maxDegreeOfParallelism,
            (block, rows, tile) => FillTile(block, p, rows, tile, tileRows));
        return new PairwiseSums(p, total, padded);
    }

    /// <summary>Writes the variable-major tile of Z = [X₀ | M | X₀²] for a row-major block; unused rows and padding are 0.</summary>
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
