using System.Runtime.CompilerServices;
using ItemReduce.Core.Data;

namespace ItemReduce.Core.Confirmatory;

/// <summary>
/// Respondents of a set of items grouped by which of those items they answered (the pattern-wise sufficient statistics
/// of the casewise likelihood; Arbuckle 1996). Rows with no answer on the items are left out; with
/// <c>listwise</c> only rows that answered every item are kept. The answers themselves stay in the
/// <see cref="ResponseMatrix"/> (read back row by row when casewise scores are needed), so memory is O(N) integers.
/// </summary>
internal sealed class MissingDataPatterns
{
    /// <summary>One missing-data pattern.</summary>
    /// <param name="Observed">0-based item positions answered, ascending.</param>
    /// <param name="Count">Respondents with this pattern.</param>
    /// <param name="Mean">Mean of the answered items (length = Observed.Length).</param>
    /// <param name="Scatter">Σ (x − mean)(x − mean)ᵀ over the pattern's respondents, row-major q × q (not divided); empty
    /// for a pattern of one respondent (whose scatter is zero), so read it only when <paramref name="Count"/> &gt; 1.</param>
    internal sealed record Pattern(int[] Observed, int Count, double[] Mean, double[] Scatter);

    private readonly ResponseMatrix _source;
    private readonly int[] _columns;

    private MissingDataPatterns(ResponseMatrix source, int[] columns, List<Pattern> patterns, int[] rowIndex, int[] patternOf)
    {
        _source = source;
        _columns = columns;
        Patterns = patterns;
        RowIndex = rowIndex;
        PatternOf = patternOf;
    }

    /// <summary>Number of items p.</summary>
    public int Items => _columns.Length;

    /// <summary>Patterns in order of first appearance.</summary>
    public IReadOnlyList<Pattern> Patterns { get; }

    /// <summary>Row of the data given for each respondent used (ascending).</summary>
    public int[] RowIndex { get; }

    /// <summary>Pattern (index into <see cref="Patterns"/>) of each respondent used.</summary>
    public int[] PatternOf { get; }

    /// <summary>Respondents used, N.</summary>
    public int Respondents => RowIndex.Length;

    /// <summary>True when every respondent used answered every item.</summary>
    public bool Complete => Patterns.Count == 1 && Patterns[0].Observed.Length == Items;

    /// <summary>Answers of respondent <paramref name="i"/> (0-based among those used) on the model's items into
    /// <paramref name="destination"/> (length p, NaN = missing); <paramref name="scratch"/> holds a whole data row.</summary>
    public void ReadRow(int i, Span<double> scratch, Span<double> destination)
    {
        _source.CopyRow(RowIndex[i], scratch);
        for (int a = 0; a < _columns.Length; a++) destination[a] = scratch[_columns[a]];
    }

    /// <summary>Scratch length for <see cref="ReadRow"/>.</summary>
    public int RowWidth => _source.ItemCount;

    /// <summary>The same respondents' patterns restricted to at most <paramref name="cap"/> of them, evenly spaced in
    /// row order (row ⌊j·N/cap⌋ for j = 0..cap−1); this object itself when N ≤ cap.</summary>
    public MissingDataPatterns EvenlySpaced(int cap)
    {
        int n = Respondents;
        if (n <= cap) return this;
        var rows = new int[cap];
        for (int j = 0; j < cap; j++) rows[j] = RowIndex[(int)((long)j * n / cap)];
        return Build(_source, _columns, rows, listwise: false);
    }

    /// <summary>The item positions 0..p−1 not in <paramref name="observed"/> (ascending).</summary>
    public static int[] Unanswered(int[] observed, int p)
    {
        var missing = new int[p - observed.Length];
        for (int a = 0, t = 0, j = 0; a < p; a++)
        {
            if (j < observed.Length && observed[j] == a) { j++; continue; }
            missing[t++] = a;
        }
        return missing;
    }

    /// <summary>Groups the respondents of <paramref name="data"/> on the items <paramref name="items"/>.</summary>
    public static MissingDataPatterns From(ResponseMatrix data, IReadOnlyList<int> items, bool listwise) =>
        Build(data, [.. items], Enumerable.Range(0, data.RespondentCount), listwise);

    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private static MissingDataPatterns Build(ResponseMatrix data, int[] items, IEnumerable<int> candidates, bool listwise)
    {
        int p = items.Length;
        var row = new double[data.ItemCount];
        var index = new List<int>();
        var patternOf = new List<int>();
        var byKey = new Dictionary<string, int>(StringComparer.Ordinal);
        var observed = new List<int[]>();
        var counts = new List<int>();
        var sums = new List<double[]>();
        // Pattern key: the answered flags packed 16 to a character.
        var key = new char[(p + 15) / 16];
        foreach (int i in candidates)
        {
            data.CopyRow(i, row);
            int answered = 0;
            Array.Clear(key);
            for (int a = 0; a < p; a++)
                if (!double.IsNaN(row[items[a]])) { key[a >> 4] |= (char)(1 << (a & 15)); answered++; }
            if (answered == 0 || (listwise && answered < p)) continue;
            var k = new string(key);
            if (!byKey.TryGetValue(k, out int g))
            {
                g = observed.Count;
                byKey[k] = g;
                var obs = new int[answered];
                for (int a = 0, t = 0; a < p; a++) if (!double.IsNaN(row[items[a]])) obs[t++] = a;
                observed.Add(obs);
                counts.Add(0);
                sums.Add(new double[answered]);
            }
            counts[g]++;
            var o = observed[g];
            var s = sums[g];
            for (int a = 0; a < o.Length; a++) s[a] += row[items[o[a]]];
            index.Add(i);
            patternOf.Add(g);
        }
        int groups = observed.Count;
        var means = new double[groups][];
        var scatter = new double[groups][];
        for (int g = 0; g < groups; g++)
        {
            means[g] = sums[g].Select(v => v / counts[g]).ToArray();
            scatter[g] = counts[g] > 1 ? new double[observed[g].Length * observed[g].Length] : [];
        }
        var d = new double[p];
        for (int r = 0; r < index.Count; r++)
        {
            int g = patternOf[r];
            if (counts[g] == 1) continue;
            data.CopyRow(index[r], row);
            var o = observed[g];
            int q = o.Length;
            var w = scatter[g];
            var mean = means[g];
            for (int a = 0; a < q; a++) d[a] = row[items[o[a]]] - mean[a];
            for (int a = 0; a < q; a++)
            {
                double da = d[a];
                int off = a * q;
                for (int b = 0; b <= a; b++) w[off + b] += da * d[b];
            }
        }
        var patterns = new List<Pattern>(groups);
        for (int g = 0; g < groups; g++)
        {
            int q = observed[g].Length;
            var w = scatter[g];
            if (w.Length > 0)
                for (int a = 0; a < q; a++)
                    for (int b = 0; b < a; b++) w[b * q + a] = w[a * q + b];
            patterns.Add(new Pattern(observed[g], counts[g], means[g], w));
        }
        return new MissingDataPatterns(data, items, patterns, [.. index], [.. patternOf]);
    }
}
