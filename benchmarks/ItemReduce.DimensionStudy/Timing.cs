using System.Diagnostics;
using ItemReduce.Core.Correlation;
using ItemReduce.Core.Dimensions;
using ItemReduce.Core.LinearAlgebra;
using ItemReduce.Simulation;

namespace ItemReduce.DimensionStudy;

/// <summary>Step times of the dimensions stage at 20,000 × 100 (four factors, 25 items each), for tuning.</summary>
internal static class Timing
{
    public static void Run()
    {
        var spec = FactorModelSpec.Simple(4, 25, 0.6, 0.3, categories: 7);
        var data = FactorModelSimulator.Generate(spec, new FactorModelSimulator.Settings(20_000, 5)).Responses;
        var r = PearsonCorrelation.Compute(data);
        var eig = SymmetricEigensolver.Eigenvalues(r);
        for (int rep = 0; rep < 2; rep++)
        {
            var sw = Stopwatch.StartNew();
            var pops = new List<double>();
            var m = ItemReduce.Core.Factoring.MatrixHelpers.ToMatrix(r);
            for (int k = 1; k <= 5; k++) { var t = Stopwatch.StartNew(); ComparisonData.Population(m, k); pops.Add(t.Elapsed.TotalMilliseconds); }
            Console.WriteLine($"populations k=1..5: {string.Join(", ", pops.Select(x => x.ToString("F0")))} ms");
            sw.Restart();
            var cd = ComparisonData.Run(r, eig, 20_000, new ComparisonDataOptions { Samples = 250 });
            Console.WriteLine($"comparison data (count {cd.Count}, {cd.MeanRmsr.Length} populations): {sw.Elapsed.TotalMilliseconds:F0} ms");
            sw.Restart();
            var pa = ParallelAnalysis.NormalReference(20_000, 100, new ParallelAnalysisOptions { Replicates = 1000 });
            Console.WriteLine($"parallel analysis with reduced matrix, 1000 replicates: {sw.Elapsed.TotalMilliseconds:F0} ms");
        }
    }
}
