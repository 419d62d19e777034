using ItemReduce.Core.Factoring;

namespace ItemReduce.Core.ShortForm;

/// <summary>Applies the documented thresholds (<see cref="ItemJudgementThresholds"/>) to one item.</summary>
internal static class ItemJudging
{
    public static List<string> Flags(
        FactorSolution s, int j, int homeFactor, bool hasDeclaredHome, double itemTotal, double alphaIfDeleted, double scaleAlpha,
        ItemJudgementThresholds t)
    {
        var (primary, secondary, pf) = PrimaryAndSecondary(s, j);
        var reasons = new List<string>();
        double ap = Math.Abs(primary), asec = double.IsNaN(secondary) ? 0.0 : Math.Abs(secondary);
        if (ap < t.MinPrimaryLoading) reasons.Add(ItemReasonCodes.WeakPrimary);
        if (s.FactorCount > 1 && (asec >= t.MaxSecondaryLoading || ap - asec < t.MinLoadingGap)) reasons.Add(ItemReasonCodes.CrossLoading);
        if (s.Communalities[j] < t.MinCommunality) reasons.Add(ItemReasonCodes.LowCommunality);
        if (itemTotal < t.MinItemTotalCorrelation) reasons.Add(ItemReasonCodes.WeakItemTotal);
        if (alphaIfDeleted > scaleAlpha + t.AlphaRiseMargin) reasons.Add(ItemReasonCodes.AlphaRisesWithout);
        if (hasDeclaredHome && pf != homeFactor) reasons.Add(ItemReasonCodes.OffHomeFactor);
        if (primary < 0) reasons.Add(ItemReasonCodes.NegativePrimary);
        if (s.HeywoodItems.Contains(j)) reasons.Add(ItemReasonCodes.HeywoodItem);
        return reasons;
    }

    /// <summary>Signed pattern loadings with the largest and second-largest magnitude, and the primary factor.</summary>
    public static (double Primary, double Secondary, int PrimaryFactor) PrimaryAndSecondary(FactorSolution s, int j)
    {
        int k = s.FactorCount, pf = 0;
        for (int f = 1; f < k; f++) if (Math.Abs(s.Pattern[j, f]) > Math.Abs(s.Pattern[j, pf])) pf = f;
        int sf = -1;
        for (int f = 0; f < k; f++)
            if (f != pf && (sf < 0 || Math.Abs(s.Pattern[j, f]) > Math.Abs(s.Pattern[j, sf]))) sf = f;
        return (s.Pattern[j, pf], sf < 0 ? double.NaN : s.Pattern[j, sf], pf);
    }
}
