namespace ItemReduce.IO.Jobs;

/// <summary>Progress messages for long steps; written to stderr by the command line when enabled.</summary>
public sealed class ProgressLog(TextWriter? sink)
{
    /// <summary>A log that discards everything.</summary>
    public static readonly ProgressLog Silent = new(null);

    private readonly Lock _gate = new();

    /// <summary>Reports one step (safe to call from several threads).</summary>
    public void Step(string message)
    {
        if (sink is null) return;
        lock (_gate)
        {
            sink.WriteLine("itemreduce: " + message);
            sink.Flush();
        }
    }
}
