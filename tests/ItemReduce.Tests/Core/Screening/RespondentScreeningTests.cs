using ItemReduce.Core.Data;
using ItemReduce.Core.Screening;
using ItemReduce.Simulation;
using Xunit.Abstractions;

namespace ItemReduce.Tests.Core.Screening;

public class RespondentScreeningTests(ITestOutputHelper output)
{
    private static SimulatedSurvey Likert(int factors, int n, int straight, int random, double missing, ulong seed) =>
        FactorModelSimulator.Generate(FactorModelSpec.Simple(factors, 6, 0.7, 0.3),
            new FactorModelSimulator.Settings(n, seed, missing, straight, random));

    private static (double Recall, int Total) Recall(ScreeningResult r, CarelessKind[] truth, CarelessKind kind)
    {
        var idx = Enumerable.Range(0, truth.Length).Where(i => truth[i] == kind).ToArray();
        return (idx.Count(i => r.Respondents[i].Flagged) / (double)idx.Length, idx.Length);
    }

    [Fact]
    public void Planted_careless_respondents_are_flagged_in_simulated_likert_data()
    {
        // Known truth: FactorModelSimulator plants 30 straight-liners and 30 uniform-random responders among 1,500
        // respondents answering 48 five-point items (8 factors × 6 items, loadings 0.7, factor correlations 0.3).
        // Uniform-random answers are far from the correlated cloud only when there are many fairly strongly
        // correlated items: in our runs the robust-distance recall of random responders was 48 % with 24 such
        // items, 84 % with 36 and 96 % with 48 (10 % with 36 items loading 0.5), so the design below is one in which
        // the distance rule is expected to work. Straight-liners are caught by long-string / IRV in any design.
        var s = Likert(8, 1500, 30, 30, 0.0, 101);
        var data = ReverseScoring.Apply(s.Responses);
        var r = RespondentScreening.Run(data, new ScreeningOptions());
        var (straight, _) = Recall(r, s.Careless, CarelessKind.StraightLine);
        var (random, _) = Recall(r, s.Careless, CarelessKind.UniformRandom);
        var attentive = Enumerable.Range(0, s.Careless.Length).Where(i => s.Careless[i] == CarelessKind.None).ToArray();
        double falseFlag = attentive.Count(i => r.Respondents[i].Flagged) / (double)attentive.Length;
        double falseDistance = attentive.Count(i => r.Respondents[i].Reasons.Contains(ScreeningReasons.RobustDistance)) / (double)attentive.Length;
        output.WriteLine($"recall straight {straight:P1}, random {random:P1}; attentive flagged {falseFlag:P2} (distance {falseDistance:P2})");
        foreach (var c in r.ReasonCounts) output.WriteLine($"{c.Code}: {c.Count}");
        output.WriteLine($"h={r.Robust.SupportSize} c={r.Robust.ConsistencyFactor} rw={r.Robust.ReweightingFactor} kept={r.Robust.ReweightedCount} nested={r.Robust.NestedExtension}");
        Assert.True(straight >= 0.9, $"straight-liner recall {straight}");
        Assert.True(random >= 0.9, $"random-responder recall {random}");
        Assert.Equal("robust", r.DistanceRule);
        // Distance false flags among attentive respondents stay at about the nominal 0.1 % (≤ 5 of 1,440 allowed:
        // Binomial(1440, 0.001) exceeds 5 with probability < 0.1 %); other rules add few (≤ 2 % in all, our choice).
        Assert.True(falseDistance <= 5.0 / attentive.Length, $"distance false-flag rate {falseDistance}");
        Assert.True(falseFlag <= 0.02, $"overall false-flag rate {falseFlag}");
    }

