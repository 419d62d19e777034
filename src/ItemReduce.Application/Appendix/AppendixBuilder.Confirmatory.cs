using ItemReduce.Core.Confirmatory;
using ItemReduce.Core.Data;
using ItemReduce.Core.Pipeline;
using ItemReduce.Core.ShortForm;
using ItemReduce.IO.Outputs;
using ItemReduce.Report.Model;
using static ItemReduce.Report.Formatting.NumberFormat;

namespace ItemReduce.Application.Appendix;

/// <summary>Section 7 (confirmatory factor analysis) and the item descriptives table.</summary>
internal static partial class AppendixBuilder
{
    /// <summary>Longest item wording shown next to the loadings before it is shortened with an ellipsis.</summary>
    public const int WordingLength = 60;

    /// <summary>The usual fit cut-offs, quoted as rules of thumb (values as commonly cited from Hu &amp; Bentler 1999, from memory).</summary>
    public const string RulesOfThumb =
        "As rules of thumb, CFI and TLI near .95 or above, RMSEA near .06 or below and SRMR near .08 or below are often read as good fit " +
        "(Hu & Bentler, 1999). They came from simulations of particular models and are not pass/fail tests; fit also depends on the number of items, " +
        "the size of the loadings and the sample size.";

    private static void ConfirmatorySection(Builder b, PipelineResult r, ConfirmatoryCheckResult c, SortedSet<string> refs)
    {
        b.Heading(1, "7. Confirmatory factor analysis");
        var fitted = c.Fits.Where(f => f.Result is not null).ToList();
        bool fiml = fitted.Any(f => f.Result!.Estimator == ConfirmatoryEstimator.FullInformation);
        b.Para("The scale structure of the full and the short form was fitted as a confirmatory model: each scale is one factor, each item loads only on its scale's factor, " +
               "the factors correlate, factor variances are fixed to 1 and the unique variances are free. Estimation was by maximum likelihood on the answers as scored" +
               (c.Listwise ? ", using only respondents who answered every item of the form (listwise deletion, as chosen for this run)."
                   : fiml ? "; missing answers were handled by full-information maximum likelihood, in which every respondent contributes the items they answered (Arbuckle, 1996)."
                       : "; no respondent in these fits had a missing answer.") +
               " Standard errors come from the expected information. Because Likert answers are not normal, a scaled χ² with robust CFI, TLI and RMSEA is reported as well " +
               (fiml ? "(the Yuan–Bentler correction for incomplete data, Yuan & Bentler, 2000)." : "(the Satorra–Bentler correction, Satorra & Bentler, 1994)."));
        b.Para(SamplesSentence(r, c) + SubsampleSentence(fitted));
        if (fitted.Count > 0)
        {
            var rows = fitted.Select(f =>
            {
                var x = f.Result!.Fit;
                return new TableRow(
                [
                    ConfirmatoryTables.FormName(f.Form), ConfirmatoryTables.SampleName(f.Sample),
                    Inv($"{Fixed(x.Chi2, 1)} ({x.Df})"), Cell(x.Cfi), Cell(x.Tli),
                    double.IsFinite(x.Rmsea) ? Inv($"{Cell(x.Rmsea)} [{Cell(x.RmseaLow)}, {Cell(x.RmseaHigh)}]") : "—",
                    Cell(x.Srmr),
                ]);
            }).ToList();
            b.Table("Fit of the confirmatory models",
                [new("Form"), new("Sample"), new("χ² (df)", ColumnAlignment.Right), new("CFI", ColumnAlignment.Right),
                 new("TLI", ColumnAlignment.Right), new("RMSEA [90% CI]", ColumnAlignment.Center), new("SRMR", ColumnAlignment.Right)],
                rows, "χ² is −2 log-likelihood against the unrestricted model; the respondents of each sample are counted in the text. Definitions: README, section on confirmatory fit.");
            var robustRows = fitted.Select(f =>
            {
                var x = f.Result!.Fit;
                return new TableRow(
                [
                    ConfirmatoryTables.FormName(f.Form), ConfirmatoryTables.SampleName(f.Sample),
                    double.IsFinite(x.ScaledChi2) ? Inv($"{Fixed(x.ScaledChi2, 1)} ({Fixed(x.ScalingFactor, 2)})") : "—",
                    Cell(x.RobustCfi), Cell(x.RobustTli), Cell(x.RobustRmsea),
                ]);
            }).ToList();
            b.Table("Robust fit of the confirmatory models",
                [new("Form"), new("Sample"), new("Scaled χ² (c)", ColumnAlignment.Right), new("Robust CFI", ColumnAlignment.Right),
                 new("Robust TLI", ColumnAlignment.Right), new("Robust RMSEA", ColumnAlignment.Right)],
                robustRows, "c is the scaling factor of the robust χ² (scaled χ² = χ²/c); robust CFI, TLI and RMSEA use χ² − c·df. Definitions: README, section on confirmatory fit.");
            b.Para(RulesOfThumb);
            LoadingTable(b, r, c);
        }
        if (!c.Fits.Any(f => f.Sample == ConfirmatorySample.Holdout))
            b.Para(ConfirmatoryCheck.OptimismCaution + " " + ShortFormBuilder.ValidationCaution);
        foreach (var reference in new[]
                 {
                     MethodReferences.Joreskog1969, MethodReferences.Arbuckle1996, MethodReferences.SatorraBentler1994, MethodReferences.YuanBentler2000,
                     MethodReferences.Bentler1990, MethodReferences.TuckerLewis1973, MethodReferences.SteigerLind1980, MethodReferences.BrowneCudeck1993,
                     MethodReferences.HuBentler1999,
                 })
            refs.Add(reference);
    }

