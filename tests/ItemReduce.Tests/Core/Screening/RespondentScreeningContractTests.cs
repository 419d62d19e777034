using ItemReduce.Core;
using ItemReduce.Core.Data;
using ItemReduce.Core.Screening;
using ItemReduce.Simulation;

namespace ItemReduce.Tests.Core.Screening;

/// <summary>Contract of the façade: shapes, order, fallbacks, validation (properties, no outside values needed).</summary>
public class RespondentScreeningContractTests
{
    private static SimulatedSurvey Survey(int n, double missing, ulong seed, int straight = 0, bool reverse = false)
    {
        var spec = FactorModelSpec.Simple(3, 4, 0.7, 0.3);
        if (reverse) spec = spec with { ReverseKeyed = Enumerable.Range(0, 12).Select(j => j % 4 == 3).ToArray() };
        return FactorModelSimulator.Generate(spec, new FactorModelSimulator.Settings(n, seed, missing, straight));
    }

    [Fact]
    public void Rows_follow_input_order_and_counts_add_up()
    {
        var s = Survey(400, 0.05, 1);
        var data = ReverseScoring.Apply(s.Responses);
        var r = RespondentScreening.Run(data, new ScreeningOptions());
        Assert.Equal(400, r.TotalRespondents);
        Assert.Equal(data.RespondentIds, r.Respondents.Select(x => x.RespondentId));
        Assert.Equal(r.Respondents.Count(x => x.Flagged), r.FlaggedRespondents);
        Assert.All(r.Respondents, x => Assert.Equal(x.Flagged, x.Reasons.Count > 0));
        foreach (var c in r.ReasonCounts) Assert.Equal(r.Respondents.Count(x => x.Reasons.Contains(c.Code)), c.Count);
        Assert.Equal(ScreeningReasons.All, r.ReasonCounts.Select(c => c.Code));
        Assert.All(r.Respondents, x =>
        {
            Assert.Equal(12 - (int)Math.Round(x.MissingShare * 12), x.ItemsAnswered);
            // The robust rule's cutoff (divided by the ordinal calibration factor) has df = items answered and lies below
            // the asymptotic χ²_df cutoff (the in-sample Beta law is bounded; Wilks 1963), with the stated tail probability.
            Assert.True(x.Cutoff / r.Robust.ConsistencyFactor < ChiSquareTail.UpperQuantile(0.001, x.ItemsAnswered));
            Assert.Equal(0.001, BetaDistanceLaw.UpperTail(x.Cutoff / r.Robust.ConsistencyFactor, x.ItemsAnswered, r.Robust.SupportSize), 1e-9);
        });
        Assert.Equal(20, r.CentreShareByItems.Count); // max(p = 12, 20)
        Assert.Contains("human review", r.RuleDescription);
        Assert.Contains("not automatic deletion", r.RuleDescription);
    }

    [Fact]
    public void Repeated_runs_give_the_same_result_and_the_options_carry_no_seed()
    {
        // The robust estimate starts from EM and uses no random subsets, so the screening takes no seed at all
        // (the pipeline's --seed reaches only the stages with random steps).
        Assert.DoesNotContain(typeof(ScreeningOptions).GetProperties(), p => p.Name.Contains("Seed", StringComparison.Ordinal));
        var data = ReverseScoring.Apply(Survey(700, 0.05, 2).Responses);
        var a = RespondentScreening.Run(data, new ScreeningOptions());
        var b = RespondentScreening.Run(data, new ScreeningOptions());
        Assert.Equal(a.Respondents.Select(x => x.RobustD2), b.Respondents.Select(x => x.RobustD2));
        Assert.Equal(a.Respondents.Select(x => x.Flagged), b.Respondents.Select(x => x.Flagged));
    }

    [Fact]
    public void Large_samples_fit_the_robust_estimator_to_a_capped_subsample()
    {
        var data = ReverseScoring.Apply(Survey(3000, 0.0, 3).Responses);
        var r = RespondentScreening.Run(data, new ScreeningOptions { RobustMaxRows = 800 });
        Assert.True(r.Robust.Available && r.Robust.Subsampled);
        Assert.Equal(800, r.Robust.RowsUsed);
        Assert.Equal(3000, r.Robust.CompleteRows);
        Assert.InRange(r.Robust.SupportSize, 700, 800);   // rows kept by the final rejection step
        Assert.All(r.Respondents, x => Assert.False(double.IsNaN(x.RobustD2)));
    }

