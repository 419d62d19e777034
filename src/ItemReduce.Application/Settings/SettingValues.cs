using System.Globalization;

namespace ItemReduce.Application.Settings;

/// <summary>A value given for a setting, typed (see <see cref="SettingKind"/>), with where it came from.</summary>
/// <param name="Setting">The setting.</param>
/// <param name="Value">The typed value.</param>
/// <param name="Source">Where it was given, for messages: <c>--seed</c>, or <c>plan.json, line 4, "seed"</c>.</param>
/// <param name="FromPlan">True when it came from the plan file.</param>
public sealed record GivenSetting(Setting Setting, object Value, string Source, bool FromPlan);

/// <summary>A value that does not fit its setting; the message says what is allowed.</summary>
internal sealed class SettingValueException(string allowed) : Exception(allowed)
{
    /// <summary>Allowed values in plain words.</summary>
    public string Allowed { get; } = allowed;
}

/// <summary>Turns given text (command line) or plan values into typed values, checking them against the declaration.</summary>
public static class SettingParser
{
    /// <summary>Parses command-line text; <paramref name="text"/> null means the option was given alone (flags).</summary>
    /// <exception cref="SettingValueException">The value is not allowed.</exception>
    public static object Parse(Setting s, string? text)
    {
        if (text is null)
            return s.Kind == SettingKind.Flag ? true : throw new SettingValueException(s.Allowed);
        switch (s.Kind)
        {
            case SettingKind.Path:
            case SettingKind.Text:
                if (string.IsNullOrWhiteSpace(text)) throw new SettingValueException(s.Allowed);
                return text;
            case SettingKind.Integer:
                if (!ulong.TryParse(text.Trim(), NumberStyles.None, CultureInfo.InvariantCulture, out ulong u) || !s.InRange(u))
                    throw new SettingValueException(s.Allowed);
                return u;
            case SettingKind.Number:
                if (!double.TryParse(text.Trim(), NumberStyles.Float, CultureInfo.InvariantCulture, out double d) || !double.IsFinite(d) || !s.InRange(d))
                    throw new SettingValueException(s.Allowed);
                return d;
            case SettingKind.Flag:
                return text.Trim().ToLowerInvariant() switch
                {
                    "true" => true,
                    "false" => false,
                    _ => throw new SettingValueException(s.Allowed),
                };
            case SettingKind.Choice:
                string c = text.Trim().ToLowerInvariant();
                return s.Choices.Contains(c) ? c : throw new SettingValueException(s.Allowed);
            case SettingKind.TextList:
                return ParseList(text.Split(','));
            case SettingKind.Targets:
                return ParseTargets(s, text.Split(',', StringSplitOptions.RemoveEmptyEntries | StringSplitOptions.TrimEntries)
                    .Select(part =>
                    {
                        int eq = part.LastIndexOf('=');
                        return eq <= 0 ? throw new SettingValueException(s.Allowed) : KeyValuePair.Create(part[..eq].Trim(), part[(eq + 1)..].Trim());
                    }).ToList());
            default:
                throw new SettingValueException(s.Allowed);
        }
    }

    /// <summary>A list from separate items (a JSON array); items are trimmed.</summary>
    public static IReadOnlyList<string> ParseList(IEnumerable<string> items) => items.Select(x => x.Trim()).ToList();

    /// <summary>name → length pairs, each length a whole number in the setting's range; names must be distinct.</summary>
    public static IReadOnlyList<KeyValuePair<string, int>> ParseTargets(Setting s, IReadOnlyList<KeyValuePair<string, string>> pairs)
    {
        if (pairs.Count == 0) throw new SettingValueException(s.Allowed);
        var result = new List<KeyValuePair<string, int>>();
        foreach (var (name, value) in pairs)
        {
            if (name.Length == 0 || result.Any(r => r.Key == name)
                || !int.TryParse(value, NumberStyles.None, CultureInfo.InvariantCulture, out int n) || !s.InRange(n))
                throw new SettingValueException(s.Allowed);
            result.Add(KeyValuePair.Create(name, n));
        }
        return result;
    }

    /// <summary>A typed value in command-line form (for messages and the appendix).</summary>
    public static string Format(object? value) => value switch
    {
        null => "",
        bool b => b ? "true" : "false",
        double d => d.ToString("R", CultureInfo.InvariantCulture),
        ulong u => u.ToString(CultureInfo.InvariantCulture),
        IReadOnlyList<KeyValuePair<string, int>> t => string.Join(",", t.Select(kv => $"{kv.Key}={kv.Value.ToString(CultureInfo.InvariantCulture)}")),
        IReadOnlyList<string> l => string.Join(",", l),
        _ => Convert.ToString(value, CultureInfo.InvariantCulture) ?? "",
    };
}

/// <summary>The settings of one command: the values given (command line over plan) and the declared defaults.</summary>
public sealed class SettingValues
{
    private readonly Dictionary<string, GivenSetting> _given = new(StringComparer.Ordinal);

    /// <summary>Values for <paramref name="command"/>; <paramref name="given"/> must apply to it.</summary>
    public SettingValues(Commands command, IEnumerable<GivenSetting> given)
    {
        Command = command;
        foreach (var g in given) _given[g.Setting.Name] = g;
    }

    /// <summary>The command.</summary>
    public Commands Command { get; }

    /// <summary>Settings given, in catalog order.</summary>
    public IReadOnlyList<GivenSetting> Given => SettingsCatalog.All.Where(s => _given.ContainsKey(s.Name)).Select(s => _given[s.Name]).ToList();

    /// <summary>The given value, else the default (null when neither).</summary>
    public object? this[string name] => _given.TryGetValue(name, out var g) ? g.Value : SettingsCatalog.Get(name).Default;

    /// <summary>True when the setting was given.</summary>
    public bool IsGiven(string name) => _given.ContainsKey(name);

    /// <summary>Where the setting was given (for messages), or its option name.</summary>
    public string SourceOf(string name) => _given.TryGetValue(name, out var g) ? g.Source : SettingsCatalog.Get(name).Option;

    /// <summary>Typed accessors (value in effect).</summary>
    public double Number(string name) => (double)this[name]!;

    /// <summary>Whole number in effect, or null when not set.</summary>
    public ulong? Integer(string name) => (ulong?)this[name];

    /// <summary>Flag in effect.</summary>
    public bool Flag(string name) => (bool)this[name]!;

    /// <summary>Text in effect, or null when not set.</summary>
    public string? Text(string name) => (string?)this[name];
}
