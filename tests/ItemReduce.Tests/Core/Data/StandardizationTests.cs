using ItemReduce.Core.Data;
using ItemReduce.Tests.Support;

namespace ItemReduce.Tests.Core.Data;

public class StandardizationTests
{
    [Fact]
    public void Z_scores_match_numpy_with_missing_values()
    {
        // Reference: ReferenceData/Data/make_standardization.py, Debian python3-numpy 1.24.2,
        // (x - nanmean) / nanstd(ddof=1) per column.
        var x = ReferenceData.Numbers("Data", "standardization-input.csv");
        var expected = ReferenceData.Numbers("Data", "standardization-expected.csv");
        int n = x.Length, p = x[0].Length;
        var items = Enumerable.Range(0, p).Select(j => new ItemDefinition($"i{j}", null, false, -10, 10, null)).ToList();
        var m = new ResponseMatrix(Enumerable.Range(0, n).Select(i => $"r{i}").ToList(), items, x.SelectMany(r => r).ToArray());
        var (z, moments) = Standardization.Apply(m);
        for (int i = 0; i < n; i++)
            for (int j = 0; j < p; j++)
            {
                if (double.IsNaN(expected[i][j])) Assert.True(double.IsNaN(z[i, j]));
                else Assert.Equal(expected[i][j], z[i, j], 12);
            }
        Assert.Equal([6, 6, 5, 5], moments.Counts);
    }
}
