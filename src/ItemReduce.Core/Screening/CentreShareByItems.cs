namespace ItemReduce.Core.Screening;

/// <summary>One row of the half-peak-region table.</summary>
/// <param name="Items">Number of items k (dimension).</param>
/// <param name="ShareInsideHalfPeak">P(χ²_k ≤ 2 ln 2): the share of a standard k-variate normal sample whose
/// density is at least half the peak density (the region D² ≤ −2 ln 0.5).</param>
/// <param name="ShareBeyondCutoff">P(χ²_k &gt; c_k) for the screening cutoff c_k; equals the cutoff probability
/// for every k by construction, because the cutoff grows with k.</param>
/// <param name="Cutoff">The screening cutoff c_k = χ²_k upper quantile at the cutoff probability.</param>
public sealed record CentreShareRow(int Items, double ShareInsideHalfPeak, double ShareBeyondCutoff, double Cutoff);

/// <summary>
/// Figure data for the "curse of dimensionality" argument: in a k-variate standard normal, D² follows χ²_k, so the
/// share of respondents inside the fixed region where the density is at least half its peak, F_χ²(2 ln 2; k),
/// falls quickly with k (76 % for k = 1, 50 % for k = 2, 1.4 % for k = 7, 0.2 % for k = 9), whereas a cutoff taken as a
/// χ²_k quantile keeps the share beyond it at the chosen probability for every k. A fixed radius therefore cannot
/// serve as an outlier rule across different numbers of items answered.
/// </summary>
public static class CentreShareByItems
{
    /// <summary>Rows for k = 1 .. <paramref name="maxItems"/>.</summary>
    /// <param name="maxItems">Largest k, 1 ≤ maxItems ≤ 100000.</param>
    /// <param name="cutoffP">Upper-tail probability of the screening cutoff, 0 &lt; cutoffP &lt; 1.</param>
    public static IReadOnlyList<CentreShareRow> Compute(int maxItems, double cutoffP)
    {
        if (maxItems < 1 || maxItems > 100_000) throw new ArgumentOutOfRangeException(nameof(maxItems), maxItems, "allowed range is 1..100000");
        if (!(cutoffP > 0 && cutoffP < 1)) throw new ArgumentOutOfRangeException(nameof(cutoffP), cutoffP, "allowed range is (0, 1)");
        double radius2 = 2 * Math.Log(2);
        var rows = new CentreShareRow[maxItems];
        for (int k = 1; k <= maxItems; k++)
        {
            double c = ChiSquareTail.UpperQuantile(cutoffP, k);
            rows[k - 1] = new CentreShareRow(k, ChiSquareTail.Cdf(radius2, k), ChiSquareTail.UpperTail(c, k), c);
        }
        return rows;
    }
}
