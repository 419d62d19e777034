using System.Globalization;
using System.Text;

namespace ItemReduce.DimensionStudy;

/// <summary>Writes the study's tables (markdown summary, per-cell and per-data-set CSV).</summary>
internal static class Tables
{
    private static string F(double v, string format = "0.000") => v.ToString(format, CultureInfo.InvariantCulture);

    public static void Write(string outDir, List<Cell> cells, GridStudy.Outcome[] outcomes, int sets, int replicates, ulong seed)
    {
        var rules = GridStudy.Rules;
        int m = rules.Length;
        // Hit rate per cell and rule.
        var cellHit = new double[cells.Count, m];
        foreach (var g in outcomes.GroupBy(o => o.Cell.Index))
            for (int r = 0; r < m; r++)
                cellHit[g.Key, r] = g.Average(o => o.Counts[r] == o.Cell.Factors ? 1.0 : 0.0);
        var bestSingle = new double[cells.Count];
        for (int c = 0; c < cells.Count; c++)
            bestSingle[c] = Enumerable.Range(0, m).Where(r => rules[r].Single).Max(r => cellHit[c, r]);

        var sb = new StringBuilder();
        sb.AppendLine("# Number-of-dimensions rules: simulation study");
        sb.AppendLine();
        sb.AppendLine(string.Create(CultureInfo.InvariantCulture,
            $"{cells.Count} cells × {sets} data sets = {outcomes.Length} invented surveys; {replicates} parallel-analysis replicates, {Math.Max(20, replicates / 4)} comparison-data samples per population; seed {seed}."));
        sb.AppendLine();
        sb.AppendLine("| rule | hit rate | mean bias | under | over | worst cell | worst-cell hit | cells < .80 where best single ≥ .80 | 1-factor hit | 1-factor over |");
        sb.AppendLine("|---|---:|---:|---:|---:|---|---:|---:|---:|---:|");
        for (int r = 0; r < m; r++)
        {
            double hit = outcomes.Average(o => o.Counts[r] == o.Cell.Factors ? 1.0 : 0.0);
            double bias = outcomes.Average(o => (double)(o.Counts[r] - o.Cell.Factors));
            double under = outcomes.Average(o => o.Counts[r] < o.Cell.Factors ? 1.0 : 0.0);
            double over = outcomes.Average(o => o.Counts[r] > o.Cell.Factors ? 1.0 : 0.0);
            int worst = Enumerable.Range(0, cells.Count).MinBy(c => cellHit[c, r]);
            int bad = Enumerable.Range(0, cells.Count).Count(c => bestSingle[c] >= 0.80 && cellHit[c, r] < 0.80);
            var one = outcomes.Where(o => o.Cell.Factors == 1).ToList();
            sb.AppendLine(string.Create(CultureInfo.InvariantCulture,
                $"| {rules[r].Name} | {F(hit)} | {F(bias, "+0.000;-0.000")} | {F(under)} | {F(over)} | {cells[worst].Label} | {F(cellHit[worst, r], "0.00")} | {bad} | {F(one.Average(o => o.Counts[r] == 1 ? 1.0 : 0.0))} | {F(one.Average(o => o.Counts[r] > 1 ? 1.0 : 0.0))} |"));
        }
        sb.AppendLine();
        sb.AppendLine("Hit rate: share of data sets where the rule gave the planted number of factors. Mean bias: average of (rule − planted).");
        sb.AppendLine("Worst cell: the cell (factors k, items per factor ipf, factor correlation r, respondents n) with the lowest hit rate.");
        sb.AppendLine();
        Breakdown(sb, outcomes, "factors", o => o.Cell.Factors.ToString(CultureInfo.InvariantCulture));
        Breakdown(sb, outcomes, "items per factor", o => o.Cell.ItemsPerFactor.ToString(CultureInfo.InvariantCulture));
        Breakdown(sb, outcomes, "factor correlation", o => F(o.Cell.FactorCorrelation, "0.0"));
        Breakdown(sb, outcomes, "respondents", o => o.Cell.Respondents.ToString(CultureInfo.InvariantCulture));
        Breakdown(sb, outcomes, "categories", o => o.Categories.ToString(CultureInfo.InvariantCulture));
        Breakdown(sb, outcomes, "marginals", o => o.Skewed ? "skewed" : "symmetric");
        Breakdown(sb, outcomes, "cross-loadings", o => o.Cross ? "yes" : "no");
        File.WriteAllText(Path.Combine(outDir, "grid-summary.md"), sb.ToString());

        var csv = new StringBuilder("cell,factors,items_per_factor,factor_correlation,respondents,best_single");
        foreach (var rule in rules) csv.Append(',').Append(rule.Name.Replace(',', ';'));
        csv.AppendLine();
        for (int c = 0; c < cells.Count; c++)
        {
            var cell = cells[c];
            csv.Append(string.Create(CultureInfo.InvariantCulture, $"{c},{cell.Factors},{cell.ItemsPerFactor},{cell.FactorCorrelation},{cell.Respondents},{F(bestSingle[c], "0.00")}"));
            for (int r = 0; r < m; r++) csv.Append(',').Append(F(cellHit[c, r], "0.00"));
            csv.AppendLine();
        }
        File.WriteAllText(Path.Combine(outDir, "grid-cells.csv"), csv.ToString());

        WriteDataSets(Path.Combine(outDir, "grid-datasets.csv"), outcomes);
        Console.Write(sb.ToString());
    }

