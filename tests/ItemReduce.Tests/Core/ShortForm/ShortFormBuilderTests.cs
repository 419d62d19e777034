using ItemReduce.Core;
using ItemReduce.Core.Data;
using ItemReduce.Core.ShortForm;
using ItemReduce.Simulation;

namespace ItemReduce.Tests.Core.ShortForm;

public class ShortFormBuilderTests
{
    // Known truth planted with FactorModelSimulator: 3 correlated factors (φ = .3) × 8 five-point items.
    // Per factor (positions 0..7): four strong items (.75, position 1 reverse-keyed), two medium (.55),
    // one weak item (.25, position 6) and one cross-loader (position 7: .50 on its own factor, .45 on the next).
    // Item 23 (factor 2, position 7) is the cross-loader of factor 2 onto factor 0.
    private static readonly double[] Pattern = [0.75, 0.75, 0.75, 0.75, 0.55, 0.55, 0.25, 0.50];
    private static int[] WeakItems => [6, 14, 22];
    private static int[] CrossLoaders => [7, 15, 23];
    private static int[] StrongItems => Enumerable.Range(0, 24).Where(j => j % 8 < 4).ToArray();

    private static (ResponseMatrix Data, SimulatedSurvey Sim) Survey(int n = 1500, ulong seed = 5, string[]? subscaleOverride = null)
    {
        var spec = new FactorModelSpec
        {
            ItemFactor = Enumerable.Range(0, 24).Select(j => j / 8).ToArray(),
            Loadings = Enumerable.Range(0, 24).Select(j => Pattern[j % 8]).ToArray(),
            CrossLoadings = [(7, 1, 0.45), (15, 2, 0.45), (23, 0, 0.45)],
            FactorCorrelations = new double[,] { { 1, .3, .3 }, { .3, 1, .3 }, { .3, .3, 1 } },
            Categories = 5,
            ReverseKeyed = Enumerable.Range(0, 24).Select(j => j % 8 == 1).ToArray(),
        };
        var sim = FactorModelSimulator.Generate(spec, new FactorModelSimulator.Settings(n, seed, MissingRate: 0.01,
            SubscaleNames: ["Warmth", "Order", "Worry"]));
        var data = ReverseScoring.Apply(sim.Responses);
        if (subscaleOverride is not null)
        {
            var items = data.Items.Select((it, j) => it with { Subscale = subscaleOverride[j] }).ToList();
            data = new ResponseMatrix(data.RespondentIds, items, data.ToArray());
        }
        return (data, sim);
    }

    [Fact]
    public void Planted_weak_items_and_cross_loaders_are_dropped_and_strong_items_kept()
    {
        var (data, _) = Survey();
        var result = ShortFormBuilder.Build(data, 3);
        foreach (int j in WeakItems)
        {
            Assert.Equal(ItemDecision.Drop, result.Judgements[j].Decision);
            Assert.Contains(ItemReasonCodes.WeakPrimary, result.Judgements[j].Reasons);
        }
        foreach (int j in CrossLoaders)
        {
            Assert.Equal(ItemDecision.Drop, result.Judgements[j].Decision);
            Assert.Contains(ItemReasonCodes.CrossLoading, result.Judgements[j].Reasons);
        }
        foreach (int j in StrongItems)
        {
            Assert.Equal(ItemDecision.Keep, result.Judgements[j].Decision);
            Assert.Empty(result.Judgements[j].Reasons);
        }
        // The medium items are acceptable but surplus at the default length of 4.
        Assert.Equal([ItemReasonCodes.Surplus], result.Judgements[4].Reasons);
        Assert.Equal(StrongItems, result.SelectedIndices);
        Assert.Equal(["Warmth", "Order", "Worry"], result.Scales.Select(s => s.Scale));
        // Each scale keeps its reverse-keyed strong item (q02, q10, q18).
        Assert.Equal(["q02", "q10", "q18"], result.Scales.Select(s => s.SelectedItems.Single(name => data.Items[data.Items.ToList().FindIndex(i => i.Name == name)].Reverse)));
        Assert.NotNull(result.ShortSolution);
        Assert.Contains(result.Warnings, w => w.Message == ShortFormBuilder.ValidationCaution);
    }

