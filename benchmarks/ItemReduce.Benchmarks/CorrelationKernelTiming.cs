using System.Diagnostics;
using System.Globalization;
using ItemReduce.Core.Correlation;
using ItemReduce.Core.Randomness;

namespace ItemReduce.Benchmarks;

/// <summary>
/// Best-of-R timing (R batches of calls, each at least a quarter second of CPU) of the complete-data Pearson correlation (<see
/// cref="PearsonCorrelation"/>: means, centring into
/// tiles, the lower triangle of XcᵀXc, scaling) on seeded normal n × p data, for comparison with a dgemm of the same
/// shape in another process (benchmarks/kernel/correlation-roof.sh). Prints one line per shape:
/// <c>n p best_wall_seconds gflops best_cpu_seconds gflops_per_cpu_second</c>, flops counted as n·p² (one multiply and one add per lower-triangle
/// entry and
/// observation, the convention of the README's Speed table). Not a BenchmarkDotNet job: the script alternates it
/// with the dgemm timing so that both see the same load on the shared machine.
/// </summary>
internal static class CorrelationKernelTiming
{
    public static void Run(int[] ns, int[] ps, int repeats, int threads)
    {
        foreach (int n in ns)
            foreach (int p in ps)
            {
                var rng = new RandomStream(1);
                var data = new double[n * p];
                for (int i = 0; i < data.Length; i++) data[i] = rng.NextGaussian();
                PearsonCorrelation.Complete(data, n, p, threads); // compile and warm the caches
                double best = double.PositiveInfinity, bestCpu = double.PositiveInfinity;
                using var process = Process.GetCurrentProcess();
                for (int r = 0; r < repeats; r++)
                {
                    // The process CPU clock ticks coarsely, so each timing covers calls until a quarter second of CPU
                    // has passed; per-call times are the batch's divided by its calls.
                    process.Refresh();
                    var cpu = process.TotalProcessorTime;
                    var clock = Stopwatch.StartNew();
                    int calls = 0;
                    double used;
                    do
                    {
                        PearsonCorrelation.Complete(data, n, p, threads);
                        calls++;
                        process.Refresh();
                        used = (process.TotalProcessorTime - cpu).TotalSeconds;
                    } while (used < 0.25);
                    best = Math.Min(best, clock.Elapsed.TotalSeconds / calls);
                    bestCpu = Math.Min(bestCpu, used / calls);
                }
                double flops = (double)n * p * p;
                Console.WriteLine(string.Create(CultureInfo.InvariantCulture,
                    $"{n} {p} {best:0.000000} {flops / best / 1e9:0.00} {bestCpu:0.000000} {flops / bestCpu / 1e9:0.00}"));
            }
    }
}
