using ItemReduce.Core.Pipeline;
using ItemReduce.Core.SelfCheck;
using ItemReduce.Core.ShortForm;
using ItemReduce.IO.Outputs;
using ItemReduce.Simulation;
using MathNet.Numerics.Distributions;

namespace ItemReduce.Tests.Core.SelfCheck;

/// <summary>
/// The self-check against a direct Monte Carlo of the same design, written here from the description of the design
/// (answer shares, missing shares, fitted loadings as latent truth, 1 % planted per kind), with its own seeds: the rates
/// the self-check reports must agree with the direct ones within their Monte Carlo intervals.
/// </summary>
public class DesignSelfCheckTests
{
    private const int Surveys = 16;

    /// <summary>A small planted two-factor survey and the settings both checks use (few parallel-analysis replicates to
    /// keep the suite fast).</summary>
    private static (PreparedData Prepared, PipelineSettings Settings) Planted(int surveys, int threads = -1)
    {
        var spec = FactorModelSpec.Simple(2, 5, 0.7, 0.3, 5) with
        {
            CategoryProbabilities = [0.1, 0.2, 0.3, 0.25, 0.15],
            Loadings = [0.8, 0.7, 0.6, 0.5, 0.4, 0.8, 0.7, 0.6, 0.5, 0.4],
        };
        var s = FactorModelSimulator.Generate(spec, new FactorModelSimulator.Settings(240, 31, 0.03, StraightLiners: 2, RandomResponders: 2));
        var settings = new PipelineSettings
        {
            Seed = 9,
            Dimensions = new() { Replicates = 60, MaxDegreeOfParallelism = threads },
            ShortForm = new() { ItemsPerFactor = 3 },
            SelfCheck = new() { Surveys = surveys },
        };
        return (PreparedData.From(s.Responses), settings);
    }

    /// <summary>Answers' correlation with their normal latent score (point-polyserial ÷ polyserial), written out here.</summary>
    private static double AnswerLatent(double[] values, double[] shares)
    {
        double m = values.Zip(shares, (v, q) => v * q).Sum();
        double sd = Math.Sqrt(values.Zip(shares, (v, q) => q * (v - m) * (v - m)).Sum());
        double c = 0, cum = 0;
        for (int t = 0; t < values.Length - 1; t++)
        {
            cum += shares[t];
            c += Normal.PDF(0, 1, Normal.InvCDF(0, 1, cum)) * (values[t + 1] - values[t]);
        }
        return c / sd;
    }

    private sealed class Direct
    {
        public long Attentive, FalseFlags;
        public Dictionary<CarelessKind, (long Planted, long Caught)> Kinds { get; } = [];
        public int Surveys, Recovered;
        public Dictionary<string, int> Kept { get; } = new(StringComparer.Ordinal);
        public Dictionary<string, List<double>> ShortAlpha { get; } = new(StringComparer.Ordinal);
    }

    private static Direct DirectMonteCarlo(PipelineResult main, PipelineSettings settings, int surveys)
    {
        var data = main.Analysed;
        var sol = main.ShortForm!.FullSolution;
        int p = data.ItemCount, k = sol.FactorCount;
        var scales = new ItemAnswerScale[p];
        var missing = new double[p];
        var pattern = new double[p, k];
        for (int j = 0; j < p; j++)
        {
            var answered = data.Column(j).Where(v => !double.IsNaN(v)).ToArray();
            var values = answered.Distinct().Order().ToArray();
            var shares = values.Select(v => answered.Count(x => x == v) / (double)answered.Length).ToArray();
            scales[j] = new ItemAnswerScale(values, shares);
            missing[j] = 1 - answered.Length / (double)data.RespondentCount;
            double a = AnswerLatent(values, shares), common = 0;
            for (int f = 0; f < k; f++) pattern[j, f] = sol.Pattern[j, f] / a;
            for (int f = 0; f < k; f++)
                for (int g = 0; g < k; g++) common += pattern[j, f] * sol.FactorCorrelations[f, g] * pattern[j, g];
            if (common > 0.95)
                for (int f = 0; f < k; f++) pattern[j, f] *= Math.Sqrt(0.95 / common);
        }
        var spec = new FactorModelSpec
        {
            ItemFactor = Enumerable.Range(0, p).Select(j => Enumerable.Range(0, k).MaxBy(f => Math.Abs(pattern[j, f]))).ToArray(),
            Loadings = new double[p],
            Pattern = pattern,
            FactorCorrelations = sol.FactorCorrelations,
            ItemScales = scales,
            ReverseKeyed = data.Items.Select(i => i.Reverse).ToArray(),
        };
        int n = main.Prepared.Scored.RespondentCount, each = Math.Max(1, (int)Math.Round(0.01 * n));
        var d = new Direct();
        var replicate = settings with { SelfCheck = new() { Surveys = 0 }, Confirmatory = false };
        for (int m = 0; m < surveys; m++)
        {
            var s = FactorModelSimulator.Generate(spec, new FactorModelSimulator.Settings(n, 70_000 + (ulong)m, StraightLiners: each,
                RandomResponders: each, WideAlternators: each, ItemMissingRates: missing, Items: data.Items.ToArray()));
            var r = SurveyPipeline.Run(PreparedData.From(s.Responses), replicate with { Seed = 90_000 + (ulong)m });
            d.Surveys++;
            for (int i = 0; i < n; i++)
            {
                bool flagged = r.Screening!.Respondents[i].Flagged;
                if (s.Careless[i] == CarelessKind.None) { d.Attentive++; if (flagged) d.FalseFlags++; continue; }
                var (pl, ca) = d.Kinds.GetValueOrDefault(s.Careless[i]);
                d.Kinds[s.Careless[i]] = (pl + 1, ca + (flagged ? 1 : 0));
            }
            if (r.Dimensions!.Retained == k) d.Recovered++;
            foreach (var item in r.ShortForm!.Scales.SelectMany(x => x.SelectedItems)) d.Kept[item] = d.Kept.GetValueOrDefault(item) + 1;
            foreach (var row in r.ShortForm.Reliability.Where(x => x.Form == ScaleForm.Short))
            {
                if (!d.ShortAlpha.TryGetValue(row.Scale, out var list)) d.ShortAlpha[row.Scale] = list = [];
                list.Add(row.Alpha);
            }
        }
        return d;
    }

