using ItemReduce.Core.Randomness;

namespace ItemReduce.Core.ShortForm;

/// <summary>
/// Seeded random split of respondents into a selection part and a holdout part (common practice, no
/// source): a Fisher–Yates shuffle of the row indices from <see cref="RandomStream.ForTask"/>(seed, 0,
/// <see cref="Purpose"/>); the first round(n × fraction) shuffled rows are held out. Both parts are returned
/// in ascending row order.
/// </summary>
internal static class HoldoutSplit
{
    /// <summary>Stream purpose tag, so the split does not share random numbers with other steps.</summary>
    public const ulong Purpose = 0x5F0A_4D01UL;

    /// <summary>Splits rows 0..n−1.</summary>
    public static (int[] Selection, int[] Holdout) Split(int n, double fraction, ulong seed)
    {
        if (n < 0) throw new ArgumentException($"n = {n}; must be ≥ 0.", nameof(n));
        if (!(fraction >= 0 && fraction <= 0.9)) throw new ArgumentException($"Holdout fraction = {fraction}; allowed [0, 0.9].", nameof(fraction));
        var rows = Enumerable.Range(0, n).ToArray();
        int h = (int)Math.Round(n * fraction, MidpointRounding.AwayFromZero);
        if (h == 0) return (rows, []);
        RandomStream.ForTask(seed, 0, Purpose).Shuffle(rows.AsSpan());
        var holdout = rows.Take(h).Order().ToArray();
        var selection = rows.Skip(h).Order().ToArray();
        return (selection, holdout);
    }
}
