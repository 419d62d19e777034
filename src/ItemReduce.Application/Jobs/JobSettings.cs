using ItemReduce.Application.Settings;
using ItemReduce.Core.Pipeline;
using ItemReduce.IO;

namespace ItemReduce.Application.Jobs;

/// <summary>
/// Every setting of a job, built from the declared settings (<see cref="SettingsCatalog"/>) by
/// <see cref="SettingsMapping.ToJob"/>; defaults live in the declarations (and through them in the Core option records),
/// not here.
/// </summary>
public sealed record JobSettings
{
    /// <summary>Responses CSV.</summary>
    public required string Responses { get; init; }

    /// <summary>Codebook CSV.</summary>
    public required string Codebook { get; init; }

    /// <summary>Plan file the settings came from, if any.</summary>
    public string? Plan { get; init; }

    /// <summary>SHA-256 of the plan file as read, if any.</summary>
    public string? PlanSha256 { get; init; }

    /// <summary>Output folder.</summary>
    public required string Out { get; init; }

    /// <summary>Replace an existing output folder.</summary>
    public bool Force { get; init; }

    /// <summary>Intake settings.</summary>
    public required IntakeOptions Intake { get; init; }

    /// <summary>Seed for every random step (the pipeline's).</summary>
    public ulong Seed => Pipeline.Seed;

    /// <summary>Stage settings (screening, dimensions, factoring, short form, and the shared seed and correlation).</summary>
    public required PipelineSettings Pipeline { get; init; }

    /// <summary>Skip the PDF appendix; tables.md and tables.tex are still written.</summary>
    public bool NoPdf { get; init; }

    /// <summary>Time stamp of the run, printed in the appendix (UTC).</summary>
    public DateTimeOffset StartedUtc { get; init; } = DateTimeOffset.UtcNow;

    /// <summary>The settings as given and in effect, for the reproducibility record.</summary>
    public required SettingValues Values { get; init; }
}
