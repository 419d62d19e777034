using ItemReduce.Core.Screening;
using ItemReduce.Simulation;
using Xunit.Abstractions;

namespace ItemReduce.Tests.Core.Screening;

/// <summary>A small slice of the screening validation study (benchmarks/ItemReduce.ScreeningStudy); truth = the planted
/// careless respondents of the simulator.</summary>
public class ScreeningStudySliceTests(ITestOutputHelper output)
{
    [Fact]
    public void Attentive_respondents_in_the_two_reported_cases_are_rarely_flagged_as_atypical()
    {
        // The two designs reported as failing: 600 × 30 seven-point items with 5 % missing (3 % careless planted), and
        // 200 × 24 five-point items, complete, attentive only. Target: ≤ 1 % atypical flags among attentive
        // respondents; before the change 60 % and 9 % were flagged.
        var a = ScreeningStudy.Run(new ScreeningStudy.Condition(30, 7, false, 0.05, 600, 0.03, 2), new ScreeningOptions(), 501);
        var b = ScreeningStudy.Run(new ScreeningStudy.Condition(24, 5, false, 0.0, 200, 0.0, 4), new ScreeningOptions(), 502);
        foreach (var o in new[] { a, b })
        {
            double rate = o.FalseFlagRate(ScreeningReasons.RobustDistance) + o.FalseFlagRate(ScreeningReasons.ClassicalDistance);
            output.WriteLine($"{o.Condition.Label}: atypical {rate:P3}");
            Assert.True(rate <= 0.01, $"{o.Condition.Label}: {rate:P3} of attentive respondents flagged as atypical");
        }
        // Straight-liners and wide alternation are always caught in the larger design (simulator truth).
        Assert.Equal(1.0, a.Recall(CarelessKind.StraightLine));
        Assert.Equal(1.0, a.Recall(CarelessKind.WideAlternation));
    }

    [Fact]
    public void Skewed_items_with_missing_answers_keep_the_false_flag_rate_near_nominal()
    {
        // 24 five-point skewed items, 10 % missing, n = 480, 10 % careless: attentive atypical share within
        // 2 × cutoff-p plus Monte Carlo error. 4 replicates ≈ 1,730 attentive respondents; at a true rate of 0.2 % the
        // count exceeds 9 with probability < 1 % (Binomial(1730, 0.002): mean 3.5).
        var o = ScreeningStudy.Run(new ScreeningStudy.Condition(24, 5, true, 0.10, 480, 0.10, 4), new ScreeningOptions(), 503);
        long atypical = o.AttentiveByReason.GetValueOrDefault(ScreeningReasons.RobustDistance) + o.AttentiveByReason.GetValueOrDefault(ScreeningReasons.ClassicalDistance);
        output.WriteLine($"attentive {o.Attentive}, atypical {atypical}; recall " +
                         string.Join(", ", ScreeningStudy.Kinds.Select(k => $"{ScreeningStudy.KindName(k)} {o.Recall(k):P0}")));
        Assert.True(atypical <= 9, $"{atypical} of {o.Attentive}");
        Assert.Equal(1.0, o.Recall(CarelessKind.StraightLine));
        Assert.Equal(1.0, o.Recall(CarelessKind.MostlyUnanswered));
    }
}
