using System.Globalization;
using System.Text;
using System.Text.Json.Nodes;
using ItemReduce.IO;

namespace ItemReduce.Application.Summary;

/// <summary>One block of the end-of-command summary: a title, an optional table (header and rows of text cells) and
/// lines of text after it.</summary>
/// <param name="Title">Block title, e.g. "Respondents".</param>
/// <param name="Header">Column headings of the table, or empty when the block has no table.</param>
/// <param name="Rows">Table rows; each has as many cells as <paramref name="Header"/>.</param>
/// <param name="Lines">Sentences printed under the table.</param>
public sealed record SummaryBlock(string Title, IReadOnlyList<string> Header, IReadOnlyList<IReadOnlyList<string>> Rows, IReadOnlyList<string> Lines);

/// <summary>
/// The summary printed at the end of a command, read from the summary.json model (<see cref="SummaryJson"/>) so that a
/// new block there (a rule, a fit index) needs only a reader here. Blocks: respondents (read, flagged by reason,
/// analysed), dimensions (each rule's count and the decision with its reason), exploratory fit, short form (per scale the
/// kept items and α and ω for each form: full → short → holdout), the self-check's rates, then where the results are and which file to open first.
/// </summary>
public static class RunSummary
{
    /// <summary>The blocks for a summary.json object, an output folder and the names of the files written.</summary>
    public static IReadOnlyList<SummaryBlock> Blocks(JsonObject summary, string outDir, IReadOnlyCollection<string> files)
    {
        ArgumentNullException.ThrowIfNull(summary);
        ArgumentNullException.ThrowIfNull(files);
        var blocks = new List<SummaryBlock>();
        if (summary["respondents"] is JsonObject resp) blocks.Add(Respondents(resp, summary["items"] as JsonObject));
        if (summary["factors"] is JsonObject f && f["byRule"] is JsonObject) blocks.Add(Dimensions(f));
        if (summary["fit"] is JsonObject fit) blocks.Add(Fit(fit));
        if (summary["shortForm"] is JsonObject sf) blocks.Add(ShortForm(sf));
        if (summary["confirmatory"] is JsonObject cfa && Confirmatory(cfa) is { } block) blocks.Add(block);
        if (summary["selfCheck"] is JsonObject check) blocks.Add(SelfCheck(check));
        blocks.Add(Outputs(outDir, files));
        return blocks;
    }

    private static SummaryBlock Respondents(JsonObject r, JsonObject? items)
    {
        var rows = new List<IReadOnlyList<string>>
        {
            new[] { "read", Int(r["total"]) },
            new[] { "flagged for review", Int(r["flagged"]) },
        };
        if (r["reasons"] is JsonObject reasons)
            foreach (var (code, count) in reasons)
                if (count is not null && count.GetValue<int>() > 0) rows.Add(new[] { "  " + code, Int(count) });
        bool kept = r["keptFlagged"]?.GetValue<bool>() ?? false;
        rows.Add(new[] { kept ? "analysed (flagged kept)" : "analysed", Int(r["analysed"]) });
        var lines = new List<string>();
        if (items is not null) lines.Add($"Items: {Int(items["analysed"])} of {Int(items["total"])} analysed.");
        if (r["reasons"] is JsonObject)
            lines.Add("A respondent can be flagged for more than one reason. Flags are prompts for human review, not verdicts.");
        return new SummaryBlock("Respondents", ["", "count"], rows, lines);
    }

    private static SummaryBlock Dimensions(JsonObject f)
    {
        var rows = new List<IReadOnlyList<string>>();
        foreach (var (rule, count) in (JsonObject)f["byRule"]!)
            rows.Add(new[] { RuleLabel(rule), count is null ? "—" : Int(count) });
        var lines = new List<string>
        {
            $"Decision: {Int(f["retained"])} factor(s) by the {f["rule"]?.GetValue<string>() ?? "given"} rule.",
        };
        if (f["reason"]?.GetValue<string>() is { } reason) lines.Add(reason);
        return new SummaryBlock("Dimensions", ["rule", "dimensions"], rows, lines);
    }

