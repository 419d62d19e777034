namespace ItemReduce.Core.Data;

/// <summary>
/// Per-item z-scores, <c>z = (x − mean) / sd</c> with the sample SD (n − 1 denominator) of the item's
/// non-missing answers. Missing values stay missing. Items with zero or undefined SD give NaN columns;
/// callers exclude such items beforehand (see <see cref="ItemScreen"/>).
/// </summary>
internal static class Standardization
{
    /// <summary>Standardizes every column; returns the z-matrix and the moments used.</summary>
    public static (ResponseMatrix Z, ItemMoments Moments) Apply(ResponseMatrix data)
    {
        var m = ItemMoments.Compute(data);
        int n = data.RespondentCount, p = data.ItemCount;
        var z = new double[(long)n * p];
        for (int i = 0; i < n; i++)
        {
            var row = z.AsSpan(i * p, p);
            data.CopyRow(i, row);
            for (int j = 0; j < p; j++)
            {
                double x = row[j];
                row[j] = double.IsNaN(x) ? double.NaN : (x - m.Means[j]) / m.StandardDeviations[j];
            }
        }
        return (data.WithValues(z), m);
    }
}