    [Fact]
    public void Straight_liners_are_flagged_by_run_length_and_flat_profile_with_missing_answers_and_few_items()
    {
        // Known truth: 25 straight-liners among 600 respondents on 12 items (2 factors), 10 % MCAR missing answers.
        var s = Likert(2, 600, 25, 0, 0.10, 202);
        var r = RespondentScreening.Run(ReverseScoring.Apply(s.Responses), new ScreeningOptions(), s.Responses);
        var straight = Enumerable.Range(0, 600).Where(i => s.Careless[i] == CarelessKind.StraightLine).ToArray();
        Assert.All(straight, i => Assert.Contains(ScreeningReasons.FlatProfile, r.Respondents[i].Reasons));
        Assert.All(straight, i => Assert.Equal(0.0, r.Respondents[i].Irv));
        // Long-string: with 12 items the limit is at least max(8, 6) = 8; it is raised (up to 13 = rule off) where
        // runs are common among attentive respondents simulated from the fitted model — here loadings .7 and no
        // reverse-keyed items make long runs common, so the flat-profile rule is what catches the straight-liners.
        output.WriteLine($"repeated-run limit {r.RepeatedRunLimit}, alternating {r.AlternatingRunLimit}");
        Assert.InRange(r.RepeatedRunLimit, 8, 13);
        Assert.All(straight.Where(i => r.Respondents[i].LongString >= r.RepeatedRunLimit),
            i => Assert.Contains(ScreeningReasons.RepeatedAnswerRun, r.Respondents[i].Reasons));
        Assert.Equal(r.RepeatedRunLimit <= 12, r.RuleDescription.Contains("The same answer is given to at least", StringComparison.Ordinal));
        Assert.Contains(r.Warnings, w => w.Message.Contains("Even-odd consistency was not computed"));
    }

    [Fact]
    public void Distance_false_flag_rate_of_attentive_respondents_is_near_the_nominal_level()
    {
        // Continuous multivariate-normal items (Categories = 0), no careless respondents: under normality both
        // distances are ≈ χ²_df, so about CutoffP = 1 % of 4,000 respondents (40) should exceed the cutoff.
        // Binomial(4000, 0.01): mean 40, sd 6.3; the bounds are ±4 sd around the nominal count plus a small
        // allowance for estimation error in the covariance (common practice, no source).
        var spec = FactorModelSpec.Simple(3, 4, 0.6, 0.2, categories: 0);
        var s = FactorModelSimulator.Generate(spec, new FactorModelSimulator.Settings(4000, 77, 0.05));
        var r = RespondentScreening.Run(s.Responses, new ScreeningOptions { CutoffP = 0.01 });
        int robust = r.Respondents.Count(x => x.RobustPValue < 0.01);
        int classical = r.Respondents.Count(x => x.PValue < 0.01);
        output.WriteLine($"robust {robust}, classical {classical} of 4000");
        Assert.InRange(classical, 15, 65);
        Assert.InRange(robust, 15, 70);
        Assert.Equal(robust, r.ReasonCounts.Single(c => c.Code == ScreeningReasons.RobustDistance).Count);
    }

    [Fact]
    public void Row_array_shortcuts_agree_with_the_respondent_rows()
    {
        // Property: the array-based helpers (respondents to analyse, sorted distances for the Q–Q plot) give what a plain
        // walk over the respondent rows gives (the path used when the rows are an ordinary list).
        var s = Likert(2, 600, 25, 10, 0.10, 303);
        var r = RespondentScreening.Run(ReverseScoring.Apply(s.Responses), new ScreeningOptions());
        var copy = r with { Respondents = r.Respondents.ToList() };
        foreach (bool keep in new[] { false, true })
            Assert.Equal(copy.RespondentsToAnalyse(keep), r.RespondentsToAnalyse(keep));
        Assert.True(r.RespondentsToAnalyse(false).Count < r.RespondentsToAnalyse(true).Count);
        int p = s.Responses.ItemCount;
        foreach (bool robust in new[] { false, true })
        {
            var fast = r.SortedDistances(robust, p);
            Assert.Equal(copy.SortedDistances(robust, p), fast);
            Assert.True(fast.Length > 100);
            Assert.True(fast.Zip(fast.Skip(1)).All(t => t.First <= t.Second));
        }
    }
}
