namespace ItemReduce.Core.Data;

/// <summary>Why an item was left out of the analysis.</summary>
public enum ItemExclusionReason
{
    /// <summary>No respondent answered the item.</summary>
    AllMissing,
    /// <summary>Every answer is the same value, so the item carries no information about differences.</summary>
    ZeroVariance,
}

/// <summary>An item excluded before analysis, with its reason.</summary>
public sealed record ExcludedItem(string Item, ItemExclusionReason Reason, string Detail);

/// <summary>
/// Finds items that cannot enter a correlation-based analysis (all missing or zero variance).
/// Policy: such items are excluded with a warning and recorded in the results, not treated as errors.
/// </summary>
internal static class ItemScreen
{
    /// <summary>Returns the indices of usable items and the list of excluded ones.</summary>
    public static (int[] Kept, IReadOnlyList<ExcludedItem> Excluded) Find(ResponseMatrix data) => Find(data, ItemMoments.Compute(data));

    /// <summary>As <see cref="Find(ResponseMatrix)"/>, reusing the already computed <paramref name="moments"/>
    /// (<see cref="ItemMoments.Compute"/> of the same matrix).</summary>
    public static (int[] Kept, IReadOnlyList<ExcludedItem> Excluded) Find(ResponseMatrix data, ItemMoments moments)
    {
        ArgumentNullException.ThrowIfNull(data);
        ArgumentNullException.ThrowIfNull(moments);
        if (moments.Counts.Length != data.ItemCount) throw new ArgumentException($"The moments cover {moments.Counts.Length} items but the data have {data.ItemCount}.", nameof(moments));
        var kept = new List<int>();
        var excluded = new List<ExcludedItem>();
        for (int j = 0; j < data.ItemCount; j++)
        {
            string name = data.Items[j].Name;
            if (moments.Counts[j] == 0)
                excluded.Add(new ExcludedItem(name, ItemExclusionReason.AllMissing, "no respondent answered it"));
            else if (moments.Counts[j] < 2 || !(moments.StandardDeviations[j] > 0))
                excluded.Add(new ExcludedItem(name, ItemExclusionReason.ZeroVariance,
                    $"every answer is {moments.Means[j].ToString("R", System.Globalization.CultureInfo.InvariantCulture)}"));
            else
                kept.Add(j);
        }
        return (kept.ToArray(), excluded);
    }
}
