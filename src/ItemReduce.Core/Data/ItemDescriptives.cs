namespace ItemReduce.Core.Data;

/// <summary>Descriptive statistics of one item over the respondents given.</summary>
/// <param name="Item">Item name.</param>
/// <param name="Respondents">n = respondents who answered it.</param>
/// <param name="Mean">Mean of the answers (as scored: reverse-keyed items already rescored).</param>
/// <param name="StandardDeviation">SD with the n − 1 divisor.</param>
/// <param name="Skewness">g₁ = m₃ / m₂^{3/2} with central moments m_r = Σ(x − x̄)^r / n.</param>
/// <param name="ExcessKurtosis">g₂ = m₄ / m₂² − 3.</param>
/// <param name="LowestShare">Share of answers at the item's lowest category (0..1).</param>
/// <param name="HighestShare">Share at the highest category.</param>
/// <param name="MissingShare">Share of the respondents given who did not answer.</param>
public sealed record ItemDescriptive(string Item, int Respondents, double Mean, double StandardDeviation, double Skewness,
    double ExcessKurtosis, double LowestShare, double HighestShare, double MissingShare);

/// <summary>
/// Item descriptives: moment skewness g₁ and excess kurtosis g₂ (the g-type measures of Joanes, D. N., &amp; Gill,
/// C. A., 1998, "Comparing measures of sample skewness and kurtosis", The Statistician 47, 183–189, type g), floor and
/// ceiling shares at the codebook's lowest and highest category (after reverse scoring: the scored scale's ends).
/// Two passes over the rows (means, then central moments). NaN where undefined (n = 0; SD and moments for n &lt; 2 or zero variance).
/// </summary>
public static class ItemDescriptives
{
    /// <summary>One row per item of <paramref name="data"/>, in item order.</summary>
    public static IReadOnlyList<ItemDescriptive> Compute(ResponseMatrix data)
    {
        ArgumentNullException.ThrowIfNull(data);
        int n = data.RespondentCount, p = data.ItemCount;
        // Both passes stream the rows in blocks (no n × p copy); each item's sums still run over the respondents in
        // input order, one term per answer, so every result is the same double as a plain loop over the column.
        var count = new int[p];
        var low = new int[p];
        var high = new int[p];
        var sum = new double[p];
        var min = new double[p];
        var max = new double[p];
        for (int j = 0; j < p; j++) (min[j], max[j]) = (data.Items[j].Min, data.Items[j].Max);
        data.ForEachBlock(ItemMoments.BlockRows, (x, rows) =>
        {
            for (int o = 0; o < rows * p; o += p)
                for (int j = 0; j < p; j++)
                {
                    double v = x[o + j];
                    if (double.IsNaN(v)) continue;
                    count[j]++;
                    sum[j] += v;
                    if (v == min[j]) low[j]++;
                    if (v == max[j]) high[j]++;
                }
        });
        var mean = new double[p];
        for (int j = 0; j < p; j++) mean[j] = count[j] > 0 ? sum[j] / count[j] : double.NaN;
        var m2 = new double[p];
        var m3 = new double[p];
        var m4 = new double[p];
        data.ForEachBlock(ItemMoments.BlockRows, (x, rows) =>
        {
            for (int o = 0; o < rows * p; o += p)
                for (int j = 0; j < p; j++)
                {
                    double v = x[o + j];
                    if (double.IsNaN(v)) continue;
                    double d = v - mean[j], d2 = d * d;
                    m2[j] += d2; m3[j] += d2 * d; m4[j] += d2 * d2;
                }
        });
        var result = new ItemDescriptive[p];
        for (int j = 0; j < p; j++)
        {
            int c = count[j];
            double sd = c > 1 ? Math.Sqrt(m2[j] / (c - 1)) : double.NaN;
            double s2 = m2[j] / c, s3 = m3[j] / c, s4 = m4[j] / c;
            bool ok = c > 1 && s2 > 0;
            result[j] = new ItemDescriptive(data.Items[j].Name, c, mean[j], sd, ok ? s3 / Math.Pow(s2, 1.5) : double.NaN,
                ok ? s4 / (s2 * s2) - 3 : double.NaN, c > 0 ? (double)low[j] / c : double.NaN, c > 0 ? (double)high[j] / c : double.NaN,
                n > 0 ? (double)(n - c) / n : double.NaN);
        }
        return result;
    }
}
