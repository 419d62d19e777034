namespace ItemReduce.Core.Reliability;

/// <summary>
/// Corrected item–total correlation: the correlation of each item with the sum of the other items of its
/// scale (the item is removed from the total so it does not correlate with itself; common practice, no
/// source). From a covariance matrix C: r_j = (Σ_{l≠j} C_jl) / sqrt(C_jj · Σ_{a,b≠j} C_ab).
/// </summary>
internal static class CorrectedItemTotalCorrelation
{
    /// <summary>One correlation per item (length k); NaN when k &lt; 2 or a variance is zero.</summary>
    public static double[] Compute(double[,] covariance)
    {
        ArgumentNullException.ThrowIfNull(covariance);
        int k = covariance.GetLength(0);
        double total = 0;
        var rowSums = new double[k];
        for (int a = 0; a < k; a++)
            for (int b = 0; b < k; b++) { rowSums[a] += covariance[a, b]; total += covariance[a, b]; }
        var r = new double[k];
        for (int j = 0; j < k; j++)
        {
            double cov = rowSums[j] - covariance[j, j];
            double restVar = total - 2 * rowSums[j] + covariance[j, j];
            double den = Math.Sqrt(covariance[j, j] * restVar);
            r[j] = k >= 2 && den > 0 ? cov / den : double.NaN;
        }
        return r;
    }
}
