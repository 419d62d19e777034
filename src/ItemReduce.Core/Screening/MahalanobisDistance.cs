using System.Collections.Concurrent;
using System.Runtime.CompilerServices;
using ItemReduce.Core.Data;

namespace ItemReduce.Core.Screening;

/// <summary>
/// Squared Mahalanobis distance <c>D²_i = (x_i − μ)ᵀ Σ⁻¹ (x_i − μ)</c> (Mahalanobis, P. C., 1936, "On the
/// generalised distance in statistics", Proceedings of the National Institute of Sciences of India 2(1), 49–55),
/// for respondents who may have skipped items: D² uses only the items respondent i answered, with the matching
/// sub-vector of μ and sub-matrix of Σ, so under multivariate normality it follows χ² with
/// df = items answered. Rows with a few missing answers use the full matrix's factor and precision matrix
/// (see <see cref="ComputeBlock"/>); other incomplete rows factorise the sub-matrix of their pattern (Cholesky), which is cached up to
/// <see cref="CacheBudgetDoubles"/> stored factor entries (about 32 MB); patterns met after the budget is spent are
/// factorised for each respondent without being stored, so memory stays bounded when nearly every row is unique.
/// A respondent with no answers gets NaN; so does one whose sub-matrix cannot be factorised.
/// </summary>
internal sealed class MahalanobisDistance
{
    private readonly double[] _location;
    private readonly double[] _scatter;
    private readonly int _p;
    private readonly ScreeningCholesky? _full;
    private readonly double[]? _precision;
    private readonly ConcurrentDictionary<string, PatternFactor?> _cache = new(StringComparer.Ordinal);

    /// <summary>Pattern cache keyed by the answered-item bit mask, used instead of <see cref="_cache"/> when p ≤ 64
    /// (no key string to build per respondent).</summary>
    private readonly ConcurrentDictionary<ulong, PatternFactor?> _maskCache = new();

    private sealed record PatternFactor(int[] Answered, ScreeningCholesky Factor);

    /// <summary>Most factor entries (doubles) kept in the pattern cache.</summary>
    internal const long CacheBudgetDoubles = 4L << 20;

    private long _cachedDoubles;

    /// <param name="location">μ, length p.</param>
    /// <param name="scatter">Σ, p × p symmetric.</param>
    public MahalanobisDistance(double[] location, double[,] scatter)
    {
        _p = location.Length;
        _location = location;
        _scatter = new double[_p * _p];
        for (int j = 0; j < _p; j++)
            for (int k = 0; k < _p; k++) _scatter[j * _p + k] = scatter[j, k];
        _full = ScreeningCholesky.TryFactor(_scatter, _p);
        _precision = _full?.Inverse();
    }

    /// <summary>Number of distinct incomplete missing-data patterns factorised so far.</summary>
    public int CachedPatterns => _cache.Count + _maskCache.Count;

    /// <summary>Number of patterns whose sub-matrix was not positive definite.</summary>
    public int FailedPatterns => _cache.Values.Count(f => f is null) + _maskCache.Values.Count(f => f is null);

    /// <summary>True when the full matrix could be factorised.</summary>
    public bool FullFactorAvailable => _full is not null;

    /// <summary>
    /// D² of every row of <paramref name="data"/> (n × p) and the number of items each row answered.
    /// Rows are decoded and processed in parallel blocks; the result does not depend on the thread count.
    /// </summary>
    public (double[] D2, int[] Answered) Compute(ResponseMatrix data)
    {
        int n = data.RespondentCount;
        if (data.ItemCount != _p) throw new ArgumentException($"data has {data.ItemCount} items, the distance {_p}.", nameof(data));
        var d2 = new double[n];
        var answered = new int[n];
        int blocks = (n + BlockRows - 1) / BlockRows;
        Parallel.For(0, blocks, () => (Scratch: new Scratch(_p), Rows: new double[BlockRows * _p]), (b, _, local) =>
        {
            int first = b * BlockRows, count = Math.Min(BlockRows, n - first);
            var rows = data.Rows(first, count, local.Rows);
            ComputeBlock(rows, count, d2.AsSpan(first, count), answered.AsSpan(first, count), local.Scratch);
            return local;
        }, _ => { });
        return (d2, answered);
    }

    /// <summary>Rows per block of <see cref="Compute"/>.</summary>
    internal const int BlockRows = 2048;

    /// <summary>Most missing answers for which an incomplete row uses the precision-matrix route (see <see cref="ComputeBlock"/>).</summary>
    internal const int MaxRouteMissing = 8;

    /// <summary>The precision-matrix route is trusted only when <c>D²</c> is at least this share of the complete-vector
    /// form it is computed from (otherwise cancellation could cost digits and the row's own factor is used).</summary>
    internal const double RouteCancellationLimit = 1e-6;

