namespace ItemReduce.Core;

/// <summary>
/// A recoverable problem or caution raised by a stage: the analysis went on, but the user should know. Created in Core
/// in plain words without program option names; the command line and the appendix decide how to show it.
/// </summary>
/// <param name="Code">Stable kebab-case identifier, e.g. <c>kmo-low</c> (for scripts reading summary.json).</param>
/// <param name="Stage">Stage that raised it: <c>data</c>, <c>screening</c>, <c>dimensions</c>, <c>factoring</c>,
/// <c>short-form</c> or <c>confirmatory</c>.</param>
/// <param name="Message">One plain-language sentence or two, ending with a full stop.</param>
/// <param name="Setting">Optional: the Core option-record property a person can change to act on the warning, as
/// <c>nameof(RecordType.Property)</c> gives it (e.g. <c>Surveys</c> of <see cref="SelfCheck.SelfCheckOptions"/>); never a
/// command-line name — the edge translates it into the option's name.</param>
public sealed record AnalysisWarning(string Code, string Stage, string Message, string? Setting = null)
{
    /// <summary>The message (so that string joins and interpolation show the wording).</summary>
    public override string ToString() => Message;
}

/// <summary>Warnings of one stage, collected while it runs.</summary>
internal sealed class WarningList(string stage) : List<AnalysisWarning>
{
    /// <summary>Stage given to every warning added by code and message.</summary>
    public string Stage { get; } = stage;

    /// <summary>Adds a warning of this list's stage.</summary>
    public void Add(string code, string message) => Add(new AnalysisWarning(code, Stage, message));
}
