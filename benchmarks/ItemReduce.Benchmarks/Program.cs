using System.Globalization;
using BenchmarkDotNet.Running;

// Run all:  dotnet run -c Release --project benchmarks/ItemReduce.Benchmarks -- --filter '*'
// Short-form dump and step times (not a benchmark):
//   dotnet run -c Release --project benchmarks/ItemReduce.Benchmarks -- short-form-dump OUT.txt [respondents] [holdout]
if (args is ["short-form-dump", var path, ..])
{
    int n = args.Length > 2 ? int.Parse(args[2], CultureInfo.InvariantCulture) : 1_000_000;
    double holdout = args.Length > 3 ? double.Parse(args[3], CultureInfo.InvariantCulture) : 0.5;
    ItemReduce.Benchmarks.ShortFormPanel.DumpTo(path, n, holdout);
    return;
}
BenchmarkSwitcher.FromAssembly(typeof(ItemReduce.Benchmarks.DimensionBenchmarks).Assembly).Run(args);
