using ItemReduce.Core.Data;

namespace ItemReduce.Core.Pipeline;

/// <summary>
/// Data ready for analysis: reverse-scored, with unusable items (all missing, zero variance) removed.
/// </summary>
/// <param name="Raw">Responses as read (not reverse-scored), all codebook items.</param>
/// <param name="Scored">Reverse-scored responses on the usable items only.</param>
/// <param name="AsAnswered">Responses as given (not reverse-scored) on the usable items, same order as <paramref name="Scored"/>.</param>
/// <param name="RawSummary">Summary of the raw responses.</param>
/// <param name="ExcludedItems">Items left out, with reasons.</param>
/// <param name="Warnings">Plain-language warnings for the user and the appendix.</param>
public sealed record PreparedData(ResponseMatrix Raw, ResponseMatrix Scored, ResponseMatrix AsAnswered, DataSummary RawSummary,
    IReadOnlyList<ExcludedItem> ExcludedItems, IReadOnlyList<AnalysisWarning> Warnings)
{
    /// <summary>Minimum respondents for the covariance matrix of <paramref name="items"/> items to be invertible: max(items + 1, 10).</summary>
    public static int MinimumRespondents(int items) => Math.Max(items + 1, 10);

    /// <summary>Reverse-scores and removes unusable items.</summary>
    public static PreparedData From(ResponseMatrix raw)
    {
        ArgumentNullException.ThrowIfNull(raw);
        // One pass pair for the item moments, shared by the summary and the item screen.
        var moments = ItemMoments.Compute(raw);
        var summary = DataSummary.Of(raw, moments);
        var (kept, excluded) = ItemScreen.Find(raw, moments);
        var warnings = new WarningList("data");
        foreach (var e in excluded)
            warnings.Add("item-left-out", $"Item {e.Item} was left out of the analysis: {e.Detail}.");
        var asAnswered = kept.Length == raw.ItemCount ? raw : raw.SelectItems(kept);
        var scored = ReverseScoring.Apply(asAnswered);
        if (summary.RespondentsWithNoAnswers > 0)
            warnings.Add("no-answers", $"{summary.RespondentsWithNoAnswers} respondent(s) answered none of the items.");
        return new PreparedData(raw, scored, asAnswered, summary, excluded, warnings);
    }
}
