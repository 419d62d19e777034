using ItemReduce.Core.Pipeline;
using ItemReduce.Simulation;

namespace ItemReduce.Tests.Core.Pipeline;

public class SurveyPipelineTests
{
    private static PreparedData Prepared(int n, ulong seed, int straight = 0)
    {
        var spec = FactorModelSpec.Simple(2, 5, 0.7, 0.2);
        var s = FactorModelSimulator.Generate(spec, new FactorModelSimulator.Settings(n, seed, StraightLiners: straight));
        return PreparedData.From(s.Responses);
    }

    [Fact]
    public void Flagged_respondents_are_set_aside_unless_kept()
    {
        var prepared = Prepared(400, 3, straight: 8);
        var settings = new PipelineSettings { Dimensions = new() { Replicates = 50 } };
        var set = SurveyPipeline.Run(prepared, settings);
        var kept = SurveyPipeline.Run(prepared, settings with { KeepFlagged = true });
        Assert.True(set.Screening!.FlaggedRespondents >= 8);
        Assert.Equal(400 - set.Screening.FlaggedRespondents, set.Analysed.RespondentCount);
        Assert.Equal(400, kept.Analysed.RespondentCount);
    }

    [Fact]
    public void Stages_outside_the_scope_do_not_run()
    {
        var prepared = Prepared(200, 4);
        var screen = SurveyPipeline.Run(prepared, new PipelineSettings { Scope = PipelineScope.Screen });
        Assert.NotNull(screen.Screening);
        Assert.Null(screen.Dimensions);
        Assert.Null(screen.ShortForm);
        var shorten = SurveyPipeline.Run(prepared, new PipelineSettings { Scope = PipelineScope.Shorten, Dimensions = new() { FixedFactors = 2 } });
        Assert.Null(shorten.Screening);
        Assert.Null(shorten.Dimensions); // a fixed count needs no dimension analysis
        Assert.Equal(2, shorten.FactorsUsed);
        Assert.Equal(200, shorten.Analysed.RespondentCount);
    }

    [Fact]
    public void Too_few_respondents_left_after_screening_stops_with_a_clear_reason()
    {
        // 12 respondents, 10 of them straight-liners: after setting them aside too few remain for 10 items.
        var prepared = Prepared(12, 5, straight: 10);
        var e = Assert.Throws<AnalysisStoppedException>(() => SurveyPipeline.Run(prepared, new PipelineSettings { Dimensions = new() { Replicates = 20 } }));
        Assert.Contains("remain after screening", e.Message);
        Assert.Equal(AnalysisStoppedException.TooFewAfterScreening, e.Code);
        Assert.DoesNotContain("--", e.Message); // Core does not know option names; the command line adds the advice
    }

    [Fact]
    public void A_stage_the_data_rule_out_stops_with_the_plain_reason()
    {
        // 8 respondents for 10 items (dimensions only, no screening): the dimension analysis needs at least p + 2 usable respondents.
        var prepared = Prepared(8, 6);
        var e = Assert.Throws<AnalysisStoppedException>(() => SurveyPipeline.Run(prepared,
            new PipelineSettings { Scope = PipelineScope.Dimensions, Dimensions = new() { Replicates = 20 } }));
        Assert.Equal("dimensions", e.Stage);
        Assert.IsType<ItemReduce.Core.DataConditionException>(e.InnerException);
        Assert.EndsWith(e.InnerException!.Message, e.Message); // the reason as Core wrote it, nothing cut or added
        Assert.Contains("Too few respondents for 10 items", e.Message);
        Assert.DoesNotContain("(Parameter", e.Message);
    }
}