    /// <summary>One row per data set: conditions, every single rule's count, the combined rule's count and its features.</summary>
    public static void WriteDataSets(string path, IReadOnlyList<GridStudy.Outcome> outcomes)
    {
        var rules = GridStudy.Rules;
        bool Raw(GridStudy.Rule r) => r.Single || r.Name == "combined";
        var raw = new StringBuilder("cell,set,factors,items_per_factor,factor_correlation,respondents,categories,skewed,cross_loadings");
        foreach (var rule in rules.Where(Raw)) raw.Append(',').Append(rule.Name);
        foreach (var name in ItemReduce.Core.Dimensions.CombinedRetention.FeatureNames) raw.Append(',').Append(name);
        raw.AppendLine();
        foreach (var o in outcomes)
        {
            raw.Append(string.Create(CultureInfo.InvariantCulture,
                $"{o.Cell.Index},{o.Set},{o.Cell.Factors},{o.Cell.ItemsPerFactor},{o.Cell.FactorCorrelation},{o.Cell.Respondents},{o.Categories},{(o.Skewed ? 1 : 0)},{(o.Cross ? 1 : 0)}"));
            for (int r = 0; r < rules.Length; r++) if (Raw(rules[r])) raw.Append(',').Append(o.Counts[r].ToString(CultureInfo.InvariantCulture));
            foreach (double v in o.Features) raw.Append(',').Append(v.ToString("R", CultureInfo.InvariantCulture));
            raw.AppendLine();
        }
        File.WriteAllText(path, raw.ToString());
    }

    private static void Breakdown(StringBuilder sb, GridStudy.Outcome[] outcomes, string title, Func<GridStudy.Outcome, string> key)
    {
        var rules = GridStudy.Rules;
        sb.AppendLine($"### Hit rate by {title}");
        sb.AppendLine();
        var groups = outcomes.GroupBy(key).OrderBy(g => g.Key, StringComparer.Ordinal).ToList();
        sb.AppendLine("| rule | " + string.Join(" | ", groups.Select(g => g.Key)) + " |");
        sb.AppendLine("|---|" + string.Concat(groups.Select(_ => "---:|")));
        for (int r = 0; r < rules.Length; r++)
            sb.AppendLine($"| {rules[r].Name} | " + string.Join(" | ", groups.Select(g => F(g.Average(o => o.Counts[r] == o.Cell.Factors ? 1.0 : 0.0), "0.00"))) + " |");
        sb.AppendLine();
    }
}
