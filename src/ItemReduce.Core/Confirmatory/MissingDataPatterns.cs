using System.Runtime.CompilerServices;
using ItemReduce.Core.Data;

namespace ItemReduce.Core.Confirmatory;

/// <summary>
/// Respondents of a set of items grouped by which of those items they answered (the pattern-wise sufficient statistics
/// of the casewise likelihood; Arbuckle 1996). Rows with no answer on the items are left out; with
/// <c>listwise</c> only rows that answered every item are kept.
/// </summary>
internal sealed class MissingDataPatterns
{
    /// <summary>One missing-data pattern.</summary>
    /// <param name="Observed">0-based item positions answered, ascending.</param>
    /// <param name="Count">Respondents with this pattern.</param>
    /// <param name="Mean">Mean of the answered items (length = Observed.Length).</param>
    /// <param name="Scatter">Σ (x − mean)(x − mean)ᵀ over the pattern's respondents, row-major q × q (not divided).</param>
    internal sealed record Pattern(int[] Observed, int Count, double[] Mean, double[] Scatter);

    private MissingDataPatterns(int items, List<Pattern> patterns, double[] rows, int[] rowIndex)
    {
        Items = items;
        Patterns = patterns;
        Rows = rows;
        RowIndex = rowIndex;
    }

    /// <summary>Number of items p.</summary>
    public int Items { get; }

    /// <summary>Patterns in order of first appearance.</summary>
    public IReadOnlyList<Pattern> Patterns { get; }

    /// <summary>Answers of the respondents used, row-major N × p, NaN = missing.</summary>
    public double[] Rows { get; }

    /// <summary>Row of the data given for each respondent used (ascending).</summary>
    public int[] RowIndex { get; }

    /// <summary>Respondents used, N.</summary>
    public int Respondents => RowIndex.Length;

    /// <summary>True when every respondent used answered every item.</summary>
    public bool Complete => Patterns.Count == 1 && Patterns[0].Observed.Length == Items;

    /// <summary>Groups the respondents of <paramref name="data"/> on the items <paramref name="items"/>.</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public static MissingDataPatterns From(ResponseMatrix data, IReadOnlyList<int> items, bool listwise)
    {
        int p = items.Count, n = data.RespondentCount;
        var row = new double[data.ItemCount];
        var kept = new List<double>();
        var index = new List<int>();
        var byKey = new Dictionary<string, List<int>>(StringComparer.Ordinal);
        var order = new List<string>();
        var key = new char[p];
        for (int i = 0; i < n; i++)
        {
            data.CopyRow(i, row);
            int answered = 0;
            for (int a = 0; a < p; a++)
            {
                bool ok = !double.IsNaN(row[items[a]]);
                key[a] = ok ? '1' : '0';
                if (ok) answered++;
            }
            if (answered == 0 || (listwise && answered < p)) continue;
            var k = new string(key);
            if (!byKey.TryGetValue(k, out var members)) { members = []; byKey[k] = members; order.Add(k); }
            members.Add(index.Count);
            index.Add(i);
            for (int a = 0; a < p; a++) kept.Add(row[items[a]]);
        }
        var rows = kept.ToArray();
        var patterns = new List<Pattern>(order.Count);
        foreach (var k in order)
        {
            var obs = Enumerable.Range(0, p).Where(a => k[a] == '1').ToArray();
            var members = byKey[k];
            int q = obs.Length;
            var mean = new double[q];
            foreach (int r in members)
                for (int a = 0; a < q; a++) mean[a] += rows[r * p + obs[a]];
            for (int a = 0; a < q; a++) mean[a] /= members.Count;
            var w = new double[q * q];
            var d = new double[q];
            foreach (int r in members)
            {
                for (int a = 0; a < q; a++) d[a] = rows[r * p + obs[a]] - mean[a];
                for (int a = 0; a < q; a++)
                    for (int b = 0; b <= a; b++) w[a * q + b] += d[a] * d[b];
            }
            for (int a = 0; a < q; a++)
                for (int b = 0; b < a; b++) w[b * q + a] = w[a * q + b];
            patterns.Add(new Pattern(obs, members.Count, mean, w));
        }
        return new MissingDataPatterns(p, patterns, rows, index.ToArray());
    }
}
