using System.Text;
using ItemReduce.Application.Appendix;
using ItemReduce.Core.Data;
using ItemReduce.Core.Dimensions;
using ItemReduce.Core.Screening;
using ItemReduce.IO;
using ItemReduce.IO.Outputs;
using ItemReduce.Simulation;
using static ItemReduce.IO.SafeCsvWriter;

namespace ItemReduce.Tests.IO;

/// <summary>Outputs that must not grow with the panel: the streamed flags table, the thinned Q–Q plot and the
/// permutation subsample (property checks; the expected flags table is built the way it was built before streaming).</summary>
public class ScaleOutputTests
{
    private static ScreeningResult Screen()
    {
        var s = FactorModelSimulator.Generate(FactorModelSpec.Simple(3, 4, 0.7, 0.3),
            new FactorModelSimulator.Settings(300, 11, 0.05, 4, 4));
        return RespondentScreening.Run(ReverseScoring.Apply(s.Responses), new ScreeningOptions(), s.Responses);
    }

    [Fact]
    public void Streamed_respondent_flags_have_the_same_bytes_as_the_table_built_in_memory()
    {
        var r = Screen();
        // The table as it was produced before streaming: every row appended to one in-memory writer.
        var w = new SafeCsvWriter(["respondent", "items_answered", "d2", "robust_d2", "cutoff", "p_value", "long_string", "irv",
            "missing_share", "flagged", "reasons", "robust_p_value", "even_odd", "alternating_run", "person_total", "synonyms", "antonyms", "random_answer_llr"]);
        foreach (var x in r.Respondents)
            w.AppendRow([Text(x.RespondentId), Integer(x.ItemsAnswered), Number(x.D2, 6), Number(x.RobustD2, 6),
                Number(x.Cutoff, 6), Number(x.PValue), Integer(x.LongString), Number(x.Irv, 6), Number(x.MissingShare, 6),
                Bool(x.Flagged), Text(string.Join(';', x.Reasons)), Number(x.RobustPValue), Number(x.EvenOdd, 6),
                Integer(x.AlternatingRun), Number(x.PersonTotal, 6), Number(x.Synonyms, 6), Number(x.Antonyms, 6), Number(x.RandomAnswering, 6)]);
        byte[] expected = new UTF8Encoding(false).GetBytes(w.ToString());

        string dir = Path.Combine(Path.GetTempPath(), "ir-stream-" + Guid.NewGuid().ToString("N"));
        try
        {
            using (var staging = OutputStaging.Begin(dir, force: false))
            {
                staging.WriteStream("respondent-flags.csv", stream => ScreeningTables.WriteRespondentFlags(r, stream));
                staging.Commit();
            }
            Assert.Equal(expected, File.ReadAllBytes(Path.Combine(dir, "respondent-flags.csv")));
            Assert.Equal(expected, new UTF8Encoding(false).GetBytes(ScreeningTables.RespondentFlags(r)));
        }
        finally
        {
            if (Directory.Exists(dir)) Directory.Delete(dir, true);
        }
    }

    [Theory]
    [InlineData(10)]
    [InlineData(2100)]
    [InlineData(2101)]
    [InlineData(1_999_999)]
    public void The_qq_plot_keeps_every_point_up_to_the_limit_and_the_ends_and_tail_beyond(int n)
    {
        var ranks = AppendixBuilder.QqRanks(n);
        if (n <= AppendixBuilder.QqEvenRanks + AppendixBuilder.QqTailRanks)
        {
            Assert.Equal(Enumerable.Range(0, n), ranks);
            return;
        }
        Assert.InRange(ranks.Count, AppendixBuilder.QqEvenRanks, AppendixBuilder.QqEvenRanks + AppendixBuilder.QqTailRanks);
        Assert.Equal(0, ranks[0]);
        Assert.Equal(n - 1, ranks[^1]);
        Assert.True(ranks.Zip(ranks.Skip(1)).All(t => t.First < t.Second));
        Assert.Subset(ranks.ToHashSet(), Enumerable.Range(n - AppendixBuilder.QqTailRanks, AppendixBuilder.QqTailRanks).ToHashSet());
    }