    [Fact]
    public void Reliability_rows_cover_full_and_short_forms_with_an_overlap_corrected_correlation()
    {
        var (data, _) = Survey();
        var result = ShortFormBuilder.Build(data, 3);
        Assert.Equal(6, result.Reliability.Count);
        foreach (var row in result.Reliability)
        {
            Assert.Equal(SampleRole.All, row.Sample);
            Assert.InRange(row.Alpha, 0.6, 0.95);
            Assert.True(row.AlphaCiLow < row.Alpha && row.Alpha < row.AlphaCiHigh);
            Assert.InRange(row.Omega, 0.6, 0.95);
            if (row.Form == ScaleForm.Short)
            {
                Assert.Equal(4, row.Items);
                // Overlap inflates the observed short/full correlation; the corrected one is lower but still high.
                Assert.True(row.ShortFullCorrelation < row.ShortFullCorrelationObserved);
                Assert.InRange(row.ShortFullCorrelation, 0.6, 1.0);
            }
            else Assert.True(double.IsNaN(row.ShortFullCorrelation));
        }
    }

    [Fact]
    public void Holdout_rows_are_present_and_close_to_the_selection_sample()
    {
        var (data, _) = Survey(n: 2000);
        var result = ShortFormBuilder.Build(data, 3, new ShortFormOptions { HoldoutFraction = 0.5, Seed = 42 });
        Assert.Equal(1000, result.HoldoutRespondents);
        Assert.Equal(1000, result.SelectionRespondents);
        Assert.Equal(12, result.Reliability.Count);
        foreach (string scale in new[] { "Warmth", "Order", "Worry" })
        {
            var sel = result.Reliability.Single(r => r.Scale == scale && r.FormLabel == "short");
            var hold = result.Reliability.Single(r => r.Scale == scale && r.FormLabel == "short-holdout");
            Assert.Equal(SampleRole.Selection, sel.Sample);
            Assert.Equal(SampleRole.Holdout, hold.Sample);
            Assert.Equal(sel.Alpha, hold.Alpha, 0.05);
            Assert.True(hold.AlphaCiLow < hold.Alpha);
            Assert.Equal(sel.ShortFullCorrelation, hold.ShortFullCorrelation, 0.05);
        }
        Assert.Equal(StrongItems, result.SelectedIndices);
    }

    [Fact]
    public void Holdout_split_is_seeded_and_disjoint()
    {
        var (s1, h1) = HoldoutSplit.Split(101, 0.3, 9);
        var (s2, h2) = HoldoutSplit.Split(101, 0.3, 9);
        var (_, h3) = HoldoutSplit.Split(101, 0.3, 10);
        Assert.Equal(h1, h2);
        Assert.Equal(s1, s2);
        Assert.NotEqual(h1, h3);
        Assert.Equal(30, h1.Length);
        Assert.Equal(Enumerable.Range(0, 101), s1.Concat(h1).Order());
    }

    [Fact]
    public void An_item_declared_in_the_wrong_subscale_is_flagged_off_home_factor()
    {
        // Item 2 is generated on factor 0 ("Warmth") but the codebook places it in "Order".
        var names = Enumerable.Range(0, 24).Select(j => j / 8 == 0 ? "Warmth" : j / 8 == 1 ? "Order" : "Worry").ToArray();
        names[2] = "Order";
        var (data, _) = Survey(subscaleOverride: names);
        var result = ShortFormBuilder.Build(data, 3);
        Assert.Contains(ItemReasonCodes.OffHomeFactor, result.Judgements[2].Reasons);
        Assert.Equal(ItemDecision.Drop, result.Judgements[2].Decision);
        Assert.Equal("Order", result.Judgements[2].Scale);
    }

