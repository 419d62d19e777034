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
        int n = raw.RespondentCount, p = raw.ItemCount;
        var v = (double[])raw.Storage.Clone();
        for (int j = 0; j < p; j++)
        {
            var item = raw.Items[j];
            if (!item.Reverse) continue;
            double s = item.Min + item.Max;
            for (int i = 0; i < n; i++)
            {
                long k = (long)i * p + j;
                if (!double.IsNaN(v[k])) v[k] = s - v[k];
            }
        }
        return raw.WithValues(v);
    }
}
