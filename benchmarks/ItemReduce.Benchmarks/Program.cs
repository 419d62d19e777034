using BenchmarkDotNet.Running;

// Run all:  dotnet run -c Release --project benchmarks/ItemReduce.Benchmarks -- --filter '*'
BenchmarkSwitcher.FromAssembly(typeof(ItemReduce.Benchmarks.DimensionBenchmarks).Assembly).Run(args);
