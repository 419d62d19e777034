using System.Globalization;
using ItemReduce.Core.Data;
using ItemReduce.Core.ShortForm;

namespace ItemReduce.Core.Confirmatory;

/// <summary>Which respondents a confirmatory fit used.</summary>
public enum ConfirmatorySample
{
    /// <summary>The respondents the items were chosen on (all analysed respondents without a holdout).</summary>
    Analysis,
    /// <summary>The held-out respondents.</summary>
    Holdout,
}

/// <summary>One fitted form on one sample.</summary>
/// <param name="Form">Full or short form.</param>
/// <param name="Sample">Analysis or holdout respondents.</param>
/// <param name="Result">The fit (null when the form's model was not identified; see the warnings).</param>
public sealed record ConfirmatoryFormFit(ScaleForm Form, ConfirmatorySample Sample, ConfirmatoryResult? Result);

/// <summary>All confirmatory fits of a run and the warnings they raised.</summary>
/// <param name="Fits">Full then short form, analysis then holdout sample.</param>
/// <param name="Warnings">Warnings of every fit, each saying which form and sample it concerns.</param>
/// <param name="Listwise">True when rows with a missing answer were left out instead of using the casewise likelihood.</param>
public sealed record ConfirmatoryCheckResult(IReadOnlyList<ConfirmatoryFormFit> Fits, IReadOnlyList<AnalysisWarning> Warnings, bool Listwise);

/// <summary>
/// Confirms the scale structure of the full and the short form: each scale is one factor, each item loads only on its
/// scale's factor (<see cref="ConfirmatoryFactorAnalysis"/>). Fitted on the analysis sample and, when there is a holdout,
/// on the held-out respondents. A scale with one item is left out of the model; a form whose model is not identified
/// (one factor with two items) is not fitted; both with a warning.
/// </summary>
public static class ConfirmatoryCheck
{
    /// <summary>Caution added when there is no holdout: the short form was chosen on the respondents it is tested on.</summary>
    public const string OptimismCaution =
        "The confirmatory fit was computed on the same respondents the short form was chosen on, so it is optimistic; " +
        "confirm the structure in a holdout or, better, a new sample.";

