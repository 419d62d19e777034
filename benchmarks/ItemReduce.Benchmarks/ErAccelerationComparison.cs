using System.Diagnostics;
using System.Globalization;
using ItemReduce.Core.Screening;
using ItemReduce.Simulation;

namespace ItemReduce.Benchmarks;

/// <summary>
/// Screening with the accelerated robust fit against the plain fixed-point iteration on simulated surveys (the screening
/// study's generator: five-point ordinal items, skewed or symmetric, missing answers at random, 5 % careless
/// respondents): flags that differ, the largest difference of the robust location and scatter relative to the largest
/// scatter diagonal, the passes over the rows of each, and the CPU time of each screening.
/// </summary>
internal static class ErAccelerationComparison
{
    public static void Run(string path)
    {
        var inv = CultureInfo.InvariantCulture;
        var lines = new List<string>
        {
            "| items | n | answers | missing | flagged (plain) | flags differing | max rel. diff μ, Σ " +
                "| passes plain → accelerated | CPU s plain → accelerated |",
            "| ---: | ---: | --- | ---: | ---: | ---: | ---: | ---: | ---: |",
        };
        int cells = 0, differing = 0, flagged = 0;
        foreach (var (p, n) in new[] { (24, 120), (24, 960), (60, 300), (60, 1200), (125, 625), (125, 2500) })
            foreach (bool skew in new[] { true, false })
                foreach (double miss in new[] { 0.0, 0.02, 0.05, 0.10 })
                {
                    var c = new ScreeningStudy.Condition(p, 5, skew, miss, n, 0.05, 1);
                    var (scored, raw, _) = ScreeningStudy.Draw(c, 20261202);
                    var cpu = Process.GetCurrentProcess().TotalProcessorTime;
                    var plain = RespondentScreening.Run(scored, new ScreeningOptions { AccelerateRobustFit = false }, raw);
                    var mid = Process.GetCurrentProcess().TotalProcessorTime;
                    var fast = RespondentScreening.Run(scored, new ScreeningOptions(), raw);
                    var end = Process.GetCurrentProcess().TotalProcessorTime;
                    int diff = plain.Respondents.Zip(fast.Respondents).Count(t => t.First.Flagged != t.Second.Flagged
                        || !t.First.Reasons.SequenceEqual(t.Second.Reasons));
                    double change = Difference(plain.Robust, fast.Robust);
                    cells++;
                    differing += diff;
                    flagged += plain.FlaggedRespondents;
                    string answers = skew ? "skewed" : "symmetric";
                    lines.Add(string.Create(inv, $"| {p} | {n} | {answers} | {100 * miss:0} % | {plain.FlaggedRespondents} | {diff} ") +
                        string.Create(inv, $"| {change:0.0e+0} | {plain.Robust.Iterations} → {fast.Robust.Iterations} ") +
                        string.Create(inv, $"| {(mid - cpu).TotalSeconds:0.00} → {(end - mid).TotalSeconds:0.00} |"));
                    Console.WriteLine(lines[^1]);
                }
        lines.Add("");
        lines.Add(string.Create(inv, $"{cells} surveys: {differing} of {flagged} flags differ."));
        File.WriteAllLines(path, lines);
        Console.WriteLine(lines[^1]);
    }

    private static double Difference(RobustEstimatorDetails a, RobustEstimatorDetails b)
    {
        if (a.Location is null || b.Location is null || a.Scatter is null || b.Scatter is null) return a.Location == b.Location ? 0 : double.NaN;
        int p = a.Location.Length;
        double scale = 0, change = 0;
        for (int j = 0; j < p; j++) scale = Math.Max(scale, a.Scatter[j, j]);
        for (int j = 0; j < p; j++)
        {
            change = Math.Max(change, Math.Abs(a.Location[j] - b.Location[j]) / Math.Sqrt(scale));
            for (int k = 0; k < p; k++) change = Math.Max(change, Math.Abs(a.Scatter[j, k] - b.Scatter[j, k]) / scale);
        }
        return change;
    }
}
