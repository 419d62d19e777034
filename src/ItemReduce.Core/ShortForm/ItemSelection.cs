namespace ItemReduce.Core.ShortForm;

/// <summary>
/// Greedy item choice for one scale (our own documented rule):
/// <list type="number">
/// <item>Candidates are the scale's items without any flag, ranked by their loading on the scale's home
/// factor (descending; ties by data order). With a simple-structure one-factor view of the scale, taking the
/// highest loadings maximises omega for a given length.</item>
/// <item>Reverse-keyed balance (when enabled and the full scale has both keyings): the short form gets
/// round(target × full-scale reverse share) reverse-keyed items, at least 1 and at most target − 1 when
/// target ≥ 2, limited by the candidates available in each keying; the other slots go to the best remaining
/// candidates.</item>
/// <item>If fewer than min(target, 3) candidates exist, the best flagged items that still load positively on
/// the home factor and are not Heywood cases are added (reason "kept-despite-flags") up to that length.</item>
/// </list>
/// </summary>
internal static class ItemSelection
{
    /// <summary>Chosen item indices (strongest first) and those added despite flags.</summary>
    public static (List<int> Chosen, HashSet<int> Forced) Choose(IReadOnlyList<ItemFlags> scaleItems, IReadOnlyList<bool> reverse, int target, bool balance)
    {
        var ranked = scaleItems.OrderByDescending(i => i.HomeLoading).ThenBy(i => i.Index).ToList();
        var clean = ranked.Where(i => i.Reasons.Count == 0).ToList();
        target = Math.Min(target, scaleItems.Count);
        var chosen = new List<int>();

        int reverseInScale = scaleItems.Count(i => reverse[i.Index]);
        if (balance && reverseInScale > 0 && reverseInScale < scaleItems.Count && target >= 2)
        {
            double share = reverseInScale / (double)scaleItems.Count;
            int wantReverse = Math.Clamp((int)Math.Round(target * share, MidpointRounding.AwayFromZero), 1, target - 1);
            var rev = clean.Where(i => reverse[i.Index]).Take(wantReverse).Select(i => i.Index).ToList();
            var fwd = clean.Where(i => !reverse[i.Index]).Take(target - rev.Count).Select(i => i.Index).ToList();
            chosen.AddRange(rev);
            chosen.AddRange(fwd);
            // if one keying ran short, fill from the other
            foreach (var i in clean)
            {
                if (chosen.Count >= target) break;
                if (!chosen.Contains(i.Index)) chosen.Add(i.Index);
            }
            chosen = ranked.Select(i => i.Index).Where(chosen.Contains).ToList();
        }
        else
        {
            chosen.AddRange(clean.Take(target).Select(i => i.Index));
        }

        var forced = new HashSet<int>();
        int minimum = Math.Min(target, 3);
        foreach (var i in ranked)
        {
            if (chosen.Count >= minimum) break;
            if (chosen.Contains(i.Index) || i.HomeLoading <= 0 || i.Reasons.Contains(ItemReasonCodes.HeywoodItem)) continue;
            chosen.Add(i.Index);
            forced.Add(i.Index);
        }
        return (chosen, forced);
    }
}
