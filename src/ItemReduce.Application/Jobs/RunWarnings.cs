using System.Globalization;
using ItemReduce.Core;
using ItemReduce.Core.Pipeline;

namespace ItemReduce.Application.Jobs;

/// <summary>All warnings of a run in one order (data, pipeline, screening, dimensions, short form, confirmatory, self-check), for the terminal,
/// summary.json and the appendix alike.</summary>
public static class RunWarnings
{
    /// <summary>Every warning of <paramref name="result"/>.</summary>
    public static IReadOnlyList<AnalysisWarning> Of(PipelineResult result)
    {
        ArgumentNullException.ThrowIfNull(result);
        return result.Prepared.Warnings.Concat(result.Warnings).Concat(result.Screening?.Warnings ?? []).Concat(result.Dimensions?.Warnings ?? [])
            .Concat(result.ShortForm?.Warnings ?? []).Concat(result.Confirmatory?.Warnings ?? []).Concat(result.SelfCheck?.Warnings ?? []).ToList();
    }
}

/// <summary>Warnings as terminal lines: <c>itemreduce: warning 2 of 5 (dimensions): …</c>.</summary>
public static class WarningLines
{
    /// <summary>Writes one numbered line per warning.</summary>
    public static void Write(TextWriter sink, IReadOnlyList<AnalysisWarning> warnings)
    {
        ArgumentNullException.ThrowIfNull(sink);
        ArgumentNullException.ThrowIfNull(warnings);
        for (int i = 0; i < warnings.Count; i++)
            sink.WriteLine(Format(warnings[i], i + 1, warnings.Count));
        sink.Flush();
    }

    /// <summary>One line; a warning that names a setting ends with the option that sets it.</summary>
    public static string Format(AnalysisWarning warning, int number, int count)
    {
        string option = WarningSettings.OptionFor(warning) is { } name ? $" (option --{name})" : "";
        return string.Create(CultureInfo.InvariantCulture,
            $"itemreduce: warning {number} of {count} ({warning.Stage}, {warning.Code}): {warning.Message.ReplaceLineEndings(" ")}{option}");
    }
}

/// <summary>Translates the Core option-record property a warning names (<see cref="AnalysisWarning.Setting"/>) into the
/// setting's name, which is the command-line option without dashes and the plan-file key.</summary>
public static class WarningSettings
{
    /// <summary>Record property → setting name, for every property a Core warning may name
    /// (WarningSettingsTests checks each one against the settings catalogue).</summary>
    public static readonly IReadOnlyDictionary<string, string> ByProperty = new Dictionary<string, string>(StringComparer.Ordinal)
    {
        [nameof(Core.SelfCheck.SelfCheckOptions.Surveys)] = "self-check",
        [nameof(Core.ShortForm.ShortFormOptions.HoldoutFraction)] = "holdout",
    };

    /// <summary>The setting name for <paramref name="warning"/>'s property, or null when it names none (or an unknown
    /// one).</summary>
    public static string? OptionFor(AnalysisWarning warning)
    {
        ArgumentNullException.ThrowIfNull(warning);
        return warning.Setting is { } property && ByProperty.TryGetValue(property, out var name) ? name : null;
    }
}
