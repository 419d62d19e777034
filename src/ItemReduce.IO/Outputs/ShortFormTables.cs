using ItemReduce.Core.Data;
using ItemReduce.Core.Factoring;
using ItemReduce.Core.ShortForm;
using static ItemReduce.IO.SafeCsvWriter;

namespace ItemReduce.IO.Outputs;

/// <summary>CSV tables of the factoring, reliability and short-form stage.</summary>
public static class ShortFormTables
{
    private const int Decimals = 6;

    /// <summary>True when the rotation is oblique (structure and factor correlations differ from the pattern and identity).</summary>
    public static bool IsOblique(FactorSolution solution) => solution.Rotation is FactorRotation.Oblimin or FactorRotation.Promax;

    private static IEnumerable<string> FactorHeaders(int k) => Enumerable.Range(1, k).Select(f => $"F{f}");

    /// <summary><c>loadings.csv</c>: item, subscale, F1..Fk (rotated pattern), communality, decision.</summary>
    public static string Loadings(IReadOnlyList<ItemDefinition> items, ShortFormResult r)
    {
        var s = r.FullSolution;
        int k = s.Pattern.GetLength(1);
        var w = new SafeCsvWriter(["item", "subscale", .. FactorHeaders(k), "communality", "decision"]);
        for (int j = 0; j < items.Count; j++)
        {
            var cells = new List<string> { Text(items[j].Name), Text(items[j].Subscale) };
            for (int f = 0; f < k; f++) cells.Add(Number(s.Pattern[j, f], Decimals));
            cells.Add(Number(s.Communalities[j], Decimals));
            cells.Add(Decision(r, j));
            w.AppendRow(cells);
        }
        return w.ToString();
    }

    /// <summary><c>structure-loadings.csv</c>: item, subscale, F1..Fk (correlations of items with factors).</summary>
    public static string StructureLoadings(IReadOnlyList<ItemDefinition> items, FactorSolution solution)
    {
        int k = solution.Structure.GetLength(1);
        var w = new SafeCsvWriter(["item", "subscale", .. FactorHeaders(k)]);
        for (int j = 0; j < items.Count; j++)
        {
            var cells = new List<string> { Text(items[j].Name), Text(items[j].Subscale) };
            for (int f = 0; f < k; f++) cells.Add(Number(solution.Structure[j, f], Decimals));
            w.AppendRow(cells);
        }
        return w.ToString();
    }

    /// <summary><c>factor-correlations.csv</c>: factor, label, F1..Fk.</summary>
    public static string FactorCorrelations(FactorSolution solution)
    {
        int k = solution.FactorCorrelations.GetLength(0);
        var w = new SafeCsvWriter(["factor", "label", .. FactorHeaders(k)]);
        for (int a = 0; a < k; a++)
        {
            var cells = new List<string> { $"F{a + 1}", Text(solution.FactorLabels[a]) };
            for (int b = 0; b < k; b++) cells.Add(Number(solution.FactorCorrelations[a, b], Decimals));
            w.AppendRow(cells);
        }
        return w.ToString();
    }

    /// <summary><c>item-decisions.csv</c>: one row per item with decision, reason codes and the numbers behind them.</summary>
    public static string ItemDecisions(ShortFormResult shortForm)
    {
        var w = new SafeCsvWriter(["item", "subscale", "decision", "reasons", "primary_factor", "primary_loading", "secondary_loading",
            "item_total_r", "alpha_if_deleted", "communality", "scale", "reverse"]);
        foreach (var j in shortForm.Judgements.OrderBy(j => j.Index))
        {
            w.AppendRow([Text(j.Item), Text(j.Subscale), j.Decision == ItemDecision.Keep ? "keep" : "drop", Text(string.Join(';', j.Reasons)),
                $"F{j.PrimaryFactor + 1}", Number(j.PrimaryLoading, Decimals), Number(j.SecondaryLoading, Decimals),
                Number(j.ItemTotalCorrelation, Decimals), Number(j.AlphaIfDeleted, Decimals), Number(j.Communality, Decimals),
                Text(j.Scale), Bool(j.Reverse)]);
        }
        return w.ToString();
    }

    /// <summary><c>reliability.csv</c>: scale, form, items, alpha, alpha_ci_low, alpha_ci_high, omega, plus sample details, and last
    /// <c>omega_cfa</c>: composite reliability from the confirmatory loadings of the same form and sample (empty when not fitted),
    /// then <c>omega_h</c>: omega hierarchical of the whole item bank (<see cref="Core.Reliability.OmegaHierarchical"/>), a single
    /// bank-level value repeated on every full-form row of the sample the factor solution was fitted on; empty on other rows and
    /// when the solution has fewer than three oblique factors.</summary>
    public static string Reliability(ShortFormResult shortForm, Core.Confirmatory.ConfirmatoryCheckResult? confirmatory = null)
    {
        var w = new SafeCsvWriter(["scale", "form", "items", "alpha", "alpha_ci_low", "alpha_ci_high", "omega",
            "standardized_alpha", "sample", "respondents", "short_full_r", "short_full_r_observed", "omega_cfa", "omega_h"]);
        foreach (var row in shortForm.Reliability)
        {
            w.AppendRow([Text(row.Scale), Text(row.FormLabel), Integer(row.Items), Number(row.Alpha, Decimals), Number(row.AlphaCiLow, Decimals),
                Number(row.AlphaCiHigh, Decimals), Number(row.Omega, Decimals), Number(row.StandardizedAlpha, Decimals),
                row.Sample.ToString().ToLowerInvariant(), Integer(row.Respondents), Number(row.ShortFullCorrelation, Decimals),
                Number(row.ShortFullCorrelationObserved, Decimals),
                Number(ConfirmatoryTables.CompositeReliability(confirmatory, row.Scale, row.Form, row.Sample), Decimals),
                Number(BankOmegaHierarchical(shortForm, row), Decimals)]);
        }
        return w.ToString();
    }

    /// <summary>The bank's omega hierarchical for full-form rows of the sample the factors were fitted on, else NaN (empty cell).</summary>
    private static double BankOmegaHierarchical(ShortFormResult r, ReliabilityRow row) =>
        r.OmegaHierarchical is { } h && row.Form == ScaleForm.Full && row.Sample != SampleRole.Holdout ? h.OmegaH : double.NaN;

    /// <summary><c>short-form-codebook.csv</c>: the codebook rows of the retained items — a valid codebook for the next collection.</summary>
    public static string ShortFormCodebook(IReadOnlyList<ItemDefinition> items, ShortFormResult shortForm)
    {
        var w = new SafeCsvWriter(["item", "subscale", "reverse", "min", "max", "text"]);
        foreach (int j in shortForm.SelectedIndices.Order())
        {
            var it = items[j];
            w.AppendRow([Text(it.Name), Text(it.Subscale), Bool(it.Reverse), Number(it.Min), Number(it.Max), Text(it.Text)]);
        }
        return w.ToString();
    }

    private static string Decision(ShortFormResult r, int j) =>
        r.Judgements.FirstOrDefault(x => x.Index == j)?.Decision == ItemDecision.Keep ? "keep" : "drop";
}