    /// <summary>Three decimals, without the leading zero only when |v| ≤ 1 (RMSEA and SRMR can exceed 1 on degenerate data).</summary>
    private static string Cell(double v) => !double.IsFinite(v) ? "—" : Math.Abs(v) <= 1 ? Bounded(v, 3) : Fixed(v, 3);

    /// <summary>Says when the robust scaling factor came from evenly spaced respondents (more than the row cap in a sample).</summary>
    private static string SubsampleSentence(IReadOnlyList<ConfirmatoryFormFit> fitted)
    {
        var capped = fitted.Where(f => f.Result!.Fit.RobustRespondents > 0 && f.Result.Fit.RobustRespondents < f.Result.Respondents).ToList();
        if (capped.Count == 0) return "";
        return Inv($" The scaling factor of the robust χ² was computed from {SatorraBentlerScaling.RowCap:N0} evenly spaced respondents of each sample larger than that ") +
               "(every other estimate uses all respondents of the sample).";
    }

    /// <summary>Which respondents each estimate came from, with counts, and why the forms' n differ.</summary>
    private static string SamplesSentence(PipelineResult r, ConfirmatoryCheckResult c)
    {
        int total = r.Prepared.Raw.RespondentCount, analysed = r.Analysed.RespondentCount;
        int holdout = r.ShortForm?.HoldoutRespondents ?? 0;
        var parts = Inv($"Of the {total} respondents, {total - analysed} were set aside before the analyses (flagged in screening, or no answer), ");
        parts += holdout > 0
            ? Inv($"{analysed - holdout} formed the analysis sample on which items were chosen, and {holdout} were held out; the models were fitted on both.")
            : Inv($"and all {analysed} analysed respondents formed the analysis sample on which items were chosen and the models were fitted (no holdout).");
        parts += " respondent-flags.csv names each respondent's sample (analysis, holdout or set-aside).";
        var ns = c.Fits.Where(f => f.Result is not null).GroupBy(f => f.Sample)
            .Where(g => g.Select(f => f.Result!.Respondents).Distinct().Count() > 1).ToList();
        foreach (var g in ns)
        {
            var full = g.FirstOrDefault(f => f.Form == ScaleForm.Full)?.Result;
            var shortR = g.FirstOrDefault(f => f.Form == ScaleForm.Short)?.Result;
            if (full is null || shortR is null) continue;
            parts += c.Listwise
                ? Inv($" In the {ConfirmatoryTables.SampleName(g.Key)} sample the full form has {full.Respondents} complete respondents and the short form {shortR.Respondents}: listwise deletion drops a respondent for a missing answer on any item of the form, and the short form has fewer items to miss.")
                : Inv($" In the {ConfirmatoryTables.SampleName(g.Key)} sample {full.Respondents} respondents answered at least one full-form item and {shortR.Respondents} at least one short-form item.");
        }
        return parts;
    }

