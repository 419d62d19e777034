using System.Collections.Concurrent;
using ItemReduce.Core.Data;

namespace ItemReduce.Core.Screening;

/// <summary>
/// Squared Mahalanobis distance <c>D²_i = (x_i − μ)ᵀ Σ⁻¹ (x_i − μ)</c> (Mahalanobis, P. C., 1936, "On the
/// generalised distance in statistics", Proceedings of the National Institute of Sciences of India 2(1), 49–55),
/// for respondents who may have skipped items: D² uses only the items respondent i answered, with the matching
/// sub-vector of μ and sub-matrix of Σ, so under multivariate normality it follows χ² with
/// df = items answered. Each distinct missing-data pattern is factorised (Cholesky) once and cached, up to
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
        const int block = 4096;
        int blocks = (n + block - 1) / block;
        const int lanes = ScreeningCholesky.Lanes;
        Parallel.For(0, blocks, b =>
        {
            var work = new double[_p];
            var diff = new double[_p];
            var row = new double[_p];
            // Complete rows are gathered Lanes at a time (interleaved) and share the full factor.
            var group = new double[_p * lanes];
            var groupWork = new double[_p * lanes];
            var groupRows = new int[lanes];
            var forms = new double[lanes];
            int filled = 0;
            int end = Math.Min(n, (b + 1) * block);
            for (int i = b * block; i < end; i++)
            {
                data.CopyRow(i, row);
                if (_full is null || !IsComplete(row))
                {
                    d2[i] = Row(row, 0, diff, work, out answered[i]);
                    continue;
                }
                for (int j = 0; j < _p; j++) group[j * lanes + filled] = row[j] - _location[j];
                answered[i] = _p;
                groupRows[filled++] = i;
                if (filled < lanes) continue;
                _full.QuadraticForms(group, groupWork, forms);
                for (int k = 0; k < lanes; k++) d2[groupRows[k]] = forms[k];
                filled = 0;
            }
            if (filled > 0)
            {
                for (int j = 0; j < _p; j++)
                    for (int k = filled; k < lanes; k++) group[j * lanes + k] = 0;
                _full!.QuadraticForms(group, groupWork, forms);
                for (int k = 0; k < filled; k++) d2[groupRows[k]] = forms[k];
            }
        });
        return (d2, answered);
    }

    private static bool IsComplete(double[] row)
    {
        foreach (double x in row) if (double.IsNaN(x)) return false;
        return true;
    }

    /// <summary>D² of the row starting at <paramref name="offset"/> of <paramref name="v"/> (NaN = missing);
    /// <paramref name="diff"/> and <paramref name="work"/> are scratch arrays of length p.</summary>
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
