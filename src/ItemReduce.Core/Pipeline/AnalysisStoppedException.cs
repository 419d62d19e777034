namespace ItemReduce.Core.Pipeline;

/// <summary>
/// A stage cannot run on these data (for example too few respondents remain after screening, or a
/// correlation is undefined). The message says which stage and why; it is a property of the data,
/// not a program fault.
/// </summary>
public sealed class AnalysisStoppedException(string stage, string reason, Exception? inner = null, string? code = null)
    : Exception($"the {stage} stage cannot run on these data: {reason}", inner)
{
    /// <summary>Stage name (screening, dimensions, factoring).</summary>
    public string Stage { get; } = stage;

    /// <summary>Stable identifier of a stop reason the caller may advise on (e.g. <see cref="TooFewAfterScreening"/>), or
    /// null.</summary>
    public string? Code { get; } = code;

    /// <summary>Code: too few respondents remain after flagged ones were set aside.</summary>
    public const string TooFewAfterScreening = "too-few-after-screening";
}