    /// <summary>A summary.json rule key in the spelling of the command line ("parallelReduced" → "parallel-reduced",
    /// "parallelReducedMean" → "parallel-reduced-mean"), so the screen uses the names a user types.</summary>
    internal static string RuleLabel(string key)
    {
        var sb = new System.Text.StringBuilder(key.Length + 4);
        foreach (char c in key)
        {
            if (char.IsUpper(c)) sb.Append('-').Append(char.ToLowerInvariant(c));
            else sb.Append(c);
        }
        return sb.ToString();
    }

    private static SummaryBlock Fit(JsonObject fit)
    {
        var rows = new List<IReadOnlyList<string>>();
        foreach (var (name, value) in fit)
            rows.Add(new[] { name, value is null ? "—" : value.GetValueKind() == System.Text.Json.JsonValueKind.Number ? Num(value, name == "df" ? 0 : 3) : value.ToString() });
        return new SummaryBlock("Exploratory model fit", ["index", "value"], rows, []);
    }

    private static SummaryBlock ShortForm(JsonObject sf)
    {
        var reliability = (sf["reliability"] as JsonArray ?? []).OfType<JsonObject>().ToList();
        var forms = reliability.Select(x => x["form"]!.GetValue<string>()).Distinct(StringComparer.Ordinal).ToList();
        string arrow = string.Join(" → ", forms);
        var rows = new List<IReadOnlyList<string>>();
        int kept = 0;
        foreach (var scale in (sf["scales"] as JsonArray ?? []).OfType<JsonObject>())
        {
            string name = scale["scale"]!.GetValue<string>();
            var items = (scale["items"] as JsonArray ?? []).Select(i => i!.GetValue<string>()).ToList();
            kept += items.Count;
            var of = reliability.Where(x => x["scale"]!.GetValue<string>() == name).ToList();
            string Series(string key) => string.Join(" → ", forms.Select(form =>
                of.FirstOrDefault(x => x["form"]!.GetValue<string>() == form) is { } x ? Num(x[key], 2) : "—"));
            rows.Add(new[] { name, string.Join(", ", items), Series("alpha"), Series("omega") });
        }
        var lines = new List<string> { $"{kept} items kept." };
        if (sf["caution"]?.GetValue<string>() is { } caution) lines.Add(caution);
        return new SummaryBlock("Short form", ["scale", "kept items", $"α ({arrow})", $"ω ({arrow})"], rows, lines);
    }

    /// <summary>Fit of the confirmatory models (short form first, holdout before analysis sample), with the rules of
    /// thumb and their caution; null when no model was fitted.</summary>
    private static SummaryBlock? Confirmatory(JsonObject cfa)
    {
        var fits = (cfa["fits"] as JsonArray ?? []).OfType<JsonObject>()
            .Where(f => f["fitted"]?.GetValue<bool>() == true && f["statistics"] is JsonObject)
            .OrderBy(f => f["form"]!.GetValue<string>() == "short" ? 0 : 1)
            .ThenBy(f => f["sample"]!.GetValue<string>() == "holdout" ? 0 : 1).ToList();
        if (fits.Count == 0) return null;
        var rows = fits.Select(f =>
        {
            var st = (JsonObject)f["statistics"]!;
            return (IReadOnlyList<string>)new[]
            {
                f["form"]!.GetValue<string>(), f["sample"]!.GetValue<string>(), Int(f["respondents"]),
                Num(st["cfi"], 3), Num(st["rmsea"], 3), Num(st["srmr"], 3),
            };
        }).ToList();
        var lines = new List<string> { "Rules of thumb, not pass/fail tests (Hu & Bentler, 1999): CFI near .95 or above, RMSEA near .06 or below, SRMR near .08 or below." };
        if (fits.All(f => f["sample"]!.GetValue<string>() == "analysis"))
            lines.Add(Core.Confirmatory.ConfirmatoryCheck.OptimismCaution);
        return new SummaryBlock("Confirmatory fit", ["form", "sample", "respondents", "CFI", "RMSEA", "SRMR"], rows, lines);
    }

    private static SummaryBlock Outputs(string outDir, IReadOnlyCollection<string> files)
    {
        var lines = new List<string> { $"Results folder: {outDir} ({files.Count} files, listed in {ResultsManifest.FileName})." };
        if (FirstFile(files) is { } first) lines.Add($"Open first: {first.Name} — {first.Why}.");
        return new SummaryBlock("Results", [], [], lines);
    }

