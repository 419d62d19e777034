namespace ItemReduce.IO.Jobs;

/// <summary>Progress messages for long steps; written to stderr by the command line when enabled.</summary>
public sealed class ProgressLog(TextWriter? sink)
{
    /// <summary>A log that discards everything.</summary>
    public static readonly ProgressLog Silent = new(null);

    /// <summary>Reports one step.</summary>
    public void Step(string message)
    {
        if (sink is null) return;
        sink.WriteLine("itemreduce: " + message);
        sink.Flush();
    }
}
