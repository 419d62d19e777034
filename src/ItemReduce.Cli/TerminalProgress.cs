using System.Globalization;
using System.Text;
using System.Text.RegularExpressions;

namespace ItemReduce.Cli;

/// <summary>
/// The progress view used when stderr is a terminal: one status line, redrawn in place, shown only for a step that has
/// been running for <see cref="ShowAfter"/> or longer, so short runs print nothing. A step whose messages count work
/// ("parallel analysis: 250 of 1000 replicates") gets a bar and the count; other steps get a spinner and the seconds
/// elapsed. When a step that was shown ends, its line is left on screen with its duration ("… done in 3.4 s"), so the
/// screen keeps a record of the long steps. A message "step: detail" belongs to the step named before the first ": "
/// (so "screening: robust estimate" and "screening: distances" are one step); a message without ": " is a step.
/// </summary>
internal sealed partial class TerminalProgress : IDisposable
{
    /// <summary>How long a step runs before the view shows it (about two seconds).</summary>
    internal static readonly TimeSpan ShowAfter = TimeSpan.FromSeconds(2);

    private const int BarWidth = 24;
    private static readonly string[] Spinner = ["|", "/", "-", "\\"];

    private readonly TextWriter _err;
    private readonly Func<int> _width;
    private readonly Lock _gate = new();
    private readonly Timer? _timer;
    private readonly Func<TimeSpan> _now;

    private string? _step;          // the step's name (message without its count)
    private string? _message;       // the latest message of the step
    private (long Done, long Total)? _count;
    private TimeSpan _stepStart;
    private bool _drawn;            // the status line is on screen
    private int _frame;
    private bool _disposed;

    /// <summary>A view on <paramref name="err"/> with its own clock and a redraw timer (about ten times a second).</summary>
    internal TerminalProgress(TextWriter err) : this(err, StartClock(), ConsoleWidth, redraw: true)
    {
    }

    /// <summary>A view with a given clock and width; without <paramref name="redraw"/> it draws only when told
    /// (<see cref="Tick"/>), which is how tests drive it.</summary>
    internal TerminalProgress(TextWriter err, Func<TimeSpan> now, Func<int> width, bool redraw)
    {
        _err = err;
        _now = now;
        _width = width;
        if (redraw) _timer = new Timer(_ => Tick(), null, TimeSpan.FromMilliseconds(100), TimeSpan.FromMilliseconds(100));
    }

    /// <summary>Receives one progress message (the sink of a <see cref="Application.Jobs.ProgressLog"/>).</summary>
    internal void Report(TimeSpan elapsed, string message)
    {
        _ = elapsed;
        lock (_gate)
        {
            if (_disposed) return;
            var m = CountPattern().Match(message);
            int colon = message.IndexOf(": ", StringComparison.Ordinal);
            string step = colon > 0 ? message[..colon] : message;
            if (step != _step)
            {
                FinishStep();
                _step = step;
                _stepStart = _now();
            }
            _message = message;
            _count = m.Success
                && long.TryParse(m.Groups["done"].Value, NumberStyles.None, CultureInfo.InvariantCulture, out long done)
                && long.TryParse(m.Groups["total"].Value, NumberStyles.None, CultureInfo.InvariantCulture, out long total)
                && total > 0 ? (done, total) : null;
            DrawIfDue();
        }
    }

    /// <summary>Redraws the status line if the current step has run long enough.</summary>
    internal void Tick()
    {
        lock (_gate)
        {
            if (_disposed) return;
            _frame++;
            DrawIfDue();
        }
    }

    /// <summary>Ends the view: a step on screen is closed with its duration; nothing more is drawn.</summary>
    public void Dispose()
    {
        _timer?.Dispose();
        lock (_gate)
        {
            if (_disposed) return;
            FinishStep();
            _disposed = true;
        }
    }

    private void DrawIfDue()
    {
        if (_step is null) return;
        var running = _now() - _stepStart;
        if (running < ShowAfter) return;
        _err.Write("\r" + Fit(StatusText(running)) + "\u001b[K");
        _err.Flush();
        _drawn = true;
    }

    private void FinishStep()
    {
        if (_step is null || !_drawn)
        {
            _step = null;
            return;
        }
        var took = _now() - _stepStart;
        _err.Write("\r" + Fit(string.Create(CultureInfo.InvariantCulture, $"itemreduce: {_step} done in {took.TotalSeconds:0.0} s")) + "\u001b[K\n");
        _err.Flush();
        _drawn = false;
        _step = null;
    }

    /// <summary>The status line: bar and count when the step counts its work, a spinner otherwise.</summary>
    internal string StatusText(TimeSpan running)
    {
        // Seconds first, so a narrow terminal cuts the message, not the clock.
        var sb = new StringBuilder(string.Create(CultureInfo.InvariantCulture, $"itemreduce: [{running.TotalSeconds,4:0} s] "));
        if (_count is var (done, total))
        {
            double share = Math.Clamp((double)done / total, 0, 1);
            int filled = (int)Math.Round(share * BarWidth);
            sb.Append('[').Append('#', filled).Append('.', BarWidth - filled).Append("] ")
              .Append(string.Create(CultureInfo.InvariantCulture, $"{share * 100,3:0}% {_step} ({done}/{total})"));
        }
        else
        {
            sb.Append(Spinner[_frame % Spinner.Length]).Append(' ').Append(_message);
        }
        return sb.ToString();
    }

    private string Fit(string text)
    {
        int width = Math.Max(20, _width() - 1);
        return text.Length <= width ? text : string.Concat(text.AsSpan(0, width - 1), "…");
    }

    private static Func<TimeSpan> StartClock()
    {
        var clock = System.Diagnostics.Stopwatch.StartNew();
        return () => clock.Elapsed;
    }

    private static int ConsoleWidth()
    {
        try
        {
            int w = Console.WindowWidth;
            return w > 0 ? w : 80;
        }
        catch (IOException)
        {
            return 80;
        }
    }

    /// <summary>"… K of N …": a message that counts its work.</summary>
    [GeneratedRegex(@"\b(?<done>\d+) of (?<total>\d+)\b", RegexOptions.CultureInvariant)]
    private static partial Regex CountPattern();
}
