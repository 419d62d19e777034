using ItemReduce.Core.Pipeline;

namespace ItemReduce.IO.Jobs;

/// <summary>
/// Every setting of a job, one-to-one with the command-line options (and plan-file keys).
/// Defaults are documented on each property.
/// </summary>
public sealed record JobSettings
{
    /// <summary>Responses CSV (<c>--responses</c>).</summary>
    public required string Responses { get; init; }

    /// <summary>Codebook CSV (<c>--codebook</c>).</summary>
    public required string Codebook { get; init; }

    /// <summary>Plan file the settings came from, if any (<c>--plan</c>).</summary>
    public string? Plan { get; init; }

    /// <summary>Output folder (<c>--out</c>); default <c>itemreduce-results</c>.</summary>
    public string Out { get; init; } = "itemreduce-results";

    /// <summary>Replace an existing output folder (<c>--force</c>); default false.</summary>
    public bool Force { get; init; }

    /// <summary>Intake settings (<c>--missing</c>, <c>--id-column</c>, <c>--delimiter</c>).</summary>
    public IntakeOptions Intake { get; init; } = new();

    /// <summary>Seed for every random step (<c>--seed</c>); default 1.</summary>
    public ulong Seed { get; init; } = 1;

    /// <summary>Stage settings (screening, dimensions, factoring, short form). Its seed is set from <see cref="Seed"/>.</summary>
    public PipelineSettings Pipeline { get; init; } = new();

    /// <summary>Skip the PDF appendix (<c>--no-pdf</c>); tables.md and tables.tex are still written.</summary>
    public bool NoPdf { get; init; }

    /// <summary>Time stamp of the run, printed in the appendix (UTC).</summary>
    public DateTimeOffset StartedUtc { get; init; } = DateTimeOffset.UtcNow;

    /// <summary>The options as given (name → value text), for the reproducibility record.</summary>
    public IReadOnlyList<KeyValuePair<string, string>> EffectiveOptions { get; init; } = [];
}
