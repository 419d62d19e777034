namespace ItemReduce.Core.ShortForm;

/// <summary>The judgement on one item of the full form.</summary>
/// <param name="Item">Item name.</param>
/// <param name="Index">Column index in the data given to the builder.</param>
/// <param name="Subscale">Declared subscale, or null.</param>
/// <param name="Scale">Scale the item is scored on: the declared subscale, else the label of its primary factor.</param>
/// <param name="Reverse">Reverse-keyed in the codebook.</param>
/// <param name="Decision">Keep (in the short form) or drop.</param>
/// <param name="Reasons">Reason codes (<see cref="ItemReasonCodes"/>); empty for an unflagged kept item.</param>
/// <param name="PrimaryFactor">0-based factor with the largest |pattern loading|.</param>
/// <param name="PrimaryFactorLabel">Label of that factor.</param>
/// <param name="PrimaryLoading">Signed pattern loading on the primary factor.</param>
/// <param name="SecondaryLoading">Signed pattern loading with the second-largest magnitude (NaN when k = 1).</param>
/// <param name="Communality">Communality in the full solution.</param>
/// <param name="ItemTotalCorrelation">Corrected item–total correlation within <paramref name="Scale"/>.</param>
/// <param name="AlphaIfDeleted">Alpha of <paramref name="Scale"/> without the item.</param>
/// <param name="ScaleAlpha">Alpha of <paramref name="Scale"/> with all its items.</param>
public sealed record ItemJudgement(
    string Item, int Index, string? Subscale, string Scale, bool Reverse, ItemDecision Decision, IReadOnlyList<string> Reasons,
    int PrimaryFactor, string PrimaryFactorLabel, double PrimaryLoading, double SecondaryLoading, double Communality,
    double ItemTotalCorrelation, double AlphaIfDeleted, double ScaleAlpha);