    /// <summary>Runs the fits.</summary>
    /// <param name="data">The analysed responses the short form was built from (same rows and items).</param>
    /// <param name="shortForm">The short form.</param>
    /// <param name="listwise">Listwise deletion instead of the casewise likelihood.</param>
    /// <param name="maxDegreeOfParallelism">Fits run at the same time (−1: as many as there are cores); the results
    /// and their order do not depend on it.</param>
    public static ConfirmatoryCheckResult Run(ResponseMatrix data, ShortFormResult shortForm, bool listwise, int maxDegreeOfParallelism = -1)
    {
        ArgumentNullException.ThrowIfNull(data);
        ArgumentNullException.ThrowIfNull(shortForm);
        if (maxDegreeOfParallelism == 0 || maxDegreeOfParallelism < -1)
            throw new ArgumentException($"maxDegreeOfParallelism must be −1 or ≥ 1, got {maxDegreeOfParallelism}.", nameof(maxDegreeOfParallelism));
        var warnings = new List<AnalysisWarning>();
        var fits = new List<ConfirmatoryFormFit>();
        var holdout = shortForm.HoldoutRows.ToHashSet();
        var samples = new List<(ConfirmatorySample, ResponseMatrix)>();
        if (holdout.Count > 0)
        {
            samples.Add((ConfirmatorySample.Analysis, data.SelectRespondents(Enumerable.Range(0, data.RespondentCount).Where(i => !holdout.Contains(i)).ToArray())));
            samples.Add((ConfirmatorySample.Holdout, data.SelectRespondents(shortForm.HoldoutRows.ToArray())));
        }
        else samples.Add((ConfirmatorySample.Analysis, data));
        var column = new Dictionary<string, int>(StringComparer.Ordinal);
        for (int j = 0; j < data.ItemCount; j++) column[data.Items[j].Name] = j;
        // The models (and their warnings) first, in order; then the fits, which are independent of one another, on
        // up to maxDegreeOfParallelism threads, each writing only its own slot; then everything in the fixed order.
        ScaleForm[] forms = [ScaleForm.Full, ScaleForm.Short];
        var models = new (int[] Items, int[] Factor, string[] Names)?[forms.Length];
        var modelWarnings = new List<AnalysisWarning>[forms.Length];
        for (int f = 0; f < forms.Length; f++)
        {
            modelWarnings[f] = [];
            models[f] = Model(shortForm.Scales, forms[f], column, FormName(forms[f]), modelWarnings[f]);
        }
        int jobs = forms.Length * samples.Count;
        var outcomes = new (ConfirmatoryResult? Result, string? Failure)[jobs];
        Parallel.For(0, jobs, new ParallelOptions { MaxDegreeOfParallelism = maxDegreeOfParallelism }, job =>
        {
            var model = models[job / samples.Count];
            if (model is null) return;
            try
            {
                var (items, factor, names) = model.Value;
                outcomes[job] = (ConfirmatoryFactorAnalysis.Fit(samples[job % samples.Count].Item2, items, factor, names, listwise), null);
            }
            catch (Exception e) when (e is DataConditionException or LinearAlgebra.MatrixNotPositiveDefiniteException)
            {
                outcomes[job] = (null, e.Message);
            }
        });
        for (int f = 0; f < forms.Length; f++)
        {
            warnings.AddRange(modelWarnings[f]);
            for (int si = 0; si < samples.Count; si++)
            {
                var role = samples[si].Item1;
                string where = $"{FormName(forms[f])} form, {(role == ConfirmatorySample.Analysis ? "analysis" : "holdout")} sample";
                var (r, failure) = outcomes[f * samples.Count + si];
                fits.Add(new ConfirmatoryFormFit(forms[f], role, r));
                if (r is not null)
                    warnings.AddRange(r.Warnings.Select(w => w with { Message = $"Confirmatory model ({where}): {w.Message}" }));
                else if (failure is not null)
                    warnings.Add(new AnalysisWarning("confirmatory-not-fitted", "confirmatory", $"Confirmatory model ({where}) was not fitted: {failure}"));
            }
        }
        if (holdout.Count == 0 && fits.Any(f => f.Result is not null))
            warnings.Add(new AnalysisWarning("confirmatory-on-selection-sample", "confirmatory", OptimismCaution,
                nameof(ShortForm.ShortFormOptions.HoldoutFraction)));
        return new ConfirmatoryCheckResult(fits, warnings, listwise);
    }

    private static string FormName(ScaleForm form) => form == ScaleForm.Full ? "full" : "short";

    private static (int[] Items, int[] Factor, string[] Names)? Model(IReadOnlyList<ShortFormScale> scales, ScaleForm form,
        Dictionary<string, int> column, string formName, List<AnalysisWarning> warnings)
    {
        var ci = CultureInfo.InvariantCulture;
        var kept = new List<(string Name, List<int> Items)>();
        foreach (var s in scales)
        {
            var names = form == ScaleForm.Full ? s.FullItems : s.SelectedItems;
            var items = names.Select(n => column[n]).Order().ToList();
            if (items.Count == 0) continue;
            if (items.Count == 1)
            {
                warnings.Add(new AnalysisWarning("scale-not-identified", "confirmatory", string.Create(ci,
                    $"Scale '{s.Scale}' has one item in the {formName} form; a one-item factor is not identified, so it was left out of the confirmatory model.")));
                continue;
            }
            kept.Add((s.Scale, items));
        }
        if (kept.Count == 0 || (kept.Count == 1 && kept[0].Items.Count < 3))
        {
            warnings.Add(new AnalysisWarning("scale-not-identified", "confirmatory", string.Create(ci,
                $"The {formName} form's confirmatory model is not identified (a single factor needs at least three items); it was not fitted.")));
            return null;
        }
        foreach (var (name, items) in kept.Where(k => k.Items.Count == 2))
            warnings.Add(new AnalysisWarning("scale-weakly-identified", "confirmatory", string.Create(ci,
                $"Scale '{name}' has two items in the {formName} form; its loadings are identified only through its correlations with the other factors, so they are unstable when those correlations are small.")));
        var order = kept.SelectMany((k, f) => k.Items.Select(j => (j, f))).OrderBy(t => t.j).ToList();
        return ([.. order.Select(t => t.j)], [.. order.Select(t => t.f)], [.. kept.Select(k => k.Name)]);
    }
}
