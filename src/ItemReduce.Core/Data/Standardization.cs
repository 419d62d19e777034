namespace ItemReduce.Core.Data;

/// <summary>
/// Per-item z-scores, <c>z = (x − mean) / sd</c> with the sample SD (n − 1 denominator) of the item's
/// non-missing answers. Missing values stay missing. Items with zero or undefined SD give NaN columns;
/// callers exclude such items beforehand (see <see cref="ItemScreen"/>).
/// </summary>
public static class Standardization
{
    /// <summary>Standardizes every column; returns the z-matrix and the moments used.</summary>
    public static (ResponseMatrix Z, ItemMoments Moments) Apply(ResponseMatrix data)
    {
        var m = ItemMoments.Compute(data);
        int n = data.RespondentCount, p = data.ItemCount;
        var src = data.Storage;
        var z = new double[src.Length];
        for (int i = 0; i < n; i++)
        {
            int o = i * p;
            for (int j = 0; j < p; j++)
            {
                double x = src[o + j];
                z[o + j] = double.IsNaN(x) ? double.NaN : (x - m.Means[j]) / m.StandardDeviations[j];
            }
        }
        return (data.WithValues(z), m);
    }
}