    /// <summary>Comparisons made in the agreement test (rates of false flags, three recalls, recovery, six kept items).</summary>
    private const int Comparisons = 11;

    /// <summary>Two rates agree when they differ by less than the combined half-widths of their 95 % Wilson intervals,
    /// widened by Bonferroni for <see cref="Comparisons"/> comparisons (z(1 − .025/11) = 2.84 instead of 1.96; normal
    /// quantiles, common practice, no source).</summary>
    private static void Agree(string what, RateEstimate selfCheck, long events, long trials)
    {
        var direct = new RateEstimate(events, trials);
        double h1 = (selfCheck.Interval.High - selfCheck.Interval.Low) / 2, h2 = (direct.Interval.High - direct.Interval.Low) / 2;
        double widen = Normal.InvCDF(0, 1, 1 - 0.025 / Comparisons) / WilsonScoreInterval.Z95;
        Assert.True(Math.Abs(selfCheck.Rate - direct.Rate) <= widen * Math.Sqrt(h1 * h1 + h2 * h2),
            $"{what}: self-check {selfCheck.Rate:0.0000} [{selfCheck.Interval.Low:0.0000}, {selfCheck.Interval.High:0.0000}] vs direct {direct.Rate:0.0000} ({events}/{trials})");
    }

    [Fact]
    public void Recovered_rates_agree_with_a_direct_monte_carlo_of_the_same_design()
    {
        var (prepared, settings) = Planted(Surveys);
        var main = SurveyPipeline.Run(prepared, settings);
        var check = main.SelfCheck!;
        Assert.Equal(Surveys, check.Requested);
        Assert.Equal(Surveys, check.Completed);
        Assert.Equal(2, check.FittedFactors);
        Assert.Equal(2, check.PlantedEach); // 1 % of 240, rounded

        var d = DirectMonteCarlo(main, settings, Surveys);
        Agree("false flags", check.FalseFlags!, d.FalseFlags, d.Attentive);
        Assert.Equal(d.Attentive, check.FalseFlags!.Trials);
        foreach (var (kind, name) in DesignSelfCheck.PlantedKinds)
        {
            var rec = check.Recall.Single(x => x.Kind == name).Recall;
            Assert.Equal(d.Kinds[kind].Planted, rec.Trials);
            Agree("recall " + name, rec, d.Kinds[kind].Caught, d.Kinds[kind].Planted);
        }
        Agree("dimension recovery", check.DimensionRecovery!, d.Recovered, d.Surveys);
        foreach (var s in check.Stability) Agree("kept again " + s.Item, s.KeptAgain, d.Kept.GetValueOrDefault(s.Item), d.Surveys);
        foreach (var sc in check.Scales)
        {
            var direct = d.ShortAlpha[sc.Scale].Order().ToArray();
            double median = (direct[(direct.Length - 1) / 2] + direct[direct.Length / 2]) / 2;
            Assert.InRange(median, sc.Alpha.Low - 0.01, sc.Alpha.High + 0.01);
        }
    }

    [Fact]
    public void Results_do_not_depend_on_the_thread_count_and_follow_the_seed()
    {
        string Csv(int threads, ulong seed)
        {
            var (prepared, settings) = Planted(3, threads);
            return SelfCheckTables.Csv(SurveyPipeline.Run(prepared, settings with { Seed = seed }).SelfCheck!);
        }
        string one = Csv(1, 9);
        Assert.Equal(one, Csv(3, 9));
        Assert.NotEqual(one, Csv(1, 10));
    }

    [Fact]
    public void Zero_surveys_turns_the_check_off_and_other_scopes_never_run_it()
    {
        var (prepared, settings) = Planted(0);
        Assert.Null(SurveyPipeline.Run(prepared, settings).SelfCheck);
        Assert.Null(SurveyPipeline.Run(prepared, settings with { SelfCheck = new() { Surveys = 2 }, Scope = PipelineScope.Shorten }).SelfCheck);
        Assert.Throws<ArgumentOutOfRangeException>(new SelfCheckOptions { Surveys = -1 }.Validate);
    }
}
