using ItemReduce.Core.Data;
using ItemReduce.Simulation;

namespace ItemReduce.Tests.Core.SelfCheck;

/// <summary>The generator's per-item answer scales, missing shares and full pattern (used by the self-check).</summary>
public class DesignMatchedGeneratorTests
{
    private static readonly ItemDefinition[] Items =
    [
        new("a", "S", false, 0, 3, null),
        new("b", "S", true, 1, 7, null),
        new("c", "T", false, 1, 5, null),
    ];

    private static FactorModelSpec Spec() => new()
    {
        ItemFactor = [0, 0, 1],
        Loadings = [0, 0, 0],
        Pattern = new double[,] { { 0.7, 0.0 }, { 0.6, 0.2 }, { 0.0, 0.8 } },
        FactorCorrelations = new double[,] { { 1, 0.4 }, { 0.4, 1 } },
        ItemScales =
        [
            new([0, 1, 2, 3], [0.1, 0.2, 0.3, 0.4]),
            new([2, 4, 6], [0.5, 0.3, 0.2]),
            new([1, 2, 3, 4, 5], [0.2, 0.2, 0.2, 0.2, 0.2]),
        ],
        ReverseKeyed = [false, true, false],
    };

    [Fact]
    public void Attentive_answers_follow_each_items_shares_missing_share_and_keying()
    {
        const int n = 20_000;
        var s = FactorModelSimulator.Generate(Spec(), new FactorModelSimulator.Settings(n, 3, ItemMissingRates: [0.0, 0.1, 0.3], Items: Items));
        Assert.Same(Items[1], s.Responses.Items[1]);
        var scored = ReverseScoring.Apply(s.Responses);
        var spec = Spec();
        double[] missing = [0.0, 0.1, 0.3];
        for (int j = 0; j < 3; j++)
        {
            var col = scored.Column(j);
            var answered = col.Where(v => !double.IsNaN(v)).ToArray();
            // Binomial sampling error of a share at n = 20,000 is below 0.004; 0.015 is about four standard errors.
            Assert.Equal(missing[j], 1 - answered.Length / (double)n, 0.015);
            var sc = spec.ItemScales![j];
            for (int t = 0; t < sc.Values.Length; t++)
                Assert.Equal(sc.Probabilities[t], answered.Count(v => v == sc.Values[t]) / (double)answered.Length, 0.015);
        }
        // Reverse-keyed item b is stored as answered: raw = min + max − scored = 8 − scored.
        var raw = s.Responses.Column(1);
        Assert.Contains(raw, v => v == 6);
        Assert.DoesNotContain(raw, v => !double.IsNaN(v) && v is not (2 or 4 or 6));
        Assert.Equal(0.5, raw.Count(v => v == 6) / (double)raw.Count(v => !double.IsNaN(v)), 0.015);
    }

    [Fact]
    public void Items_on_the_same_factor_correlate_positively_and_planted_kinds_use_each_items_scale()
    {
        var s = FactorModelSimulator.Generate(Spec(), new FactorModelSimulator.Settings(4000, 8, StraightLiners: 5, RandomResponders: 5,
            WideAlternators: 5, Items: Items));
        var scored = ReverseScoring.Apply(s.Responses);
        var rows = Enumerable.Range(0, 4000).Where(i => s.Careless[i] == CarelessKind.None).ToArray();
        double r = MathNet.Numerics.Statistics.Correlation.Pearson(rows.Select(i => scored[i, 0]), rows.Select(i => scored[i, 1]));
        Assert.InRange(r, 0.2, 0.6); // latent r = 0.7·(0.6 + 0.2·0.4) = 0.476, attenuated by cutting into categories
        for (int i = 0; i < 4000; i++)
        {
            if (s.Careless[i] == CarelessKind.WideAlternation)
                Assert.True((s.Responses[i, 0], s.Responses[i, 1], s.Responses[i, 2]) is (0, 6, 1) or (3, 2, 5), $"row {i}");
            if (s.Careless[i] == CarelessKind.UniformRandom)
                for (int j = 0; j < 3; j++) Assert.True(Items[j].InRange(s.Responses[i, j]));
        }
    }
}