    /// <summary>Scratch arrays of one worker of <see cref="ComputeBlock"/>.</summary>
    internal sealed class Scratch(int p)
    {
        private const int L = ScreeningCholesky.Lanes;
        public readonly double[] Diff = new double[p], Work = new double[p], Row = new double[p];
        public readonly double[] Group = new double[p * L], GroupWork = new double[p * L], Forms = new double[L];
        public readonly int[] GroupRows = new int[L];
        public readonly double[] Open = new double[p * L], OpenWork = new double[p * L], OpenSolved = new double[p * L], OpenForms = new double[L];
        public readonly int[] OpenRows = new int[L], OpenMissing = new int[L * MaxRouteMissing], OpenMissingCount = new int[L];
        public readonly double[] Small = new double[MaxRouteMissing * MaxRouteMissing], SmallRhs = new double[MaxRouteMissing];
    }

    /// <summary>
    /// D² and items answered for <paramref name="count"/> consecutive rows of a row-major block (NaN = missing).
    /// Complete rows share the full factor, <see cref="ScreeningCholesky.Lanes"/> at a time. A row missing m items
    /// (1 ≤ m ≤ <see cref="MaxRouteMissing"/>) takes the precision-matrix route instead of factorising its own
    /// sub-matrix: with the missing entries of the centred vector set to 0 (y), <c>Ω = Σ⁻¹</c> and M the missing
    /// items, <c>D² = yᵀΩy − (Ωy)_Mᵀ (Ω_MM)⁻¹ (Ωy)_M</c>, which equals the quadratic form in the answered block
    /// <c>y_Sᵀ Σ_SS⁻¹ y_S</c> (inverse of a partitioned matrix, Schur complement; standard identity, common practice,
    /// no source). <c>yᵀΩy = ‖L⁻¹y‖²</c> and <c>Ωy = L⁻ᵀL⁻¹y</c> come from the full factor; when the subtraction would
    /// cancel more than six digits, or <c>Ω_MM</c> cannot be factorised, the row falls back to its own factor.
    /// Each row's arithmetic depends only on that row, so results do not depend on blocking or thread count.
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    internal void ComputeBlock(ReadOnlySpan<double> rows, int count, Span<double> d2, Span<int> answered, Scratch s)
    {
        const int lanes = ScreeningCholesky.Lanes;
        int filled = 0, open = 0;
        for (int r = 0; r < count; r++)
        {
            var row = rows.Slice(r * _p, _p);
            int missing = 0;
            for (int j = 0; j < _p; j++) if (double.IsNaN(row[j])) missing++;
            answered[r] = _p - missing;
            if (_full is not null && missing == 0)
            {
                for (int j = 0; j < _p; j++) s.Group[j * lanes + filled] = row[j] - _location[j];
                s.GroupRows[filled++] = r;
                if (filled == lanes) { FlushComplete(s, lanes, d2); filled = 0; }
            }
            else if (_precision is not null && missing <= MaxRouteMissing && missing < _p)
            {
                int m = 0;
                for (int j = 0; j < _p; j++)
                {
                    bool skipped = double.IsNaN(row[j]);
                    s.Open[j * lanes + open] = skipped ? 0 : row[j] - _location[j];
                    if (skipped) s.OpenMissing[open * MaxRouteMissing + m++] = j;
                }
                s.OpenMissingCount[open] = m;
                s.OpenRows[open++] = r;
                if (open == lanes) { FlushIncomplete(s, lanes, rows, d2); open = 0; }
            }
            else
            {
                row.CopyTo(s.Row);
                d2[r] = Row(s.Row, 0, s.Diff, s.Work, out _);
            }
        }
        if (filled > 0) FlushComplete(s, filled, d2);
        if (open > 0) FlushIncomplete(s, open, rows, d2);
    }

    /// <summary>D² of the first <paramref name="used"/> queued complete rows (unused lanes are zero-filled).</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private void FlushComplete(Scratch s, int used, Span<double> d2)
    {
        const int lanes = ScreeningCholesky.Lanes;
        if (used < lanes)
            for (int j = 0; j < _p; j++)
                for (int k = used; k < lanes; k++) s.Group[j * lanes + k] = 0;
        _full!.QuadraticForms(s.Group, s.GroupWork, s.Forms);
        for (int k = 0; k < used; k++) d2[s.GroupRows[k]] = s.Forms[k];
    }

    /// <summary>D² of the first <paramref name="used"/> queued incomplete rows by the precision-matrix route.</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private void FlushIncomplete(Scratch s, int used, ReadOnlySpan<double> rows, Span<double> d2)
    {
        const int lanes = ScreeningCholesky.Lanes;
        if (used < lanes)
            for (int j = 0; j < _p; j++)
                for (int k = used; k < lanes; k++) s.Open[j * lanes + k] = 0;
        _full!.QuadraticForms(s.Open, s.OpenWork, s.OpenForms);   // ‖L⁻¹y‖², leaves L⁻¹y in OpenWork
        _full.BackSubstitutions(s.OpenWork, s.OpenSolved);         // Ωy
        for (int k = 0; k < used; k++)
        {
            int m = s.OpenMissingCount[k];
            var idx = s.OpenMissing.AsSpan(k * MaxRouteMissing, m);
            for (int a = 0; a < m; a++)
            {
                s.SmallRhs[a] = s.OpenSolved[idx[a] * lanes + k];
                for (int b = 0; b < m; b++) s.Small[a * m + b] = _precision![idx[a] * _p + idx[b]];
            }
            double full = s.OpenForms[k];
            double value = full - SmallQuadraticForm(s.Small, s.SmallRhs, m);
            int r = s.OpenRows[k];
            if (value >= RouteCancellationLimit * full && double.IsFinite(value))
            {
                d2[r] = value;
                continue;
            }
            rows.Slice(r * _p, _p).CopyTo(s.Row);
            d2[r] = Row(s.Row, 0, s.Diff, s.Work, out _);
        }
    }

