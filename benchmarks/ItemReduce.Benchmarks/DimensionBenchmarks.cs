using BenchmarkDotNet.Attributes;
using ItemReduce.Core.Correlation;
using ItemReduce.Core.Dimensions;
using ItemReduce.Core.LinearAlgebra;
using ItemReduce.Core.Randomness;

namespace ItemReduce.Benchmarks;

/// <summary>
/// Dimensions-stage timings for n = 20,000 respondents and p = 100 items:
/// (a) normal-reference parallel analysis, 1,000 replicates, Wishart path (full matrix only, and with the
///     reduced-matrix reference as well);
/// (b) Pearson correlation matrix of complete 20,000 × 100 data (GFLOP/s convention: n·p² flops, i.e. one
///     multiply and one add per lower-triangle element per observation);
/// (c) one brute-force replicate: simulate 20,000 × 100 normals, correlate, eigenvalues.
/// </summary>
[SimpleJob(launchCount: 1, warmupCount: 1, iterationCount: 3)]
[MemoryDiagnoser]
public class DimensionBenchmarks
{
    private const int N = 20_000, P = 100;
    private double[] _data = [];
    private double[] _x = [];
    private double[] _r = [];

    [GlobalSetup]
    public void Setup()
    {
        var rng = new RandomStream(1);
        _data = new double[N * P];
        for (int i = 0; i < _data.Length; i++) _data[i] = rng.NextGaussian();
        _x = new double[N * P];
        _r = new double[P * P];
    }

    [Benchmark(Description = "(a) PA normal reference, Wishart, 1000 reps, n=20000 p=100")]
    public double[] ParallelAnalysisWishart() =>
        ParallelAnalysis.NormalReference(N, P, new ParallelAnalysisOptions { Replicates = 1000, IncludeReducedMatrix = false }).Percentile;

    [Benchmark(Description = "(a') same, plus reduced-matrix (SMC) reference")]
    public double[] ParallelAnalysisWishartWithReduced() =>
        ParallelAnalysis.NormalReference(N, P, new ParallelAnalysisOptions { Replicates = 1000, IncludeReducedMatrix = true }).Percentile;

    [Benchmark(Description = "(b) Pearson correlation 20000x100 complete, all cores")]
    public double[,] CorrelationAllCores() => PearsonCorrelation.Complete(_data, N, P, -1);

    [Benchmark(Description = "(b') Pearson correlation 20000x100 complete, 1 core")]
    public double[,] CorrelationOneCore() => PearsonCorrelation.Complete(_data, N, P, 1);

    [Benchmark(Description = "(c) brute-force replicate: simulate 20000x100, correlate (1 core), eigenvalues")]
    public double[] BruteForceReplicate()
    {
        ParallelAnalysis.BruteForceReplicate(N, P, RandomStream.ForTask(1, 0, 0), _x, _r);
        return SymmetricEigensolver.EigenvaluesInPlace(_r, P, new double[P], new double[P], new double[2 * P]);
    }

    [Benchmark(Description = "eigenvalues only, one 100x100 correlation matrix")]
    public double[] EigenvaluesOnly()
    {
        BartlettWishartSampler.SampleCorrelationInto(P, N - 1, new RandomStream(3), new double[P * P], _r);
        return SymmetricEigensolver.EigenvaluesInPlace(_r, P, new double[P], new double[P], new double[2 * P]);
    }
}
