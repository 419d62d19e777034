using System.Text.Json.Nodes;
using ItemReduce.Application.Jobs;
using ItemReduce.IO;

namespace ItemReduce.Application.Settings;

/// <summary>One row of the settings record: a setting the command uses, its value in effect and where it came from.</summary>
/// <param name="Setting">The setting.</param>
/// <param name="Value">Typed value in effect (paths reduced to file names); null when not set.</param>
/// <param name="Source">"default", "command line" or "plan".</param>
internal sealed record SettingRow(Setting Setting, object? Value, string Source)
{
    /// <summary>The value for people: command-line form, or the default in words when not set.</summary>
    public string Text => Value switch
    {
        null => CliDefault(Setting),
        IReadOnlyList<string> codes => string.Join(", ", codes.Select(c => c.Length == 0 ? "empty cell" : c)),
        _ => SettingParser.Format(Value),
    };

    private static string CliDefault(Setting s) => s.DefaultText ?? "not set";
}

/// <summary>The settings of a run as recorded in summary.json and the appendix: every recorded setting the command
/// uses, in catalog order, with its value in effect.</summary>
internal static class SettingsRecord
{
    /// <summary>Rows of <paramref name="job"/>.</summary>
    public static IReadOnlyList<SettingRow> Rows(JobSettings job)
    {
        ArgumentNullException.ThrowIfNull(job);
        var v = job.Values;
        return SettingsCatalog.All.Where(s => s.Recorded && s.AppliesTo(v.Command)).Select(s =>
        {
            object? value = v[s.Name];
            if (s.Kind == SettingKind.Path && value is string path) value = Path.GetFileName(path.TrimEnd('/', '\\'));
            string source = !v.IsGiven(s.Name) ? "default" : v.Given.First(g => g.Setting == s).FromPlan ? "plan" : "command line";
            return new SettingRow(s, value, source);
        }).ToList();
    }

    /// <summary>A typed JSON value (numbers, booleans, lists, objects; null when not set).</summary>
    public static JsonNode? Json(object? value) => value switch
    {
        null => null,
        bool b => JsonValue.Create(b),
        ulong u => JsonValue.Create(u),
        double d => JsonOut.Num(d),
        string s => JsonValue.Create(s),
        IReadOnlyList<KeyValuePair<string, int>> t => new JsonObject(t.Select(kv => KeyValuePair.Create(kv.Key, (JsonNode?)JsonValue.Create(kv.Value)))),
        IReadOnlyList<string> l => JsonOut.Strs(l),
        _ => JsonValue.Create(SettingParser.Format(value)),
    };
}
