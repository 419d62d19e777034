using System.Diagnostics;
using System.Globalization;
using System.Text;
using BenchmarkDotNet.Attributes;
using ItemReduce.Core.Data;
using ItemReduce.Core.ShortForm;
using ItemReduce.Simulation;

namespace ItemReduce.Benchmarks;

/// <summary>
/// Short-form build on a large in-memory panel: n = 1,000,000 invented respondents × 40 five-point items from the
/// planted five-factor model of tools/ItemReduce.ScaleSurvey (8 items per factor, 2 reverse-keyed, factor
/// correlations .3, 1 % answers missing at random), stored compactly and reverse-scored as the pipeline does.
/// Parameter: holdout share (0 = items chosen and evaluated on everyone; 0.5 = half held out).
/// </summary>
[SimpleJob(launchCount: 1, warmupCount: 1, iterationCount: 3)]
[MemoryDiagnoser]
public class ShortFormBenchmarks
{
    private ResponseMatrix _panel = null!;

    [Params(0.0, 0.5)]
    public double Holdout { get; set; }

    [GlobalSetup]
    public void Setup() => _panel = ShortFormPanel.Make(1_000_000, 7);

    [Benchmark(Description = "short-form build, 1000000x40 compact, 5 factors")]
    public ShortFormResult Build() => ShortFormBuilder.Build(_panel, 5, new ShortFormOptions { HoldoutFraction = Holdout, Seed = 3 });
}

/// <summary>The panel of <see cref="ShortFormBenchmarks"/>, and a text dump of a short-form result with every double
/// in round-trip form (to compare two builds bit for bit).</summary>
internal static class ShortFormPanel
{
    public static ResponseMatrix Make(int respondents, ulong seed)
    {
        const int factors = 5, perFactor = 8, block = 100_000;
        int p = factors * perFactor;
        var itemFactor = new int[p];
        var loadings = new double[p];
        var reverse = new bool[p];
        var names = new string[p];
        for (int j = 0; j < p; j++)
        {
            itemFactor[j] = j % factors;
            loadings[j] = 0.45 + 0.05 * ((j / factors) % 7);
            reverse[j] = (j / factors) % 4 == 3;
            names[j] = "q" + (j + 1).ToString("00", CultureInfo.InvariantCulture);
        }
        var phi = new double[factors, factors];
        for (int a = 0; a < factors; a++)
            for (int b = 0; b < factors; b++) phi[a, b] = a == b ? 1.0 : 0.3;
        var spec = new FactorModelSpec
        {
            ItemFactor = itemFactor,
            Loadings = loadings,
            ReverseKeyed = reverse,
            FactorCorrelations = phi,
            Categories = 5,
            CategoryProbabilities = [0.08, 0.17, 0.30, 0.29, 0.16],
        };
        string[] subscales = ["s1", "s2", "s3", "s4", "s5"];
        ResponseMatrixBuilder? builder = null;
        var row = new double[p];
        for (int start = 0, b = 0; start < respondents; start += block, b++)
        {
            int rows = Math.Min(block, respondents - start);
            var m = FactorModelSimulator.Generate(spec, new FactorModelSimulator.Settings(
                Respondents: rows, Seed: seed + (ulong)b, MissingRate: 0.01, ItemNames: names, SubscaleNames: subscales)).Responses;
            builder ??= new ResponseMatrixBuilder(m.Items, respondents);
            for (int i = 0; i < rows; i++)
            {
                m.CopyRow(i, row);
                builder.Add("r" + (start + i + 1).ToString(CultureInfo.InvariantCulture), row);
            }
        }
        return ReverseScoring.Apply(builder!.Build());
    }

    /// <summary>Reliability rows, judgements, scales, selected items and warnings, one per line.</summary>
    public static string Dump(ShortFormResult r)
    {
        var sb = new StringBuilder();
        foreach (var row in r.Reliability) sb.AppendLine(row.ToString());
        foreach (var j in r.Judgements) sb.AppendLine(j.ToString() + " reasons=" + string.Join('|', j.Reasons));
        foreach (var s in r.Scales) sb.AppendLine($"{s.Scale} {s.HomeFactor} {s.Target} full={string.Join('|', s.FullItems)} short={string.Join('|', s.SelectedItems)}");
        sb.AppendLine("selected=" + string.Join(',', r.SelectedIndices));
        sb.AppendLine(string.Create(CultureInfo.InvariantCulture, $"n={r.SelectionRespondents} holdout={r.HoldoutRespondents}"));
        foreach (var w in r.Warnings) sb.AppendLine("warning: " + w);
        return sb.ToString();
    }

