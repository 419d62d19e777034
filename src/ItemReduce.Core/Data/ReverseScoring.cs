namespace ItemReduce.Core.Data;

/// <summary>
/// Reverse scoring of reverse-keyed items: <c>x' = min + max − x</c>, so that high scores mean the same
/// thing on every item of a subscale (common practice, no source). Missing values stay missing.
/// </summary>
public static class ReverseScoring
{
    /// <summary>Returns a new matrix in which every item with <see cref="ItemDefinition.Reverse"/> is rescored.</summary>
    public static ResponseMatrix Apply(ResponseMatrix raw)
    {
        ArgumentNullException.ThrowIfNull(raw);
        int p = raw.ItemCount;
        var reflect = new bool[p];
        var sum = new double[p];
        for (int j = 0; j < p; j++)
        {
            reflect[j] = raw.Items[j].Reverse;
            sum[j] = raw.Items[j].Min + raw.Items[j].Max;
        }
        // Compact storage: only the decoding tables change; the cells are shared with the input.
        return raw.Reflect(reflect, sum);
    }
}
