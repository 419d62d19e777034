using System.Diagnostics;
using System.Globalization;

// Simulation study of the number-of-dimensions rules (seeded; one command; minutes on 2 cores).
//   dotnet run -c Release --project benchmarks/ItemReduce.DimensionStudy -- grid OUT_DIR [sets-per-cell=16] [replicates=400] [seed=2026]
//   dotnet run -c Release --project benchmarks/ItemReduce.DimensionStudy -- ordinal OUT_DIR [sets-per-cell=20] [replicates=200] [seed=2027]
// "grid": invented surveys from planted factor models over the conditions of published comparisons (see Study.Cells),
// every rule of the dimensions stage applied to each with the given parallel-analysis replicates (comparison data
// draws a quarter of that per population), tables of hit rate, mean bias and worst cell written to OUT_DIR.
// "train": the separate training design of the combined rule (Conditions.TrainingSurvey), one row per survey.
//   dotnet run -c Release --project benchmarks/ItemReduce.DimensionStudy -- train OUT_DIR [surveys=2000] [replicates=1000] [seed=7001]
//   dotnet run -c Release --project benchmarks/ItemReduce.DimensionStudy -- train-hard OUT_DIR [surveys=1000] [replicates=1000] [seed=7002]
// "fit": fits the combined rule on training tables and writes its coefficient file (see Fit).
//   dotnet run -c Release --project benchmarks/ItemReduce.DimensionStudy -- fit src/ItemReduce.Core/Dimensions/CombinedRetentionModel.cs
// PROVENANCE_TXT TRAINING_CSV...
// "rescore": the combined rule applied again to a committed data-set table from its stored features (see Rescore).
//   dotnet run -c Release --project benchmarks/ItemReduce.DimensionStudy -- rescore \
//     benchmarks/results/dimensions-study-2026-12-02/grid-datasets.csv [OUT_CSV|-] [RECHECK_EVERY_NTH_CELL]
// (with RECHECK, the first data set of every n-th cell is simulated again and run through the dimensions stage).
// "ordinal": checks of the ordinal references (see OrdinalCheck).
// "timing": step times of comparison data and parallel analysis at 20,000 × 100 (see Timing), for tuning.
// Results do not depend on the number of threads: every data set has its own seed.
string mode = args.Length > 0 ? args[0] : "";
if (mode == "timing") { ItemReduce.DimensionStudy.Timing.Run(); return 0; }
if (mode == "rescore" && args.Length >= 2)
{
    int recheck = args.Length > 3 ? int.Parse(args[3], CultureInfo.InvariantCulture) : 0;
    ItemReduce.DimensionStudy.Rescore.Run(args[1], args.Length > 2 && args[2] != "-" ? args[2] : null, recheck);
    return 0;
}
if (mode == "fit" && args.Length >= 4)
{
    ItemReduce.DimensionStudy.Fit.Run(args[3..], args[1], File.ReadAllText(args[2]));
    return 0;
}
if (mode is not ("grid" or "ordinal" or "train" or "train-hard") || args.Length < 2)
{
    Console.Error.WriteLine("usage: ItemReduce.DimensionStudy grid|ordinal|train|train-hard OUT_DIR [sets-per-cell|surveys] [replicates] [seed]");
    Console.Error.WriteLine("       ItemReduce.DimensionStudy fit OUT_CS PROVENANCE_TXT TRAINING_CSV...");
    Console.Error.WriteLine("       ItemReduce.DimensionStudy rescore DATASETS_CSV [OUT_CSV|-] [RECHECK_EVERY_NTH_CELL]");
    return 2;
}
string outDir = args[1];
Directory.CreateDirectory(outDir);
int sets = args.Length > 2 ? int.Parse(args[2], CultureInfo.InvariantCulture) : mode switch { "grid" => 16, "train" => 2000, "train-hard" => 1000, _ => 20 };
int reps = args.Length > 3 ? int.Parse(args[3], CultureInfo.InvariantCulture) : mode switch { "grid" => 400, "train" or "train-hard" => 1000, _ => 200 };
ulong seed = args.Length > 4 ? ulong.Parse(args[4], CultureInfo.InvariantCulture) : mode switch { "grid" => 2026UL, "train" => 7001UL, "train-hard" => 7002UL, _ => 2027UL };
var clock = Stopwatch.StartNew();
if (mode == "grid") ItemReduce.DimensionStudy.GridStudy.Run(outDir, sets, reps, seed);
else if (mode is "train" or "train-hard") ItemReduce.DimensionStudy.GridStudy.RunTraining(outDir, sets, reps, seed, mode == "train-hard");
else ItemReduce.DimensionStudy.OrdinalCheck.Run(outDir, sets, reps, seed);
Console.WriteLine(string.Create(CultureInfo.InvariantCulture, $"done in {clock.Elapsed.TotalSeconds:F0} s on {Environment.ProcessorCount} cores"));
return 0;
