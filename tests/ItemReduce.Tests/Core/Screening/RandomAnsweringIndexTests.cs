using ItemReduce.Core.Screening;
using ItemReduce.Simulation;
using ItemReduce.Tests.Support;
using Xunit.Abstractions;

namespace ItemReduce.Tests.Core.Screening;

/// <summary>The Mendell–Elston rectangle probability, the random-answering index built on it, and a slice of the
/// screening study for the index.</summary>
public class RandomAnsweringIndexTests(ITestOutputHelper output)
{
    private static IEnumerable<(string Name, int M, double[] S, double[] Lower, double[] Upper, double Exact, double Approximation)> Rectangles() =>
        ReferenceData.Fields("Screening", "rectangle_probability.csv").Select(f =>
        {
            int m = int.Parse(f[1], System.Globalization.CultureInfo.InvariantCulture);
            var v = f.Skip(2).Select(ReferenceData.Parse).ToArray();
            return (f[0], m, v[..(m * m)], v[(m * m)..(m * m + m)], v[(m * m + m)..(m * m + 2 * m)], v[m * m + 2 * m], v[m * m + 2 * m + 1]);
        });

    [Fact]
    public void Mendell_Elston_matches_an_independent_numpy_implementation_and_stays_near_the_exact_probability()
    {
        // Reference: ReferenceData/Screening/rectangle_probability_reference.py — exact = scipy's multivariate normal
        // cdf (Genz), approximation = the same univariate conditioning written independently in numpy. Our value must
        // equal the numpy approximation to rounding; the approximation's own error on these factor-model rectangles is
        // below 1 % (0.9 % for the 0.5-correlated pair), so 2 % separates it from a wrong update rule (independence
        // would be off by 10–60 % on the correlated cases).
        int cases = 0;
        foreach (var c in Rectangles())
        {
            var s = (double[])c.S.Clone();
            double log = MendellElstonApproximation.LogProbability(s, c.M, c.Lower, c.Upper, new double[c.M]);
            output.WriteLine($"{c.Name}: ours {Math.Exp(log):G10}, numpy {c.Approximation:G10}, exact {c.Exact:G10}");
            Assert.Equal(Math.Log(c.Approximation), log, 1e-9);
            Assert.True(Math.Abs(Math.Exp(log) / c.Exact - 1) < 0.02, $"{c.Name}: {Math.Exp(log)} vs exact {c.Exact}");
            if (c.M == 1) Assert.Equal(Math.Log(c.Exact), log, 1e-12);
            cases++;
        }
        Assert.Equal(6, cases);
    }

    [Fact]
    public void With_uncorrelated_items_the_index_is_the_log_ratio_of_the_answer_shares()
    {
        // With R = I the model probability is the product of the answer shares (definition of the index; hand
        // computation): T = −Σ log c_j − Σ log share_j(x_j). Shares 1/31, 2/31, 4/31, 8/31, 16/31 on five categories.
        var counts = Enumerable.Range(0, 3).Select(_ => new Dictionary<double, long> { [1] = 1, [2] = 2, [3] = 4, [4] = 8, [5] = 16 }).ToList();
        var scores = NormalScores.FromCounts(counts);
        var identity = new double[9];
        for (int j = 0; j < 3; j++) identity[j * 3 + j] = 1;
        var index = new RandomAnsweringIndex(identity, scores, [5, 5, 5]);
        var scratch = new RandomAnsweringIndex.Scratch(3);
        double t = index.Compute([1, double.NaN, 4], scratch);
        Assert.Equal(-2 * Math.Log(5) - Math.Log(1 / 31.0) - Math.Log(8 / 31.0), t, 1e-9);
        Assert.True(double.IsNaN(index.Compute([double.NaN, double.NaN, double.NaN], scratch)));
        // Rare answers are more random-like than common ones.
        Assert.True(index.Compute([1, 1, 1], scratch) > index.Compute([5, 5, 5], scratch));
    }

    [Fact]
    public void Correlated_items_make_consistent_answers_less_random_like_than_inconsistent_ones()
    {
        // Property of any likelihood with positively correlated latent variables (no source needed): with the same
        // answer shares, the consistent pattern (1, 1) is more probable than (1, 5), so its index is lower; with
        // R = I both have the same index.
        var counts = Enumerable.Range(0, 2).Select(_ => new Dictionary<double, long> { [1] = 10, [2] = 20, [3] = 40, [4] = 20, [5] = 10 }).ToList();
        var scores = NormalScores.FromCounts(counts);
        var corr = new RandomAnsweringIndex([1, 0.6, 0.6, 1], scores, [5, 5]);
        var none = new RandomAnsweringIndex([1, 0, 0, 1], scores, [5, 5]);
        var s = new RandomAnsweringIndex.Scratch(2);
        Assert.True(corr.Compute([1, 1], s) < corr.Compute([1, 5], s) - 1);
        Assert.Equal(none.Compute([1, 1], s), none.Compute([1, 5], s), 1e-12);
    }

    [Fact]
    public void Study_slice_the_index_finds_random_responders_the_distance_misses_at_a_near_nominal_false_flag_rate()
    {
        // Truth: the planted careless respondents of the simulator. 36 skewed five-point items, 5 % missing, n = 720,
        // 10 % careless (15 uniform-random responders per survey), 2 surveys. In the committed study slice
        // (benchmarks/results/screening-study-index-careless-2026-12-02.md) the index alone flagged about half or more
        // of the random responders in such cells. Checks: the index flags at least 10 of the 30 random responders (at a
        // true recall of 50 %, fewer than 10 happen with probability about 0.02), and at most 4 of about 1,300
        // attentive respondents (its target is 0.05 %, expected 0.65; at 3 × that rate, 5 or more happen with
        // probability about 0.05).
        var o = ScreeningStudy.Run(new ScreeningStudy.Condition(36, 5, true, 0.05, 720, 0.10, 2), new ScreeningOptions(), 611);
        long planted = o.Planted[CarelessKind.UniformRandom];
        double byIndex = o.Recall(CarelessKind.UniformRandom, ScreeningReasons.RandomLikeAnswers);
        long attentive = o.AttentiveByReason.GetValueOrDefault(ScreeningReasons.RandomLikeAnswers);
        double byDistance = o.Recall(CarelessKind.UniformRandom, ScreeningReasons.RobustDistance);
        double byAny = o.Recall(CarelessKind.UniformRandom);
        output.WriteLine($"random {planted}: index {byIndex:P0}, distance {byDistance:P0}, any {byAny:P0}; attentive {o.Attentive}, by index {attentive}");
        Assert.Equal(30, planted);
        Assert.True(byIndex * planted >= 10, $"index flagged {byIndex:P0} of {planted}");
        Assert.True(attentive <= 4, $"{attentive} of {o.Attentive} attentive respondents flagged by the index");
        Assert.Equal(1.0, o.Recall(CarelessKind.StraightLine));
        Assert.Equal(1.0, o.Recall(CarelessKind.WideAlternation));
    }
}
