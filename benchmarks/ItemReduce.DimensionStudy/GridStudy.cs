using ItemReduce.Core.Dimensions;
using ItemReduce.Core.Randomness;
using ItemReduce.Simulation;

namespace ItemReduce.DimensionStudy;

/// <summary>The main study: every rule on every data set of every cell; tables of accuracy.</summary>
internal static class GridStudy
{
    private const ulong Purpose = 0x53545544; // "STUD"

    /// <summary>A rule as scored in the study: a name and how it reads the counts of one data set.</summary>
    internal sealed record Rule(string Name, bool Single, Func<RuleCounts, int> Count);

    public static readonly Rule[] Rules =
    [
        new("pa-pca-95", true, c => c.Parallel),
        new("pa-pca-mean", true, c => c.ParallelMean ?? 0),
        new("pa-reduced-95", true, c => c.ParallelReduced ?? 0),
        new("pa-reduced-mean", true, c => c.ParallelReducedMean ?? 0),
        new("map", true, c => c.Map),
        new("map-revised", true, c => c.MapRevised),
        new("kaiser", true, c => c.Kaiser),
        new("ekc", true, c => c.EmpiricalKaiser),
        new("cd", true, c => c.ComparisonData ?? 0),
        new("hull", true, c => c.Hull ?? 0),
        new("median(cd,ekc,pa-pca-95)", false, c => Median(c.ComparisonData ?? 0, c.EmpiricalKaiser, c.Parallel)),
        new("median(cd,ekc,pa-reduced-95)", false, c => Median(c.ComparisonData ?? 0, c.EmpiricalKaiser, c.ParallelReduced ?? 0)),
        new("median(cd,ekc,pa-pca-mean)", false, c => Median(c.ComparisonData ?? 0, c.EmpiricalKaiser, c.ParallelMean ?? 0)),
        new("median(cd,pa-pca-95,pa-reduced-95)", false, c => Median(c.ComparisonData ?? 0, c.Parallel, c.ParallelReduced ?? 0)),
        new("max(pa-pca-95,min(cd,pa-reduced-95))", false, c => Math.Max(c.Parallel, Math.Min(c.ComparisonData ?? 0, c.ParallelReduced ?? 0))),
        new("combined", false, c => c.Combined ?? 0),
    ];

    internal static int Median(int a, int b, int c) => Math.Max(Math.Min(a, b), Math.Min(Math.Max(a, b), c));

    /// <summary>One analysed data set.</summary>
    internal sealed record Outcome(Cell Cell, int Set, int Categories, bool Skewed, bool Cross, int[] Counts, double[] Features);

    public static void Run(string outDir, int sets, int replicates, ulong seed)
    {
        var cells = Conditions.Cells();
        var jobs = cells.SelectMany(c => Enumerable.Range(0, sets).Select(d => (Cell: c, Set: d))).ToArray();
        var outcomes = new Outcome[jobs.Length];
        int done = 0;
        Parallel.For(0, jobs.Length, new ParallelOptions { MaxDegreeOfParallelism = Environment.ProcessorCount }, i =>
        {
            var (cell, d) = jobs[i];
            outcomes[i] = Analyse(cell, d, replicates, seed);
            int finished = Interlocked.Increment(ref done);
            if (finished % 200 == 0) Console.WriteLine($"{finished} of {jobs.Length} data sets");
        });
        Tables.Write(outDir, cells, outcomes, sets, replicates, seed);
    }

    internal static Outcome Analyse(Cell cell, int d, int replicates, ulong seed)
    {
        var rng = RandomStream.ForTask(seed, cell.Index * 100_000L + d, Purpose);
        var spec = Conditions.Spec(cell, d, rng);
        return Analyse(cell, d, spec, replicates, rng);
    }

    /// <summary>The training design of the combined rule (<see cref="Conditions.TrainingSurvey"/>): one table row per
    /// survey with its conditions, every rule's count and the combined rule's features.</summary>
    public static void RunTraining(string outDir, int surveys, int replicates, ulong seed, bool hard)
    {
        var outcomes = new Outcome[surveys];
        int done = 0;
        Parallel.For(0, surveys, new ParallelOptions { MaxDegreeOfParallelism = Environment.ProcessorCount }, i =>
        {
            var rng = RandomStream.ForTask(seed, i, TrainingPurpose);
            var (cell, spec) = Conditions.TrainingSurvey(hard, rng);
            outcomes[i] = Analyse(cell, i, spec, replicates, rng);
            int finished = Interlocked.Increment(ref done);
            if (finished % 200 == 0) Console.WriteLine($"{finished} of {surveys} training surveys");
        });
        Tables.WriteDataSets(Path.Combine(outDir, hard ? "training-hard-datasets.csv" : "training-datasets.csv"), outcomes);
        Console.WriteLine($"training design{(hard ? " (hard part)" : "")}: {surveys} surveys, {replicates} replicates, seed {seed}");
    }

    private const ulong TrainingPurpose = 0x5452414E; // "TRAN"

    private static Outcome Analyse(Cell cell, int d, FactorModelSpec spec, int replicates, RandomStream rng)
    {
        ulong dataSeed = rng.NextUInt64();
        var survey = FactorModelSimulator.Generate(spec, new FactorModelSimulator.Settings(cell.Respondents, dataSeed));
        var result = DimensionAnalysis.Run(survey.Responses, new DimensionOptions
        {
            Replicates = replicates,
            Seed = rng.NextUInt64(),
            MaxDegreeOfParallelism = 1,
        });
        return new Outcome(cell, d, spec.Categories, IsSkewed(spec), spec.CrossLoadings.Count > 0,
            Rules.Select(r => r.Count(result.ByRule)).ToArray(), result.Combined?.Features ?? []);
    }

    private static bool IsSkewed(FactorModelSpec spec) => spec.CategoryProbabilities is { } cp && cp[^1] > cp[0] + 1e-9;
}
