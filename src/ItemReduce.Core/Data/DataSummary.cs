namespace ItemReduce.Core.Data;

/// <summary>Descriptive summary of one item.</summary>
/// <param name="Item">Item name.</param>
/// <param name="Answered">Respondents who answered.</param>
/// <param name="MissingShare">Share of respondents with a missing answer, in [0, 1].</param>
/// <param name="Mean">Mean of answers (after reverse scoring when the summary is of scored data).</param>
/// <param name="StandardDeviation">SD with n − 1 normaliser.</param>
/// <param name="ObservedMin">Lowest answer given (NaN when none).</param>
/// <param name="ObservedMax">Highest answer given (NaN when none).</param>
/// <param name="DistinctValues">Number of distinct answers given.</param>
public sealed record ItemSummary(string Item, int Answered, double MissingShare, double Mean, double StandardDeviation,
    double ObservedMin, double ObservedMax, int DistinctValues);

/// <summary>Descriptive summary of a response matrix (used by the data check and the appendix).</summary>
/// <param name="Respondents">Rows.</param>
/// <param name="Items">Per-item summaries in column order.</param>
/// <param name="MissingShare">Share of all cells that are missing.</param>
/// <param name="RespondentsWithNoAnswers">Rows with every item missing.</param>
/// <param name="CompleteRespondents">Rows with no item missing.</param>
public sealed record DataSummary(int Respondents, IReadOnlyList<ItemSummary> Items, double MissingShare,
    int RespondentsWithNoAnswers, int CompleteRespondents)
{
    /// <summary>Summarises <paramref name="data"/>.</summary>
    public static DataSummary Of(ResponseMatrix data)
    {
        ArgumentNullException.ThrowIfNull(data);
        int n = data.RespondentCount, p = data.ItemCount;
        var m = ItemMoments.Compute(data);
        var items = new ItemSummary[p];
        long missingCells = 0;
        for (int j = 0; j < p; j++)
        {
            double lo = double.PositiveInfinity, hi = double.NegativeInfinity;
            var distinct = new HashSet<double>();
            for (int i = 0; i < n; i++)
            {
                double x = data[i, j];
                if (double.IsNaN(x)) continue;
                lo = Math.Min(lo, x);
                hi = Math.Max(hi, x);
                if (distinct.Count < 1000) distinct.Add(x);
            }
            missingCells += n - m.Counts[j];
            items[j] = new ItemSummary(data.Items[j].Name, m.Counts[j], n == 0 ? 0 : (n - m.Counts[j]) / (double)n,
                m.Means[j], m.StandardDeviations[j], m.Counts[j] > 0 ? lo : double.NaN, m.Counts[j] > 0 ? hi : double.NaN, distinct.Count);
        }
        int none = 0, complete = 0;
        for (int i = 0; i < n; i++)
        {
            int answered = 0;
            foreach (double x in data.Row(i)) if (!double.IsNaN(x)) answered++;
            if (answered == 0) none++;
            if (answered == p) complete++;
        }
        double share = n * p == 0 ? 0 : missingCells / ((double)n * p);
        return new DataSummary(n, items, share, none, complete);
    }
}
