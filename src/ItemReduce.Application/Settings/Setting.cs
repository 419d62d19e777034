using System.Globalization;
using ItemReduce.IO;

namespace ItemReduce.Application.Settings;

/// <summary>Commands a setting applies to.</summary>
[Flags]
public enum Commands
{
    /// <summary><c>check</c>.</summary>
    Check = 1,
    /// <summary><c>screen</c>.</summary>
    Screen = 2,
    /// <summary><c>dimensions</c>.</summary>
    Dimensions = 4,
    /// <summary><c>shorten</c>.</summary>
    Shorten = 8,
    /// <summary><c>run</c>.</summary>
    Run = 16,
    /// <summary>Commands that write results.</summary>
    Writing = Screen | Dimensions | Shorten | Run,
    /// <summary>Commands that compute correlations.</summary>
    Correlating = Dimensions | Shorten | Run,
    /// <summary>Every command.</summary>
    All = Check | Writing,
}

/// <summary>What a setting's value is.</summary>
public enum SettingKind
{
    /// <summary>A file or folder path (relative paths in a plan resolve against the plan's folder).</summary>
    Path,
    /// <summary>Free text.</summary>
    Text,
    /// <summary>A whole number ≥ 0, stored as <see cref="ulong"/>.</summary>
    Integer,
    /// <summary>A finite decimal number, stored as <see cref="double"/>.</summary>
    Number,
    /// <summary>On/off, stored as <see cref="bool"/>; on the command line the option alone means on.</summary>
    Flag,
    /// <summary>One of <see cref="Setting.Choices"/>, stored lower-case as <see cref="string"/>.</summary>
    Choice,
    /// <summary>A list of texts (comma-separated on the command line, a JSON array in a plan), stored as
    /// <see cref="IReadOnlyList{T}"/> of <see cref="string"/>.</summary>
    TextList,
    /// <summary>name=whole-number pairs (<c>a=3,b=5</c>, or a JSON object in a plan), stored as an ordered
    /// <see cref="IReadOnlyList{T}"/> of (name, <see cref="int"/>) pairs.</summary>
    Targets,
}

/// <summary>Which part of a job a setting feeds (used to check that every setting reaches what it concerns).</summary>
[Flags]
public enum Concerns
{
    /// <summary>Reading the input files (<see cref="IntakeOptions"/>, input paths).</summary>
    Intake = 1,
    /// <summary>The screening stage's options.</summary>
    Screening = 2,
    /// <summary>The dimensions stage's options.</summary>
    Dimensions = 4,
    /// <summary>Factoring, item judgements, reliability and short form options.</summary>
    ShortForm = 8,
    /// <summary>Which respondents the later stages analyse.</summary>
    Pipeline = 16,
    /// <summary>Outputs (folder, replacing it, the PDF).</summary>
    Outputs = 32,
    /// <summary>What is printed on the terminal.</summary>
    Terminal = 64,
    /// <summary>The design-matched self-check after the analysis.</summary>
    SelfCheck = 128,
}

/// <summary>
/// One declared setting: its name (the long option name without dashes, also its plan-file key and its summary.json
/// key), kind, default, allowed values, commands, what it concerns and help text. Everything else — the command-line
/// options, plan-file reading, validation, the summary.json options block, the appendix's settings table and the
/// README's options table — is derived from these declarations (<see cref="SettingsCatalog"/>).
/// </summary>
public sealed record Setting
{
    /// <summary>Name without dashes, e.g. <c>cutoff-p</c>.</summary>
    public required string Name { get; init; }

    /// <summary>Kind of value.</summary>
    public required SettingKind Kind { get; init; }

    /// <summary>Commands that use it; elsewhere it is ignored with a notice.</summary>
    public required Commands Commands { get; init; }

    /// <summary>Parts of the job it feeds.</summary>
    public required Concerns Concerns { get; init; }

    /// <summary>Help text (one sentence or two).</summary>
    public required string Help { get; init; }

    /// <summary>Group heading in help and README tables (general, screening, dimensions, short form, appendix).</summary>
    public required string Group { get; init; }