    /// <summary>The file a reader should open first, and why, among those written.</summary>
    public static (string Name, string Why)? FirstFile(IReadOnlyCollection<string> files)
    {
        ArgumentNullException.ThrowIfNull(files);
        (string, string)[] order =
        [
            ("appendix.pdf", "the methods appendix: every decision, table and warning"),
            ("tables.md", "every table of the appendix"),
            ("item-decisions.csv", "each item's judgement and whether it was kept"),
            ("eigenvalues.csv", "observed and random eigenvalues behind the dimension decision"),
            ("respondent-flags.csv", "one row per respondent with the reasons for any flag"),
        ];
        foreach (var (name, why) in order)
            if (files.Contains(name)) return (name, why);
        return null;
    }

    /// <summary>Plain text (no colours, no box characters): each title, its table in columns aligned with spaces, then
    /// its lines.</summary>
    public static string PlainText(IReadOnlyList<SummaryBlock> blocks)
    {
        ArgumentNullException.ThrowIfNull(blocks);
        var sb = new StringBuilder();
        foreach (var b in blocks)
        {
            sb.Append(b.Title).Append('\n');
            if (b.Header.Count > 0)
            {
                var all = new List<IReadOnlyList<string>> { b.Header };
                all.AddRange(b.Rows);
                int[] width = Enumerable.Range(0, b.Header.Count).Select(c => all.Max(r => r[c].Length)).ToArray();
                foreach (var row in all)
                {
                    var line = new StringBuilder("  ");
                    for (int c = 0; c < row.Count; c++)
                    {
                        bool numeric = c > 0 && IsNumeric(row[c]);
                        string cell = numeric ? row[c].PadLeft(width[c]) : row[c].PadRight(width[c]);
                        line.Append(cell).Append(c + 1 < row.Count ? "  " : "");
                    }
                    sb.Append(line.ToString().TrimEnd()).Append('\n');
                }
            }
            foreach (string l in b.Lines) sb.Append("  ").Append(l).Append('\n');
            sb.Append('\n');
        }
        return sb.ToString();
    }

    /// <summary>True for a cell holding a number (or the dash of a missing one), which is right-aligned.</summary>
    /// <summary>The self-check's rates (screening and factor count) and the least stable kept item; the rest is in
    /// self-check.csv.</summary>
    private static SummaryBlock SelfCheck(JsonObject c)
    {
        var rows = new List<IReadOnlyList<string>>();
        JsonObject? least = null;
        foreach (var q in (c["quantities"] as JsonArray ?? []).OfType<JsonObject>())
        {
            string name = q["quantity"]!.GetValue<string>();
            if (name.StartsWith("short_form.kept_again.", StringComparison.Ordinal))
            {
                if (least is null || q["value"]?.GetValue<double>() < least["value"]?.GetValue<double>()) least = q;
                continue;
            }
            if (name.StartsWith("screening.", StringComparison.Ordinal) || name == "dimensions.recovery")
                rows.Add([name, Num(q["value"], 3), $"{Num(q["interval"]?[0], 3)}–{Num(q["interval"]?[1], 3)}"]);
        }
        if (least is not null)
            rows.Add(["least stable kept item: " + least["quantity"]!.GetValue<string>()["short_form.kept_again.".Length..], Num(least["value"], 3), $"{Num(least["interval"]?[0], 3)}–{Num(least["interval"]?[1], 3)}"]);
        var lines = new List<string>
        {
            $"{Int(c["completed"])} of {Int(c["simulatedSurveys"])} simulated surveys analysed; every quantity is in self-check.csv.",
            c["caution"]?.GetValue<string>() ?? "",
        };
        return new SummaryBlock("Self-check", ["quantity", "value", "interval"], rows, lines);
    }

    public static bool IsNumeric(string s) => s.Length > 0 && s.All(ch => char.IsDigit(ch) || ch is '.' or '—');

    private static string Int(JsonNode? n) => n is null ? "—" : n.GetValue<int>().ToString(CultureInfo.InvariantCulture);

    private static string Num(JsonNode? n, int decimals) => n is null ? "—"
        : n.GetValue<double>().ToString("F" + decimals.ToString(CultureInfo.InvariantCulture), CultureInfo.InvariantCulture);
}
