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
    /// <summary>Distinct answers are counted up to this many.</summary>
    private const int DistinctCap = 1000;

    /// <summary>Integers in [−range, range) are tracked in a bitmap instead of a hash set.</summary>
    private const int SmallIntegerRange = 1024;

    /// <summary>Summarises <paramref name="data"/>.</summary>
    public static DataSummary Of(ResponseMatrix data) => Of(data, ItemMoments.Compute(data));

    /// <summary>Summarises <paramref name="data"/> reusing its already computed <paramref name="moments"/>
    /// (<see cref="ItemMoments.Compute"/> of the same matrix), so the moments are not computed twice.</summary>
    public static DataSummary Of(ResponseMatrix data, ItemMoments moments)
    {
        ArgumentNullException.ThrowIfNull(data);
        ArgumentNullException.ThrowIfNull(moments);
        int n = data.RespondentCount, p = data.ItemCount;
        if (moments.Counts.Length != p) throw new ArgumentException($"The moments cover {moments.Counts.Length} items but the data have {p}.", nameof(moments));
        var items = new ItemSummary[p];
        var lo = new double[p];
        var hi = new double[p];
        Array.Fill(lo, double.PositiveInfinity);
        Array.Fill(hi, double.NegativeInfinity);
        // Distinct answers, capped at DistinctCap: small integers (the usual case) in a bitmap, anything else in a set.
        var distinct = new HashSet<double>[p];
        var small = new bool[p][];
        var smallCount = new int[p];
        for (int j = 0; j < p; j++) { distinct[j] = []; small[j] = new bool[2 * SmallIntegerRange]; }
        int none = 0, complete = 0;
        void Observe(int j, double x)
        {
            lo[j] = Math.Min(lo[j], x);
            hi[j] = Math.Max(hi[j], x);
            if (smallCount[j] + distinct[j].Count >= DistinctCap) return;
            if (x >= -SmallIntegerRange && x < SmallIntegerRange && Math.Floor(x) == x)
            {
                ref bool seen = ref small[j][(int)x + SmallIntegerRange];
                if (!seen) { seen = true; smallCount[j]++; }
            }
            else distinct[j].Add(x);
        }
        if (data.CodeHistogram() is var (codeCounts, decode, noAnswers, completeRows))
        {
            // Compact data: every answer an item received is one of at most 256 codes, so the values that occur come
            // from the code counts (min, max and distinct values do not depend on the order they are met in).
            for (int j = 0; j < p; j++)
                for (int c = 0; c < ResponseMatrix.TableSize; c++)
                {
                    double x = decode[j * ResponseMatrix.TableSize + c];
                    if (codeCounts[j * ResponseMatrix.TableSize + c] > 0 && !double.IsNaN(x)) Observe(j, x);
                }
            none = noAnswers;
            complete = completeRows;
        }
        else
            data.ForEachBlock(ItemMoments.BlockRows, (v, rows) =>
            {
                for (int o = 0; o < rows * p; o += p)
                {
                    int answered = 0;
                    for (int j = 0; j < p; j++)
                    {
                        double x = v[o + j];
                        if (double.IsNaN(x)) continue;
                        answered++;
                        Observe(j, x);
                    }
                    if (answered == 0) none++;
                    if (answered == p) complete++;
                }
            });
        long missingCells = 0;
        for (int j = 0; j < p; j++)
        {
            missingCells += n - moments.Counts[j];
            items[j] = new ItemSummary(data.Items[j].Name, moments.Counts[j], n == 0 ? 0 : (n - moments.Counts[j]) / (double)n,
                moments.Means[j], moments.StandardDeviations[j], moments.Counts[j] > 0 ? lo[j] : double.NaN,
                moments.Counts[j] > 0 ? hi[j] : double.NaN, smallCount[j] + distinct[j].Count);
        }
        double share = n * p == 0 ? 0 : missingCells / ((double)n * p);
        return new DataSummary(n, items, share, none, complete);
    }
}