    private static void LoadingTable(Builder b, PipelineResult r, ConfirmatoryCheckResult c)
    {
        var sample = c.Fits.Any(f => f.Sample == ConfirmatorySample.Holdout && f.Result is not null) ? ConfirmatorySample.Holdout : ConfirmatorySample.Analysis;
        var full = c.Fits.FirstOrDefault(f => f.Form == ScaleForm.Full && f.Sample == sample)?.Result;
        var shortR = c.Fits.FirstOrDefault(f => f.Form == ScaleForm.Short && f.Sample == sample)?.Result;
        var any = full ?? shortR;
        if (any is null) return;
        string Std(ConfirmatoryResult? x, string item) =>
            x?.Estimates.FirstOrDefault(e => e.Item == item) is { } e ? Loading(e.Standardized) : "";
        var text = r.Analysed.Items.ToDictionary(i => i.Name, i => i.Text ?? "", StringComparer.Ordinal);
        var rows = new List<TableRow>();
        foreach (var f in any.Factors)
            foreach (var item in (full ?? shortR)!.Estimates.Where(e => e.Item is not null && e.Factor == f).Select(e => e.Item!))
                rows.Add(new TableRow([f, item, Shorten(text.GetValueOrDefault(item, "")), Std(full, item), Std(shortR, item)],
                    RowMark.None));
        var correlations = (shortR ?? full)!.Estimates.Where(e => e.Item is null).Select(e => Inv($"{e.Factor.Replace("~", "–")} {Loading(e.Estimate)}")).ToList();
        b.Table(Inv($"Standardized loadings of the confirmatory models ({ConfirmatoryTables.SampleName(sample)} sample)"),
            [new("Scale"), new("Item"), new("Wording"), new("Full form", ColumnAlignment.Right), new("Short form", ColumnAlignment.Right)],
            rows, correlations.Count > 0 ? $"Factor correlations ({(shortR is null ? "full" : "short")} form): {string.Join("; ", correlations)}. Short-form items are those with a short-form loading." : "Short-form items are those with a short-form loading.");
    }

    /// <summary>Wording cut at a word boundary to at most <see cref="WordingLength"/> characters, with an ellipsis.</summary>
    internal static string Shorten(string text)
    {
        if (text.Length <= WordingLength) return text;
        int cut = text.LastIndexOf(' ', WordingLength - 1);
        return text[..(cut > WordingLength / 2 ? cut : WordingLength - 1)].TrimEnd(' ', ',', ';') + "…";
    }

    private static void ItemDescriptivesSection(Builder b, PipelineResult r, IReadOnlyList<ItemDescriptive> d, SortedSet<string> refs)
    {
        refs.Add(MethodReferences.JoanesGill1998);
        b.Table(Inv($"Item descriptives (the {r.Analysed.RespondentCount} analysed respondents, answers as scored)"),
            [new("Item"), new("n", ColumnAlignment.Right), new("Mean", ColumnAlignment.Right), new("SD", ColumnAlignment.Right),
             new("Skew", ColumnAlignment.Right), new("Ex. kurt.", ColumnAlignment.Right), new("% lowest", ColumnAlignment.Right),
             new("% highest", ColumnAlignment.Right), new("% missing", ColumnAlignment.Right)],
            d.Select(x => Row(x.Item, Integer(x.Respondents), Fixed(x.Mean, 2), Fixed(x.StandardDeviation, 2), Fixed(x.Skewness, 2),
                Fixed(x.ExcessKurtosis, 2), Percent(x.LowestShare), Percent(x.HighestShare), Percent(x.MissingShare))).ToList(),
            "Skewness g₁ and excess kurtosis g₂ are moment ratios (Joanes & Gill, 1998); reverse-keyed items are shown after rescoring. item-descriptives.csv has the same figures.");
    }
}
