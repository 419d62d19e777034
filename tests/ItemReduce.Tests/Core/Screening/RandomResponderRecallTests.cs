using System.Globalization;
using ItemReduce.Core.Screening;
using ItemReduce.Tests.Cli;

namespace ItemReduce.Tests.Core.Screening;

/// <summary>The random-responder recall the tool quotes against the committed validation-study table.</summary>
public class RandomResponderRecallTests
{
    private static readonly string[] Study = ["benchmarks/results/screening-study-index-careless-2026-12-02.md", "benchmarks/results/screening-study-index-careless12-2026-12-02.md"];

    [Fact]
    public void Quoted_figures_are_the_ones_in_the_committed_study_table()
    {
        // Source: the section "Random responders: the screening against the best possible test" of the committed
        // study slices for the random-answering index; cells with five-point items, 5 % missing and 20 respondents per item.
        var cells = Study.SelectMany(file =>
        {
            var lines = File.ReadAllLines(Path.Combine(PresentationTests.Root(), file));
            int start = Array.FindIndex(lines, l => l.StartsWith("## Random responders", StringComparison.Ordinal));
            Assert.True(start >= 0, "oracle section missing from " + file);
            return lines.Skip(start);
        }).Where(l => l.StartsWith("| ", StringComparison.Ordinal) && char.IsDigit(l[2]))
            .Select(l => l.Split('|', StringSplitOptions.TrimEntries)).ToList();
        static double Num(string s) => double.Parse(s.Split(' ')[0], CultureInfo.InvariantCulture);
        foreach (var band in RandomResponderRecall.Bands)
        {
            foreach (bool skewed in new[] { false, true })
            {
                var rows = cells.Where(c => int.Parse(c[1], CultureInfo.InvariantCulture) == band.Items && c[2] == "5" && c[3] == (skewed ? "skewed" : "symmetric")
                    && c[4] == "0.05" && int.Parse(c[5], CultureInfo.InvariantCulture) == 20 * band.Items).ToList();
                Assert.NotEmpty(rows);
                var ours = rows.Select(c => Num(c[8])).ToList();
                var best = rows.Select(c => Num(c[9])).Distinct().Single();
                Assert.Equal(skewed ? band.SkewedLow : band.SymmetricLow, ours.Min());
                Assert.Equal(skewed ? band.SkewedHigh : band.SymmetricHigh, ours.Max());
                Assert.Equal(skewed ? band.BestSkewed : band.BestSymmetric, best);
            }
        }
    }

    [Fact]
    public void The_statement_names_the_nearest_studied_design_and_advises_other_evidence()
    {
        Assert.Equal(24, RandomResponderRecall.Nearest(20).Items);
        Assert.Equal(12, RandomResponderRecall.Nearest(18).Items);   // ties go to the smaller band
        Assert.Equal(48, RandomResponderRecall.Nearest(200).Items);
        string text = RandomResponderRecall.Statement(24, 0.001)!;
        Assert.Contains("24 five-point items", text);
        Assert.Contains("attention-check items", text);
        Assert.Contains("human review", text);
        Assert.Contains("this run used cutoff p = 0.01", RandomResponderRecall.Statement(24, 0.01)!);
        foreach (var band in RandomResponderRecall.Bands) // a range whose ends round alike is one number ("92 %", not "92–92 %")
            if (RandomResponderRecall.Statement(band.Items, 0.001) is { } s)
                Assert.DoesNotMatch(@"\b(\d+)–\1 %", s);
    }

    [Fact]
    public void Where_the_index_raised_no_flags_the_statement_says_its_figures_include_it()
    {
        // 24 skewed five-point items, 5 % missing, 120 respondents (5 per item): the index is computed but flags only
        // from RespondentScreening.SmallSampleRatio (10) respondents per item, so the study's recall (which includes it)
        // does not describe this run; the statement must say so, on screen (warning) and in the rule text.
        var (scored, asAnswered, _) = ItemReduce.Simulation.ScreeningStudy.Draw(
            new ItemReduce.Simulation.ScreeningStudy.Condition(24, 5, true, 0.05, 120, 0.0, 1), 4242);
        var result = RespondentScreening.Run(scored, new ScreeningOptions(), asAnswered);
        var warning = Assert.Single(result.Warnings, w => w.Code == "random-answering-partly-detectable");
        Assert.Contains("raised no flags in this run (it flags only from 10 respondents per item)", warning.Message);
        Assert.Contains("raised no flags in this run", result.RuleDescription);
        Assert.DoesNotContain(ScreeningReasons.RandomLikeAnswers, result.ReasonCounts.Where(c => c.Count > 0).Select(c => c.Code));
    }
}
