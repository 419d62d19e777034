using System.Runtime.CompilerServices;
using System.Runtime.InteropServices;
using ItemReduce.Core.Data;
using MathNet.Numerics.Distributions;

namespace ItemReduce.Core.Screening;

/// <summary>
/// Rank-based inverse normal transformation of each item, with average ranks for tied answers: an answer whose
/// value has average rank r among the m_j answers to item j becomes <c>Φ⁻¹((r − ½) / m_j)</c>
/// (the rank-based inverse normal transformation with offset ½; Beasley, T. M., Erickson, S., &amp; Allison, D. B.,
/// 2009, "Rank-based inverse normal transformations are increasingly used, but are they merited?", Behavior
/// Genetics 39(5), 580–595, eq. 1 with c = ½). For an ordinal answer v the average rank is
/// <c>#{answers &lt; v} + (#{answers = v} + 1) / 2</c>, so its score is <c>Φ⁻¹((#{&lt; v} + #{= v} / 2) / m_j)</c>:
/// the normal quantile at the middle of the category's cumulative share. Skewed answer distributions then no longer
/// put attentive respondents who use a rare category far out in the tail of the distance, which is what the χ²
/// cutoff assumes. Missing answers stay missing. Order-preserving per item, so run lengths and alternation are
/// unchanged.
/// </summary>
internal sealed class NormalScores
{
    private readonly Dictionary<double, double>[] _maps;
    private readonly double[]?[] _tables;
    private readonly double[] _tableOrigin;
    private readonly double[][] _values;
    private readonly double[][] _shares;

    private NormalScores(Dictionary<double, double>[] maps, double[]?[] tables, double[] tableOrigin, double[][] values, double[][] shares)
    {
        _maps = maps;
        _tables = tables;
        _tableOrigin = tableOrigin;
        _values = values;
        _shares = shares;
    }

    /// <summary>Distinct answers of item <paramref name="j"/> in ascending order and the share of the item's answers
    /// each has.</summary>
    public (double[] Values, double[] Shares) Categories(int j) => (_values[j], _shares[j]);

    /// <summary>Items.</summary>
    public int Items => _maps.Length;

    /// <summary>Most distinct whole-number values per item kept in a lookup table instead of a dictionary.</summary>
    private const int TableRange = 4096;

    /// <summary>Counts every item's distinct answers in <paramref name="data"/> and builds the score maps.</summary>
    public static NormalScores FromData(ResponseMatrix data)
    {
        int p = data.ItemCount;
        var counts = new Dictionary<double, long>[p];
        for (int j = 0; j < p; j++) counts[j] = [];
        if (data.CodeHistogram() is { } histogram)
        {
            var (codeCounts, decode, _, _) = histogram;
            const int t = ResponseMatrix.TableSize;
            for (int j = 0; j < p; j++)
                for (int code = 0; code < t; code++)
                {
                    long c = codeCounts[j * t + code];
                    double v = decode[j * t + code];
                    if (c == 0 || double.IsNaN(v)) continue;
                    counts[j][v] = counts[j].GetValueOrDefault(v) + c;
                }
        }
        else
        {
            data.ForEachBlock(4096, (block, rows) =>
            {
                for (int r = 0; r < rows; r++)
                    for (int j = 0; j < p; j++)
                    {
                        double v = block[r * p + j];
                        if (double.IsNaN(v)) continue;
                        ref long c = ref CollectionsMarshal.GetValueRefOrAddDefault(counts[j], v, out _);
                        c++;
                    }
            });
        }
        return FromCounts(counts);
    }

    /// <summary>Builds the maps from per-item value counts (missing values excluded).</summary>
    internal static NormalScores FromCounts(IReadOnlyList<Dictionary<double, long>> counts)
    {
        int p = counts.Count;
        var maps = new Dictionary<double, double>[p];
        var tables = new double[]?[p];
        var origin = new double[p];
        var allValues = new double[p][];
        var allShares = new double[p][];
        for (int j = 0; j < p; j++)
        {
            var values = counts[j].Keys.OrderBy(v => v).ToArray();
            long m = counts[j].Values.Sum();
            allValues[j] = values;
            allShares[j] = values.Select(v => counts[j][v] / (double)m).ToArray();
            var map = new Dictionary<double, double>(values.Length);
            long below = 0;
            foreach (double v in values)
            {
                long c = counts[j][v];
                map[v] = Normal.InvCDF(0, 1, (below + c / 2.0) / m);
                below += c;
            }
            maps[j] = map;
            if (values.Length > 0 && values.All(v => v == Math.Floor(v)) && values[^1] - values[0] < TableRange)
            {
                var table = new double[(int)(values[^1] - values[0]) + 1];
                Array.Fill(table, double.NaN);
                foreach (double v in values) table[(int)(v - values[0])] = map[v];
                tables[j] = table;
                origin[j] = values[0];
            }
        }
        return new NormalScores(maps, tables, origin, allValues, allShares);
    }

    /// <summary>Score of answer <paramref name="v"/> to item <paramref name="j"/>; NaN for a missing answer or a value not counted.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public double Score(int j, double v)
    {
        if (double.IsNaN(v)) return double.NaN;
        var table = _tables[j];
        if (table is not null)
        {
            double offset = v - _tableOrigin[j];
            return offset >= 0 && offset < table.Length && offset == Math.Floor(offset) ? table[(int)offset] : double.NaN;
        }
        return _maps[j].TryGetValue(v, out double s) ? s : double.NaN;
    }

    /// <summary>Transforms <paramref name="count"/> row-major rows of p items from <paramref name="source"/> into <paramref
    /// name="destination"/>.</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public void Apply(ReadOnlySpan<double> source, int count, Span<double> destination)
    {
        int p = _maps.Length;
        for (int r = 0; r < count; r++)
            for (int j = 0; j < p; j++) destination[r * p + j] = Score(j, source[r * p + j]);
    }
}
