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
/// Two passes per item (mean, then central moments). NaN where undefined (n = 0; SD and moments for n &lt; 2 or zero variance).
/// </summary>
public static class ItemDescriptives
{
    /// <summary>One row per item of <paramref name="data"/>, in item order.</summary>
    public static IReadOnlyList<ItemDescriptive> Compute(ResponseMatrix data)
    {
        ArgumentNullException.ThrowIfNull(data);
        int n = data.RespondentCount, p = data.ItemCount;
        var x = new double[(long)n * p];
        for (int i = 0; i < n; i++) data.CopyRow(i, x.AsSpan((int)((long)i * p), p));
        var rows = new ItemDescriptive[p];
        for (int j = 0; j < p; j++)
        {
            var item = data.Items[j];
            int count = 0, low = 0, high = 0;
            double sum = 0;
            for (int i = 0; i < n; i++)
            {
                double v = x[(long)i * p + j];
                if (double.IsNaN(v)) continue;
                count++;
                sum += v;
                if (v == item.Min) low++;
                if (v == item.Max) high++;
            }
            double mean = count > 0 ? sum / count : double.NaN;
            double m2 = 0, m3 = 0, m4 = 0;
            for (int i = 0; i < n; i++)
            {
                double v = x[(long)i * p + j];
                if (double.IsNaN(v)) continue;
                double d = v - mean, d2 = d * d;
                m2 += d2; m3 += d2 * d; m4 += d2 * d2;
            }
            double sd = count > 1 ? Math.Sqrt(m2 / (count - 1)) : double.NaN;
            m2 /= count; m3 /= count; m4 /= count;
            bool ok = count > 1 && m2 > 0;
            rows[j] = new ItemDescriptive(item.Name, count, mean, sd, ok ? m3 / Math.Pow(m2, 1.5) : double.NaN, ok ? m4 / (m2 * m2) - 3 : double.NaN,
                count > 0 ? (double)low / count : double.NaN, count > 0 ? (double)high / count : double.NaN, n > 0 ? (double)(n - count) / n : double.NaN);
        }
        return rows;
    }
}