    /// <summary>Typed default (see <see cref="SettingKind"/>), or null when the default is "not set" (then
    /// <see cref="DefaultText"/> says what happens).</summary>
    public object? Default { get; init; }

    /// <summary>Default in words when <see cref="Default"/> is null or needs explaining, e.g. "detected".</summary>
    public string? DefaultText { get; init; }

    /// <summary>Smallest allowed value (numbers, whole numbers, target lengths).</summary>
    public double Min { get; init; } = double.NegativeInfinity;

    /// <summary>Largest allowed value.</summary>
    public double Max { get; init; } = double.PositiveInfinity;

    /// <summary>True when <see cref="Min"/> itself is not allowed.</summary>
    public bool MinExclusive { get; init; }

    /// <summary>True when <see cref="Max"/> itself is not allowed.</summary>
    public bool MaxExclusive { get; init; }

    /// <summary>Allowed values of a <see cref="SettingKind.Choice"/> (lower case).</summary>
    public IReadOnlyList<string> Choices { get; init; } = [];

    /// <summary>An allowed value other than the default, in command-line form (help examples and the test that every
    /// setting reaches its stage).</summary>
    public required string Example { get; init; }

    /// <summary>Placeholder shown after the option in usage tables, e.g. <c>P</c>; empty for flags.</summary>
    public string ValueName { get; init; } = "";

    /// <summary>False for settings that cannot change any result (terminal, output folder, the plan's own name, which the
    /// reproducibility block records with its SHA-256); they are left out of summary.json's options and the appendix.</summary>
    public bool Recorded { get; init; } = true;

    /// <summary>False for <c>plan</c> (a plan cannot name another plan).</summary>
    public bool AllowedInPlan { get; init; } = true;

    /// <summary>The command-line option, e.g. <c>--cutoff-p</c>.</summary>
    public string Option => "--" + Name;

    /// <summary>True when the setting applies to <paramref name="command"/>.</summary>
    public bool AppliesTo(Commands command) => (Commands & command) != 0;

    /// <summary>Allowed values in plain words, e.g. "a number above 0 and below 0.5".</summary>
    public string Allowed => Kind switch
    {
        SettingKind.Integer => $"a whole number {RangeWords()}",
        SettingKind.Number => $"a number {RangeWords()}",
        SettingKind.Flag => "true or false (on the command line the option alone means true)",
        SettingKind.Choice => "one of " + string.Join(", ", Choices),
        SettingKind.TextList => "a comma-separated list (a JSON list in a plan)",
        SettingKind.Targets => $"name=length pairs such as comfort=3,crew=5, each length a whole number {RangeWords()}",
        _ => "a non-empty text",
    };

    private string RangeWords()
    {
        string lo = Fmt(Min), hi = Fmt(Max);
        bool hasLo = !double.IsNegativeInfinity(Min), hasHi = !double.IsPositiveInfinity(Max);
        if (hasLo && hasHi && !MinExclusive && !MaxExclusive) return $"from {lo} to {hi}";
        var parts = new List<string>();
        if (hasLo) parts.Add(MinExclusive ? $"above {lo}" : $"at least {lo}");
        if (hasHi) parts.Add(MaxExclusive ? $"below {hi}" : $"at most {hi}");
        return parts.Count == 1 && !parts[0].StartsWith("above", StringComparison.Ordinal) && !parts[0].StartsWith("below", StringComparison.Ordinal)
            ? "of " + parts[0] : string.Join(" and ", parts);
    }

    internal static string Fmt(double v) => v == ulong.MaxValue ? ulong.MaxValue.ToString(CultureInfo.InvariantCulture)
        : v.ToString("0.############", CultureInfo.InvariantCulture);

    /// <summary>True when <paramref name="v"/> lies in the allowed range.</summary>
    internal bool InRange(double v) =>
        !double.IsNaN(v) && (MinExclusive ? v > Min : v >= Min) && (MaxExclusive ? v < Max : v <= Max);
}
