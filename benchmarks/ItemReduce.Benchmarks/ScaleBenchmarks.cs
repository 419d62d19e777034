using System.Globalization;
using System.Text;
using BenchmarkDotNet.Attributes;
using ItemReduce.Core.Correlation;
using ItemReduce.Core.Data;
using ItemReduce.Core.Randomness;
using ItemReduce.IO;

namespace ItemReduce.Benchmarks;

/// <summary>
/// Large-panel timings for n = 200,000 respondents and p = 40 five-point items:
/// (d) intake: read and validate a 200,000 × 40 CSV (1 % empty cells) into compact storage (rows/s = 200,000 / mean);
/// (e) Pearson correlation on compact (one byte per cell) data: complete data (tiled kernel, rows decoded per tile)
///     and with 1 % missing (pairwise-complete, two passes); GFLOP/s convention n·p² as in dimensions-2026-12-02.md;
/// (e′) the same on dense double storage, for comparison.
/// </summary>
[SimpleJob(launchCount: 1, warmupCount: 1, iterationCount: 3)]
[MemoryDiagnoser]
public class ScaleBenchmarks
{
    private const int N = 200_000, P = 40;
    private string _dir = "";
    private string _responses = "";
    private Codebook _codebook = new([]);
    private IReadOnlyList<long> _lines = [];
    private ResponseMatrix _compactComplete = null!, _compactMissing = null!, _denseComplete = null!, _denseMissing = null!;

    [GlobalSetup]
    public void Setup()
    {
        _dir = Path.Combine(Path.GetTempPath(), "itemreduce-bench-" + Environment.ProcessId.ToString(CultureInfo.InvariantCulture));
        Directory.CreateDirectory(_dir);
        var items = Enumerable.Range(1, P).Select(j => new ItemDefinition("q" + j.ToString("00", CultureInfo.InvariantCulture), "s" + (j % 5), j % 4 == 0, 1, 5, null)).ToList();
        var cb = new StringBuilder("item,subscale,reverse,min,max,text\n");
        foreach (var it in items) cb.Append(CultureInfo.InvariantCulture, $"{it.Name},{it.Subscale},{(it.Reverse ? "true" : "false")},1,5,\n");
        string codebookPath = Path.Combine(_dir, "codebook.csv");
        File.WriteAllText(codebookPath, cb.ToString());
        (_codebook, _lines) = CodebookReader.Read(codebookPath);

        var rng = new RandomStream(17);
        var complete = new double[N * P];
        for (int i = 0; i < N; i++)
        {
            double f = rng.NextGaussian();
            for (int j = 0; j < P; j++)
                complete[i * P + j] = Math.Clamp(Math.Round(3 + 0.8 * f + rng.NextGaussian()), 1, 5);
        }
        var missing = (double[])complete.Clone();
        for (int k = 0; k < missing.Length; k++) if (rng.NextDouble() < 0.01) missing[k] = double.NaN;

        _responses = Path.Combine(_dir, "responses.csv");
        using (var w = new StreamWriter(_responses, false, new UTF8Encoding(false), 1 << 20))
        {
            w.Write("respondent," + string.Join(',', items.Select(i => i.Name)) + "\n");
            for (int i = 0; i < N; i++)
            {
                w.Write('r');
                w.Write(i + 1);
                for (int j = 0; j < P; j++)
                {
                    w.Write(',');
                    double x = missing[i * P + j];
                    if (!double.IsNaN(x)) w.Write((int)x);
                }
                w.Write('\n');
            }
        }
        var ids = Enumerable.Range(1, N).Select(i => "r" + i.ToString(CultureInfo.InvariantCulture)).ToList();
        _denseComplete = new ResponseMatrix(ids, items, complete);
        _denseMissing = new ResponseMatrix(ids, items, missing);
        _compactComplete = Compact(_denseComplete);
        _compactMissing = Compact(_denseMissing);
    }

    private static ResponseMatrix Compact(ResponseMatrix dense)
    {
        var b = new ResponseMatrixBuilder(dense.Items, dense.RespondentCount);
        var row = new double[dense.ItemCount];
        for (int i = 0; i < dense.RespondentCount; i++) { dense.CopyRow(i, row); b.Add(dense.RespondentIds[i], row); }
        return b.Build();
    }

    [GlobalCleanup]
    public void Cleanup()
    {
        if (Directory.Exists(_dir)) Directory.Delete(_dir, true);
    }

    [Benchmark(Description = "(d) intake 200000x40 CSV -> compact matrix")]
    public int Intake() => ResponseReader.Read(_responses, _codebook, _lines, "codebook.csv", new IntakeOptions()).Responses.RespondentCount;

    [Benchmark(Description = "(e) Pearson 200000x40 compact, complete")]
    public double[,] CorrelationCompactComplete() => PearsonCorrelation.Compute(_compactComplete, MissingDataHandling.Pairwise, -1);

    /// <summary>A fresh view per call: exact pairwise sums are cached per matrix object, and the benchmark must not hit that cache.</summary>
    [Benchmark(Description = "(e) Pearson 200000x40 compact, 1% missing, pairwise")]
    public double[,] CorrelationCompactPairwise() =>
        PearsonCorrelation.Compute(_compactMissing.SelectItems(Enumerable.Range(0, P).ToArray()), MissingDataHandling.Pairwise, -1);

    [Benchmark(Description = "(e') Pearson 200000x40 dense, complete")]
    public double[,] CorrelationDenseComplete() => PearsonCorrelation.Compute(_denseComplete, MissingDataHandling.Pairwise, -1);

    [Benchmark(Description = "(e') Pearson 200000x40 dense, 1% missing, pairwise")]
    public double[,] CorrelationDensePairwise() => PearsonCorrelation.Compute(_denseMissing, MissingDataHandling.Pairwise, -1);
}
