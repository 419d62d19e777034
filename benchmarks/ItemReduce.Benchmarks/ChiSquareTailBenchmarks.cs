using BenchmarkDotNet.Attributes;
using ItemReduce.Core.Randomness;
using ItemReduce.Core.Screening;

namespace ItemReduce.Benchmarks;

/// <summary>
/// Cost of one chi-square upper-tail probability as the screening calls it (df = items answered, x = a squared
/// distance near df): 4096 seeded pairs with k in 30..40 and x = k·(0.5 .. 1.5). Compares the general incomplete-gamma
/// path (Math.NET, used for every call before) with the finite-sum path of <see cref="ChiSquareTail.UpperTail"/>.
/// ns per call = reported mean / 4096. A second pair of cases uses far-tail x = 3k .. 10k.
/// </summary>
[SimpleJob(launchCount: 1, warmupCount: 3, iterationCount: 8)]
public class ChiSquareTailBenchmarks
{
    private const int Pairs = 4096;
    private readonly double[] _x = new double[Pairs], _k = new double[Pairs], _farX = new double[Pairs];

    [GlobalSetup]
    public void Setup()
    {
        var rng = new RandomStream(20261202);
        for (int i = 0; i < Pairs; i++)
        {
            _k[i] = 30 + (int)(rng.NextDouble() * 11);
            _x[i] = _k[i] * (0.5 + rng.NextDouble());
            _farX[i] = _k[i] * (3 + 7 * rng.NextDouble());
        }
    }

    [Benchmark(Baseline = true, OperationsPerInvoke = Pairs)]
    public double GammaPathNearDf() => Run(_x, general: true);

    [Benchmark(OperationsPerInvoke = Pairs)]
    public double SumPathNearDf() => Run(_x, general: false);

    [Benchmark(OperationsPerInvoke = Pairs)]
    public double GammaPathFarTail() => Run(_farX, general: true);

    [Benchmark(OperationsPerInvoke = Pairs)]
    public double SumPathFarTail() => Run(_farX, general: false);

    private double Run(double[] xs, bool general)
    {
        double s = 0;
        for (int i = 0; i < Pairs; i++)
            s += general ? ChiSquareTail.GammaUpperTail(xs[i], _k[i]) : ChiSquareTail.UpperTail(xs[i], _k[i]);
        return s;
    }
}
