using System.Globalization;
using ItemReduce.Core.Dimensions;

namespace ItemReduce.DimensionStudy;

/// <summary>
/// Rescores a committed data-set table (grid-datasets.csv) with the current combined rule from the stored features,
/// without simulating again: hit rate overall and by respondents, the cells below .80 where the best single rule
/// reaches .80, and extra factors on one-factor data. Optionally writes cell,set,combined rows.
/// </summary>
internal static class Rescore
{
    private static readonly string[] SingleRules =
        ["pa-pca-95", "pa-pca-mean", "pa-reduced-95", "pa-reduced-mean", "map", "map-revised", "kaiser", "ekc", "cd", "hull"];

    public static void Run(string table, string? outFile, int recheck = 0, int replicates = 1000, ulong seed = 2026)
    {
        var lines = File.ReadAllLines(table);
        var head = lines[0].Split(',');
        int Col(string name) => Array.IndexOf(head, name) is int i and >= 0 ? i : throw new InvalidDataException($"{table}: no column {name}");
        var rows = lines.Skip(1).Where(l => l.Length > 0).Select(l => l.Split(',')).ToArray();
        int I(string[] r, string c) => int.Parse(r[Col(c)], CultureInfo.InvariantCulture);
        var fc = CombinedRetention.FeatureNames.Select(Col).ToArray();
        var count = rows.Select(r =>
        {
            var x = fc.Select(c => double.Parse(r[c], CultureInfo.InvariantCulture)).ToArray();
            return CombinedRetention.Decide(x, I(r, "pa-reduced-95"), I(r, "factors") * I(r, "items_per_factor")).Count;
        }).ToArray();
        var truth = rows.Select(r => I(r, "factors")).ToArray();
        var ci = CultureInfo.InvariantCulture;
        double Rate(IEnumerable<int> idx) => idx.Average(i => count[i] == truth[i] ? 1.0 : 0.0);
        var all = Enumerable.Range(0, rows.Length).ToArray();
        int changed = all.Count(i => count[i] != I(rows[i], "combined"));
        Console.WriteLine(string.Create(ci,
            $"combined rule on {rows.Length} surveys: hit rate {Rate(all):F4}, changed from the stored count in {changed}"));
        foreach (var g in all.GroupBy(i => I(rows[i], "respondents")).OrderBy(g => g.Key))
            Console.WriteLine(string.Create(ci, $"  n = {g.Key}: {Rate(g):F4} ({g.Count()} surveys)"));
        var one = all.Where(i => truth[i] == 1).ToArray();
        Console.WriteLine(string.Create(ci, $"  one-factor surveys: {one.Count(i => count[i] > 1)} of {one.Length} given more than one factor"));
        int bad = 0;
        double worst = 1;
        foreach (var cell in all.GroupBy(i => I(rows[i], "cell")))
        {
            double hit = Rate(cell);
            worst = Math.Min(worst, hit);
            double best = SingleRules.Max(rule => cell.Average(i => I(rows[i], rule) == truth[i] ? 1.0 : 0.0));
            if (hit < 0.8 - 1e-9 && best >= 0.8 - 1e-9)
            {
                bad++;
                var r = rows[cell.First()];
                Console.WriteLine(string.Create(ci,
                    $"  below .80 where a single rule reaches it: k={r[Col("factors")]} ipf={r[Col("items_per_factor")]} " +
                    $"r={r[Col("factor_correlation")]} n={r[Col("respondents")]}: {hit:F2} (best single rule {best:F2})"));
            }
        }
        Console.WriteLine(string.Create(ci, $"  cells below .80 where a single rule reaches .80: {bad}; worst cell {worst:F2}"));
        if (recheck > 0) Recheck(rows, Col, count, recheck, replicates, seed);
        if (outFile is not null)
            File.WriteAllLines(outFile, new[] { "cell,set,combined" }.Concat(rows.Select((r, i) => $"{r[Col("cell")]},{r[Col("set")]},{count[i]}")));
    }

    /// <summary>Simulates again the first data set of every <paramref name="every"/>-th cell with the grid's seed and
    /// replicates, runs the dimensions stage on it and compares its combined count with the rescored one.</summary>
    private static void Recheck(string[][] rows, Func<string, int> col, int[] count, int every, int replicates, ulong seed)
    {
        var cells = Conditions.Cells();
        int same = 0, checkedSets = 0;
        for (int i = 0; i < rows.Length; i++)
        {
            int cell = int.Parse(rows[i][col("cell")], CultureInfo.InvariantCulture);
            int set = int.Parse(rows[i][col("set")], CultureInfo.InvariantCulture);
            if (set != 0 || cell % every != 0) continue;
            var outcome = GridStudy.Analyse(cells[cell], set, replicates, seed);
            int live = outcome.Counts[Array.FindIndex(GridStudy.Rules, r => r.Name == "combined")];
            checkedSets++;
            if (live == count[i]) same++;
            Console.WriteLine(string.Create(CultureInfo.InvariantCulture,
                $"  recheck cell {cell} set 0: dimensions stage {live}, rescored {count[i]}"));
        }
        Console.WriteLine(string.Create(CultureInfo.InvariantCulture, $"  recheck: {same} of {checkedSets} data sets give the same count"));
    }
}
