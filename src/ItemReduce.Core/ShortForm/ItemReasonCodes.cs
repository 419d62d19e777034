namespace ItemReduce.Core.ShortForm;

/// <summary>
/// Reason codes of the item judgements (our own short kebab-case names). Thresholds in
/// <see cref="ItemJudgementThresholds"/>.
/// </summary>
public static class ItemReasonCodes
{
    /// <summary>|primary pattern loading| &lt; MinPrimaryLoading (default .40).</summary>
    public const string WeakPrimary = "weak-primary";
    /// <summary>|secondary| ≥ MaxSecondaryLoading (.30) or |primary| − |secondary| &lt; MinLoadingGap (.20).</summary>
    public const string CrossLoading = "cross-loading";
    /// <summary>Communality &lt; MinCommunality (.20).</summary>
    public const string LowCommunality = "low-communality";
    /// <summary>Corrected item–total correlation within its scale &lt; MinItemTotalCorrelation (.30).</summary>
    public const string WeakItemTotal = "weak-item-total";
    /// <summary>The scale's alpha would rise if the item were deleted (by more than AlphaRiseMargin).</summary>
    public const string AlphaRisesWithout = "alpha-rises-without";
    /// <summary>The item's primary factor is not the home factor of its declared subscale.</summary>
    public const string OffHomeFactor = "off-home-factor";
    /// <summary>The primary loading is negative after reverse scoring (keying may be wrong).</summary>
    public const string NegativePrimary = "negative-primary";
    /// <summary>The item is a Heywood case (communality ≥ 1).</summary>
    public const string HeywoodItem = "heywood-item";
    /// <summary>Acceptable, but the scale's target length was reached with stronger items.</summary>
    public const string Surplus = "surplus";
    /// <summary>Kept although flagged, because too few unflagged items were left to reach a usable length.</summary>
    public const string KeptDespiteFlags = "kept-despite-flags";

    /// <summary>One-line explanation per code, for legends in reports.</summary>
    public static IReadOnlyDictionary<string, string> Descriptions { get; } = new Dictionary<string, string>
    {
        [WeakPrimary] = "primary pattern loading below the minimum",
        [CrossLoading] = "secondary loading too large or too close to the primary loading",
        [LowCommunality] = "common factors explain too little of the item's variance",
        [WeakItemTotal] = "low corrected item–total correlation within its scale",
        [AlphaRisesWithout] = "the scale's alpha is higher without the item",
        [OffHomeFactor] = "loads mainly on a factor other than its subscale's factor",
        [NegativePrimary] = "negative loading after reverse scoring (check the keying)",
        [HeywoodItem] = "communality at or above 1 (Heywood case)",
        [Surplus] = "acceptable, but stronger items filled the target length",
        [KeptDespiteFlags] = "kept although flagged, to give the scale a usable length",
    };
}