    [Fact]
    public void Reverse_keyed_balance_keeps_a_reverse_item_even_when_it_is_not_among_the_strongest()
    {
        // Our selection rule (ItemSelection): target 4, 2 of 8 reverse-keyed → round(4 × .25) = 1 reverse item.
        var items = Enumerable.Range(0, 8).Select(j => new ItemFlags(j, "S", 0, 0, 0.8 - 0.05 * j, 0.05, 0.5, 0.5, 0.7, 0.8, [])
        { HomeLoading = 0.8 - 0.05 * j }).ToList();
        var reverse = Enumerable.Range(0, 8).Select(j => j >= 6).ToList();
        var (chosen, forced) = ItemSelection.Choose(items, reverse, 4, balance: true);
        Assert.Equal([0, 1, 2, 6], chosen);
        Assert.Empty(forced);
        Assert.Equal([0, 1, 2, 3], ItemSelection.Choose(items, reverse, 4, balance: false).Chosen);
    }

    [Fact]
    public void Too_few_clean_items_are_topped_up_with_flagged_ones_and_reported()
    {
        var items = Enumerable.Range(0, 5).Select(j => new ItemFlags(j, "S", 0, 0, 0.6, 0.1, 0.4, 0.5, 0.7, 0.8,
            j < 2 ? [] : [ItemReasonCodes.WeakItemTotal])
        { HomeLoading = 0.7 - 0.1 * j }).ToList();
        var (chosen, forced) = ItemSelection.Choose(items, Enumerable.Repeat(false, 5).ToList(), 4, balance: true);
        Assert.Equal([0, 1, 2], chosen);
        Assert.Equal([2], forced);
    }

    [Fact]
    public void Without_declared_subscales_scales_follow_the_factors()
    {
        var (data, _) = Survey(n: 1200, subscaleOverride: new string[24]);
        var result = ShortFormBuilder.Build(data, 3, new ShortFormOptions
        {
            Factoring = new() { Extraction = ItemReduce.Core.Factoring.FactorExtraction.MaximumLikelihood },
            ItemsPerFactor = 3,
        });
        Assert.Equal(["F1", "F2", "F3"], result.Scales.Select(s => s.Scale).Order());
        Assert.All(result.Scales, s => Assert.Equal(3, s.SelectedItems.Count));
        // every chosen item is one of the planted strong items of a single factor
        Assert.All(result.SelectedIndices, j => Assert.Contains(j, StrongItems));
        Assert.All(result.Scales, s => Assert.Single(s.SelectedItems.Select(n => (int.Parse(n[1..]) - 1) / 8).Distinct()));
        Assert.NotNull(result.ShortSolution!.Fit);
        Assert.All(result.Judgements, j => Assert.Null(j.Subscale));
    }

    [Fact]
    public void Same_seed_gives_the_same_short_form_and_reliability()
    {
        var (data, _) = Survey(n: 800);
        var o = new ShortFormOptions { HoldoutFraction = 0.4, Seed = 3 };
        var a = ShortFormBuilder.Build(data, 3, o);
        var b = ShortFormBuilder.Build(data, 3, o);
        Assert.Equal(a.HoldoutRows, b.HoldoutRows);
        Assert.Equal(a.SelectedIndices, b.SelectedIndices);
        Assert.Equal(a.Reliability, b.Reliability);
    }

    [Fact]
    public void Invalid_options_are_rejected_with_the_value()
    {
        var (data, _) = Survey(n: 200);
        var ex = Assert.Throws<ArgumentException>(() => ShortFormBuilder.Build(data, 3, new ShortFormOptions { HoldoutFraction = 0.95 }));
        Assert.Contains("0.95", ex.Message);
        Assert.Throws<DataConditionException>(() => ShortFormBuilder.Build(data, 24));
    }
}
