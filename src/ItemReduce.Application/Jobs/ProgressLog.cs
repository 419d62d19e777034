using System.Diagnostics;
using System.Globalization;

namespace ItemReduce.Application.Jobs;

/// <summary>Progress messages for long steps, handed to a sink chosen by the command line: plain lines on stderr
/// (<see cref="ProgressLog(TextWriter?)"/>, each carrying the seconds elapsed since the log was created, so a user can
/// see which step takes the time), a live terminal view, or nothing (<see cref="Silent"/>).</summary>
public sealed class ProgressLog
{
    /// <summary>A log that discards everything.</summary>
    public static readonly ProgressLog Silent = new((Action<TimeSpan, string>?)null);

    private readonly Lock _gate = new();
    private readonly Stopwatch _clock = Stopwatch.StartNew();
    private readonly Action<TimeSpan, string>? _sink;

    /// <summary>A log that hands each message, with the time elapsed since the log was created, to
    /// <paramref name="sink"/> (calls are serialised).</summary>
    public ProgressLog(Action<TimeSpan, string>? sink) => _sink = sink;

    /// <summary>A log that writes one plain line per message to <paramref name="writer"/> (nothing when null).</summary>
    public ProgressLog(TextWriter? writer) : this(writer is null ? null : (elapsed, message) =>
    {
        writer.WriteLine(string.Create(CultureInfo.InvariantCulture, $"itemreduce: [{elapsed.TotalSeconds,6:0.0} s] {message}"));
        writer.Flush();
    })
    {
    }

    /// <summary>Reports one step (safe to call from several threads).</summary>
    public void Step(string message)
    {
        if (_sink is null) return;
        lock (_gate) _sink(_clock.Elapsed, message);
    }
}