    /// <summary>Builds the short form on a panel of <paramref name="respondents"/>, writes the dump to
    /// <paramref name="path"/> and prints the time of each progress step.</summary>
    public static void DumpTo(string path, int respondents, double holdout)
    {
        var panel = Make(respondents, 7);
        for (int run = 0; run < 3; run++)
        {
            var watch = Stopwatch.StartNew();
            string? step = null;
            double last = 0;
            var steps = new List<string>();
            void Tell(string s)
            {
                double now = watch.Elapsed.TotalSeconds;
                if (step is not null) steps.Add(string.Create(CultureInfo.InvariantCulture, $"  {step}: {now - last:F3} s"));
                step = s;
                last = now;
            }
            var result = ShortFormBuilder.Build(panel, 5, new ShortFormOptions { HoldoutFraction = holdout, Seed = 3 }, Tell);
            Tell("end");
            Console.WriteLine(string.Create(CultureInfo.InvariantCulture, $"run {run}: {watch.Elapsed.TotalSeconds:F3} s"));
            foreach (var s in steps) Console.WriteLine(s);
            if (run == 0) File.WriteAllText(path, Dump(result));
        }
    }
}

/// <summary>
/// The listwise covariances behind the short-form reliability rows on the panel of <see cref="ShortFormBenchmarks"/>:
/// 10 column sets (5 scales of 8 items and a 4-item short form of each) on a 500,000-row holdout-like view, read once
/// per set (as before the batch) or once for all; and the 5 full scales of the whole panel once its pairwise sums are
/// cached (as for the selection sample after its correlations).
/// </summary>
[SimpleJob(launchCount: 1, warmupCount: 1, iterationCount: 5)]
[MemoryDiagnoser]
public class ListwiseBenchmarks
{
    private ResponseMatrix _panel = null!, _half = null!;
    private List<IReadOnlyList<int>> _scales = [], _sets = [];

    [GlobalSetup]
    public void Setup()
    {
        _panel = ShortFormPanel.Make(1_000_000, 7);
        _half = _panel.SelectRespondents(Enumerable.Range(0, _panel.RespondentCount).Where(i => i % 2 == 0).ToList());
        _scales = Enumerable.Range(0, 5).Select(f => (IReadOnlyList<int>)Enumerable.Range(0, 40).Where(j => j % 5 == f).ToArray()).ToList();
        _sets = [.. _scales, .. _scales.Select(s => (IReadOnlyList<int>)s.Take(4).ToArray())];
        ItemReduce.Core.Correlation.PairwiseSums.Compute(_panel, -1);
    }

    [Benchmark(Baseline = true, Description = "10 sets, 500000 rows, one read per set")]
    public int OneReadPerSet() => PerSet(_half, _sets);

    private static int PerSet(ResponseMatrix data, List<IReadOnlyList<int>> sets) =>
        sets.Sum(s => ItemReduce.Core.Reliability.ListwiseCovarianceBatch.Compute(data.SelectItems(s), [Enumerable.Range(0, s.Count).ToArray()])[0].Respondents);

    [Benchmark(Description = "10 sets, 500000 rows, one read")]
    public int OneRead() => ItemReduce.Core.Reliability.ListwiseCovarianceBatch.Compute(_half, _sets).Sum(c => c.Respondents);

    [Benchmark(Description = "5 scales, 1000000 rows, one read per set")]
    public int FullScalesPerSet() => PerSet(_panel, _scales);

    [Benchmark(Description = "5 scales, 1000000 rows, one read, cached sums")]
    public int FullScalesCached() => ItemReduce.Core.Reliability.ListwiseCovarianceBatch.Compute(_panel, _scales).Sum(c => c.Respondents);
}
