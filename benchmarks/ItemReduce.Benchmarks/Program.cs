using System.Globalization;
using BenchmarkDotNet.Running;

// Run all:  dotnet run -c Release --project benchmarks/ItemReduce.Benchmarks -- --filter '*'
// Short-form dump and step times (not a benchmark):
//   dotnet run -c Release --project benchmarks/ItemReduce.Benchmarks -- short-form-dump OUT.txt [respondents] [holdout]
// Correlation kernel, best of R runs per shape (benchmarks/kernel/correlation-roof.sh compares it with dgemm):
//   dotnet run -c Release --project benchmarks/ItemReduce.Benchmarks -- correlation-kernel N1,N2 P1,P2,P3 [repeats] [threads]
// Parts of one replicate's CPU (draw, SMC, tridiagonal reduction, tridiagonal eigenvalues), best of R per part:
//   dotnet run -c Release --project benchmarks/ItemReduce.Benchmarks -- eigenvalue-parts P1,P2 [respondents] [repeats]
// Screening with the accelerated robust fit against plain fixed-point steps on simulated surveys (not a benchmark):
//   dotnet run -c Release --project benchmarks/ItemReduce.Benchmarks -- er-acceleration OUT.md
if (args is ["short-form-dump", var path, ..])
{
    int n = args.Length > 2 ? int.Parse(args[2], CultureInfo.InvariantCulture) : 1_000_000;
    double holdout = args.Length > 3 ? double.Parse(args[3], CultureInfo.InvariantCulture) : 0.5;
    ItemReduce.Benchmarks.ShortFormPanel.DumpTo(path, n, holdout);
    return;
}
if (args is ["correlation-kernel", var nList, var pList, ..])
{
    static int[] Ints(string list) => list.Split(',').Select(x => int.Parse(x, CultureInfo.InvariantCulture)).ToArray();
    ItemReduce.Benchmarks.CorrelationKernelTiming.Run(Ints(nList), Ints(pList),
        args.Length > 3 ? int.Parse(args[3], CultureInfo.InvariantCulture) : 20,
        args.Length > 4 ? int.Parse(args[4], CultureInfo.InvariantCulture) : -1);
    return;
}
if (args is ["eigenvalue-parts", var pList2, ..])
{
    ItemReduce.Benchmarks.EigenvalueTiming.Run(pList2.Split(',').Select(x => int.Parse(x, CultureInfo.InvariantCulture)).ToArray(),
        args.Length > 2 ? int.Parse(args[2], CultureInfo.InvariantCulture) : 5_000,
        args.Length > 3 ? int.Parse(args[3], CultureInfo.InvariantCulture) : 5);
    return;
}
if (args is ["er-acceleration", var comparisonPath, ..])
{
    ItemReduce.Benchmarks.ErAccelerationComparison.Run(comparisonPath);
    return;
}
BenchmarkSwitcher.FromAssembly(typeof(ItemReduce.Benchmarks.DimensionBenchmarks).Assembly).Run(args);