    [Fact]
    public void The_permutation_reference_shuffles_a_seeded_subsample_above_the_cap()
    {
        var s = FactorModelSimulator.Generate(FactorModelSpec.Simple(2, 3, 0.7), new FactorModelSimulator.Settings(600, 3, 0.02));
        var data = ReverseScoring.Apply(s.Responses);
        var o = new DimensionOptions { Reference = ReferenceKind.Permutation, Replicates = 20, Seed = 4 };
        var all = DimensionAnalysis.Run(data, o);
        Assert.Equal(600, all.Reference.PermutedRespondents);
        Assert.False(all.Reference.Subsampled);

        var sub = ParallelAnalysis.PermutationReference(data,
            d => ItemReduce.Core.Correlation.PearsonCorrelation.Compute(d, ItemReduce.Core.Correlation.MissingDataHandling.Pairwise, 1),
            new ParallelAnalysisOptions { Replicates = 20, Seed = 4, PermutationMaxRows = 200 });
        Assert.True(sub.Subsampled);
        Assert.Equal(200, sub.PermutedRespondents);
        Assert.Equal(6, sub.Mean.Length);

        // Compact data shuffle their byte codes with the same permutations as the dense path shuffles doubles, so the
        // two references agree up to the rounding of the correlations.
        var b = new ResponseMatrixBuilder(s.Responses.Items);
        var row = new double[s.Responses.ItemCount];
        for (int i = 0; i < s.Responses.RespondentCount; i++) { s.Responses.CopyRow(i, row); b.Add(s.Responses.RespondentIds[i], row); }
        var compact = ReverseScoring.Apply(b.Build());
        Assert.True(compact.IsCompact);
        Func<ResponseMatrix, double[,]> pearson = d => ItemReduce.Core.Correlation.PearsonCorrelation.Compute(d, ItemReduce.Core.Correlation.MissingDataHandling.Pairwise, 1);
        var po = new ParallelAnalysisOptions { Replicates = 20, Seed = 4, PermutationMaxRows = 200 };
        var fromCodes = ParallelAnalysis.PermutationReference(compact, pearson, po);
        var fromValues = ParallelAnalysis.PermutationReference(data, pearson, po);
        Assert.False(data.IsCompact);
        for (int c = 0; c < 6; c++)
        {
            Assert.Equal(fromValues.Mean[c], fromCodes.Mean[c], 1e-12);
            Assert.Equal(fromValues.Percentile[c], fromCodes.Percentile[c], 1e-12);
        }

        var capped = ParallelAnalysis.SubsampleRows(600, 200, 4);
        Assert.Equal(200, capped.Distinct().Count());
        Assert.True(capped.Zip(capped.Skip(1)).All(t => t.First < t.Second));
        Assert.Equal(capped, ParallelAnalysis.SubsampleRows(600, 200, 4)); // seeded
        Assert.NotEqual(capped, ParallelAnalysis.SubsampleRows(600, 200, 5));
    }

    [Fact]
    public void Rounded_numbers_are_written_exactly_as_the_general_round_trip_formatter_writes_them()
    {
        // Property (the reference is .NET's own "R" formatting of Math.Round(v, 6), the rule of SafeCsvWriter.Number):
        // the integer fast path must give the same text for every value, including exponent-range, tie and boundary cases.
        var rng = new ItemReduce.Core.Randomness.RandomStream(404);
        var values = new List<double> { 0, -0.0, 1, -1, 0.5, 1e-4, -1e-4, 9.99995e-5, 0.000049999, 1e-7, 123456.0000005, 0.1 + 0.2,
            999999999.999999, 1e9, 1e15, 2.5e-6, 72.05466300000001, double.Epsilon, double.MaxValue, -double.MaxValue };
        for (int i = 0; i < 200_000; i++)
        {
            double magnitude = Math.Pow(10, rng.NextDouble() * 16 - 7);
            double v = (rng.NextDouble() < 0.5 ? -1 : 1) * magnitude * rng.NextDouble();
            values.Add(v);
            values.Add(Math.Round(v, 6));                 // already on the 6-decimal grid
            values.Add(Math.Round(v, 6) + 5e-7);          // a tie, or close to one
        }
        var buffer = new byte[64];
        foreach (double v in values)
        {
            string expected = Math.Round(v, 6).ToString("R", System.Globalization.CultureInfo.InvariantCulture);
            int n = ScreeningTables.FormatRounded(v, buffer);
            Assert.Equal(expected, Encoding.UTF8.GetString(buffer, 0, n));
        }
    }
}