    /// <summary><c>vᵀ A⁻¹ v</c> for a small SPD matrix (row-major m × m, overwritten by its Cholesky factor); NaN when
    /// A is not positive definite.</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private static double SmallQuadraticForm(double[] a, double[] v, int m)
    {
        double sum = 0;
        for (int i = 0; i < m; i++)
        {
            for (int j = 0; j <= i; j++)
            {
                double t = a[i * m + j];
                for (int k = 0; k < j; k++) t -= a[i * m + k] * a[j * m + k];
                if (i == j)
                {
                    if (!(t > 0)) return double.NaN;
                    a[i * m + i] = Math.Sqrt(t);
                }
                else a[i * m + j] = t / a[j * m + j];
            }
            double z = v[i];
            for (int k = 0; k < i; k++) z -= a[i * m + k] * v[k];
            z /= a[i * m + i];
            v[i] = z;   // forward substitution in place: v becomes L⁻¹v row by row
            sum += z * z;
        }
        return sum;
    }

    /// <summary>D² of the row starting at <paramref name="offset"/> of <paramref name="v"/> (NaN = missing);
    /// <paramref name="diff"/> and <paramref name="work"/> are scratch arrays of length p.</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public double Row(double[] v, int offset, double[] diff, double[] work, out int answered)
    {
        answered = 0;
        ulong mask = 0;
        for (int j = 0; j < _p; j++)
            if (!double.IsNaN(v[offset + j])) { answered++; mask |= 1UL << (j & 63); }
        if (answered == 0) return double.NaN;
        if (answered == _p)
        {
            if (_full is null) return double.NaN;
            for (int j = 0; j < _p; j++) diff[j] = v[offset + j] - _location[j];
            return _full.QuadraticForm(diff, work);
        }
        var x = new ReadOnlySpan<double>(v, offset, _p);
        PatternFactor? factor;
        if (_p <= 64)
        {
            if (!_maskCache.TryGetValue(mask, out factor))
            {
                factor = FactorPattern(x);
                if (TryReserve(answered) && !_maskCache.TryAdd(mask, factor)) Release(answered);
            }
        }
        else
        {
            string key = PatternKey(x);
            if (!_cache.TryGetValue(key, out factor))
            {
                factor = FactorPattern(x);
                if (TryReserve(answered) && !_cache.TryAdd(key, factor)) Release(answered);
            }
        }
        if (factor is null) return double.NaN;
        var idx = factor.Answered;
        for (int t = 0; t < idx.Length; t++) diff[t] = v[offset + idx[t]] - _location[idx[t]];
        return factor.Factor.QuadraticForm(diff, work);
    }

    /// <summary>Reserves room for a factor of order <paramref name="q"/> in the cache budget; false when it is spent.</summary>
    private bool TryReserve(int q)
    {
        long size = (long)q * q;
        if (Interlocked.Read(ref _cachedDoubles) + size > CacheBudgetDoubles) return false;
        Interlocked.Add(ref _cachedDoubles, size);
        return true;
    }

    private void Release(int q) => Interlocked.Add(ref _cachedDoubles, -(long)q * q);

    private PatternFactor? FactorPattern(ReadOnlySpan<double> x)
    {
        var idx = new List<int>(_p);
        for (int j = 0; j < _p; j++) if (!double.IsNaN(x[j])) idx.Add(j);
        int q = idx.Count;
        var sub = new double[q * q];
        for (int a = 0; a < q; a++)
            for (int b = 0; b < q; b++) sub[a * q + b] = _scatter[idx[a] * _p + idx[b]];
        var f = ScreeningCholesky.TryFactor(sub, q);
        return f is null ? null : new PatternFactor(idx.ToArray(), f);
    }

    /// <summary>The answered/missing pattern packed 16 items per character.</summary>
    private string PatternKey(ReadOnlySpan<double> x)
    {
        int len = (_p + 15) / 16;
        Span<char> chars = len <= 256 ? stackalloc char[len] : new char[len];
        chars.Clear();
        for (int j = 0; j < _p; j++)
            if (!double.IsNaN(x[j])) chars[j >> 4] = (char)(chars[j >> 4] | (1 << (j & 15)));
        return new string(chars);
    }
}
