using System.Diagnostics;
using System.Globalization;

namespace ItemReduce.IO.Jobs;

/// <summary>Progress messages for long steps; written to stderr by the command line when enabled. Each message carries
/// the seconds elapsed since the log was created, so a user can see which step takes the time.</summary>
public sealed class ProgressLog(TextWriter? sink)
{
    /// <summary>A log that discards everything.</summary>
    public static readonly ProgressLog Silent = new(null);

    private readonly Lock _gate = new();
    private readonly Stopwatch _clock = Stopwatch.StartNew();

    /// <summary>Reports one step (safe to call from several threads).</summary>
    public void Step(string message)
    {
        if (sink is null) return;
        lock (_gate)
        {
            sink.WriteLine(string.Create(CultureInfo.InvariantCulture, $"itemreduce: [{_clock.Elapsed.TotalSeconds,6:0.0} s] {message}"));
            sink.Flush();
        }
    }
}