    [Fact]
    public void Too_few_complete_rows_fall_back_to_the_classical_distance_with_a_warning()
    {
        // 60 % missing per answer: almost no respondent answers all 12 items.
        var data = ReverseScoring.Apply(Survey(200, 0.6, 4).Responses);
        var r = RespondentScreening.Run(data, new ScreeningOptions());
        Assert.False(r.Robust.Available);
        Assert.Equal("classical", r.DistanceRule);
        Assert.Contains(r.Warnings, w => w.Message.Contains("classical distance instead"));
        Assert.All(r.Respondents, x => Assert.True(double.IsNaN(x.RobustD2)));
        Assert.DoesNotContain(r.Respondents, x => x.Reasons.Contains(ScreeningReasons.RobustDistance));
        Assert.Contains(r.Respondents, x => x.Reasons.Contains(ScreeningReasons.MostlyUnanswered));
    }

    [Fact]
    public void Long_string_and_irv_use_the_answers_as_given_when_supplied()
    {
        // One respondent ticks "5" on every item as presented; the reverse-keyed items then score 1 after reverse
        // scoring, so the analysed profile alternates and only the as-given answers show the straight line.
        var s = Survey(300, 0.0, 5, reverse: true);
        var raw = s.Responses.ToArray();
        for (int j = 0; j < 12; j++) raw[j] = 5;
        var asGiven = s.Responses.WithValues(raw);
        var analysed = ReverseScoring.Apply(asGiven);
        var withRaw = RespondentScreening.Run(analysed, new ScreeningOptions(), asGiven).Respondents[0];
        var without = RespondentScreening.Run(analysed, new ScreeningOptions()).Respondents[0];
        Assert.Equal(12, withRaw.LongString);
        Assert.Equal(0.0, withRaw.Irv);
        Assert.Contains(ScreeningReasons.FlatProfile, withRaw.Reasons);
        Assert.Equal(3, without.LongString); // 5 5 5 1 | 5 5 5 1 | ...
        Assert.True(without.Irv > 1);
    }

    [Fact]
    public void Classical_rule_when_robust_is_off()
    {
        var data = ReverseScoring.Apply(Survey(300, 0.0, 6).Responses);
        var r = RespondentScreening.Run(data, new ScreeningOptions { UseRobust = false });
        Assert.Equal("classical", r.DistanceRule);
        Assert.Equal(r.Respondents.Count(x => x.D2 > x.Cutoff), r.ReasonCounts.Single(c => c.Code == ScreeningReasons.ClassicalDistance).Count);
        Assert.True(r.Robust.Available); // still reported
    }

    [Fact]
    public void Degenerate_inputs_do_not_crash()
    {
        // Respondents 2 and 4 answered nothing; item 3 is answered by one respondent only (no pairwise covariance).
        double n = double.NaN;
        var rows = new[]
        {
            new[] { 1.0, 2, n }, [n, n, n], [2.0, 2, n], [n, n, n], [3.0, 1, 4], [4.0, 5, n], [2.0, 4, n],
        };
        var r = RespondentScreening.Run(MahalanobisDistanceTests.Matrix(rows, 3), new ScreeningOptions());
        Assert.Equal(7, r.TotalRespondents);
        Assert.True(double.IsNaN(r.Respondents[1].D2) && double.IsNaN(r.Respondents[3].D2));
        Assert.Equal([ScreeningReasons.MostlyUnanswered], r.Respondents[1].Reasons);
        Assert.False(double.IsNaN(r.Respondents[0].D2));
        Assert.False(r.Robust.Available);
        Assert.Contains(r.Warnings, w => w.Message.Contains("fewer than 2 respondents answering both"));
        Assert.Throws<DataConditionException>(() => RespondentScreening.Run(MahalanobisDistanceTests.Matrix([[1.0, 2]], 2), new ScreeningOptions()));
    }

    [Theory]
    [InlineData(nameof(ScreeningOptions.CutoffP))]
    [InlineData(nameof(ScreeningOptions.RobustMaxRows))]
    [InlineData(nameof(ScreeningOptions.RunShare))]
    [InlineData(nameof(ScreeningOptions.EvenOddFlagSubscales))]
    [InlineData(nameof(ScreeningOptions.MissingLimit))]
    public void Out_of_range_options_are_rejected_with_their_name(string option)
    {
        var o = option switch
        {
            nameof(ScreeningOptions.CutoffP) => new ScreeningOptions { CutoffP = 0.7 },
            nameof(ScreeningOptions.RobustMaxRows) => new ScreeningOptions { RobustMaxRows = 5 },
            nameof(ScreeningOptions.RunShare) => new ScreeningOptions { RunShare = 0 },
            nameof(ScreeningOptions.EvenOddFlagSubscales) => new ScreeningOptions { EvenOddFlagSubscales = 3, EvenOddMinSubscales = 5 },
            _ => new ScreeningOptions { MissingLimit = 1 },
        };
        var data = ReverseScoring.Apply(Survey(50, 0, 7).Responses);
        var e = Assert.Throws<ArgumentException>(() => RespondentScreening.Run(data, o));
        Assert.Contains(option, e.Message);
    }
}
