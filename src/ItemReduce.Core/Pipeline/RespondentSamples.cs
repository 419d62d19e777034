using ItemReduce.Core.Screening;
using ItemReduce.Core.ShortForm;

namespace ItemReduce.Core.Pipeline;

/// <summary>
/// Which sample each screened respondent belongs to, as the later stages use them: <c>analysis</c> (items chosen and
/// the confirmatory model fitted on them), <c>holdout</c> (held out from choosing items; the short form is checked on
/// them) or <c>set-aside</c> (flagged and set aside, or no answer at all). Derived with the same
/// <see cref="HoldoutSplit"/> call as <see cref="ShortFormBuilder.Build"/>, so it names the same respondents.
/// </summary>
public static class RespondentSamples
{
    public const string Analysis = "analysis", Holdout = "holdout", SetAside = "set-aside";

    /// <summary>One label per screened respondent, in input order.</summary>
    public static string[] Labels(ScreeningResult screening, PipelineSettings settings)
    {
        ArgumentNullException.ThrowIfNull(screening);
        ArgumentNullException.ThrowIfNull(settings);
        var stage = settings.StageOptions();
        var labels = new string[screening.Respondents.Count];
        Array.Fill(labels, SetAside);
        var keep = screening.RespondentsToAnalyse(stage.KeepFlagged);
        foreach (int i in keep) labels[i] = Analysis;
        if (settings.Scope == PipelineScope.All && stage.ShortForm.HoldoutFraction > 0)
        {
            var (_, holdout) = HoldoutSplit.Split(keep.Count, stage.ShortForm.HoldoutFraction, stage.ShortForm.Seed);
            foreach (int h in holdout) labels[keep[h]] = Holdout;
        }
        return labels;
    }
}
