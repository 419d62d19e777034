using ItemReduce.Core;
using ItemReduce.Core.Correlation;
using ItemReduce.Core.Data;
using ItemReduce.Core.Randomness;
using static ItemReduce.Tests.Core.Dimensions.DimensionsReferenceData;

namespace ItemReduce.Tests.Core.Correlation;

public class PolychoricCorrelationTests
{
    public static TheoryData<string> TableNames => new()
    {
        "two_by_two", "three_by_three", "negative_three_by_four", "likert_five_by_five_sparse", "skewed_four_by_three",
    };

    private static (int[,] Table, double Rho) Table(string name)
    {
        var f = Fields("polychoric_tables.csv").Single(x => x[0] == name);
        int rows = int.Parse(f[1]), cols = int.Parse(f[2]);
        var counts = f[3].Split(';').Select(int.Parse).ToArray();
        var t = new int[rows, cols];
        for (int i = 0; i < rows; i++) for (int j = 0; j < cols; j++) t[i, j] = counts[i * cols + j];
        return (t, Parse(f[4]));
    }

    [Theory]
    [MemberData(nameof(TableNames))]
    public void Two_step_estimate_matches_scipy_maximum_likelihood(string name)
    {
        // Expected: thresholds from marginals (scipy.stats.norm.ppf), ρ maximising Σ n log π with π from
        // scipy.stats.multivariate_normal.cdf, via scipy.optimize.minimize_scalar(bounded) — make_polychoric_fixtures.py.
        var (table, rho) = Table(name);
        Assert.Equal(rho, PolychoricCorrelation.FromTable(table), 1e-7);
    }

    [Theory]
    [MemberData(nameof(TableNames))]
    public void Transposing_gives_the_same_estimate_and_reversing_one_item_flips_the_sign(string name)
    {
        // Symmetry of the bivariate normal model (property).
        var (t, _) = Table(name);
        int r = t.GetLength(0), c = t.GetLength(1);
        var transposed = new int[c, r];
        var reversed = new int[r, c];
        for (int i = 0; i < r; i++)
            for (int j = 0; j < c; j++) { transposed[j, i] = t[i, j]; reversed[i, c - 1 - j] = t[i, j]; }
        double rho = PolychoricCorrelation.FromTable(t);
        Assert.Equal(rho, PolychoricCorrelation.FromTable(transposed), 1e-8);
        Assert.Equal(-rho, PolychoricCorrelation.FromTable(reversed), 1e-8);
    }

    [Theory]
    [InlineData(0.6)]
    [InlineData(-0.3)]
    public void Recovers_the_latent_correlation_of_discretised_bivariate_normal_data(double truth)
    {
        // Known truth: X, Y standard normal with correlation ρ, cut at fixed thresholds into 5 and 4 categories.
        // Asymptotic SD of the polychoric estimate at n = 20000 is below 0.01 (Olsson 1979, Table 2 shows
        // SE ≈ 0.02–0.03 at n = 1000 for similar tables), so 0.03 is about 3–4 SE.
        var rng = new RandomStream(77);
        int n = 20_000;
        double[] cutsX = [-1.5, -0.5, 0.3, 1.1], cutsY = [-0.8, 0.2, 1.4];
        var v = new double[n * 2];
        for (int i = 0; i < n; i++)
        {
            double x = rng.NextGaussian();
            double y = truth * x + Math.Sqrt(1 - truth * truth) * rng.NextGaussian();
            v[2 * i] = 1 + cutsX.Count(t => x > t);
            v[2 * i + 1] = 1 + cutsY.Count(t => y > t);
        }
        var items = new[] { new ItemDefinition("a", null, false, 1, 5, null), new ItemDefinition("b", null, false, 1, 4, null) };
        var data = new ResponseMatrix(Enumerable.Range(0, n).Select(i => $"r{i}").ToList(), items, v);
        var r = PolychoricCorrelation.Compute(data);
        Assert.Equal(truth, r[0, 1], 0.03);
        Assert.Equal(r[0, 1], r[1, 0]);
        // Pearson on the categories is attenuated towards 0 (Olsson 1979, Section 1) — a sanity check on direction.
        Assert.True(Math.Abs(PearsonCorrelation.Compute(data)[0, 1]) < Math.Abs(r[0, 1]));
    }

    [Fact]
    public void Thresholds_are_normal_quantiles_of_cumulative_proportions()
    {
        // Φ⁻¹(0.25) = −0.6744897501960817, Φ⁻¹(0.75) = 0.6744897501960817 (scipy.stats.norm.ppf).
        var tau = PolychoricCorrelation.Thresholds([25, 50, 25]);
        Assert.Equal(double.NegativeInfinity, tau[0]);
        Assert.Equal(-0.6744897501960817, tau[1], 1e-14);
        Assert.Equal(0.6744897501960817, tau[2], 1e-14);
        Assert.Equal(double.PositiveInfinity, tau[3]);
    }

    [Fact]
    public void Items_with_too_many_distinct_values_are_rejected_and_degenerate_tables_give_NaN()
    {
        var items = new[] { new ItemDefinition("a", null, false, 0, 100, null), new ItemDefinition("b", null, false, 0, 100, null) };
        var v = Enumerable.Range(0, 60).SelectMany(i => new double[] { i, i % 3 }).ToArray();
        var data = new ResponseMatrix(Enumerable.Range(0, 30 * 2).Select(i => $"r{i}").ToList(), items, v);
        var ex = Assert.Throws<DataConditionException>(() => PolychoricCorrelation.Compute(data));
        Assert.Contains("'a'", ex.Message);
        Assert.True(double.IsNaN(PolychoricCorrelation.FromTable(new[,] { { 5, 7 }, { 0, 0 } })));
    }
}
