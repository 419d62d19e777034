using ItemReduce.IO;
namespace ItemReduce.Application.Settings;

/// <summary>Every message about a setting's value is built here: where it was given (option, or plan file, line and
/// key), the value, and what is allowed, in plain words.</summary>
internal static class SettingErrors
{
    /// <summary>Where a setting was given on the command line.</summary>
    public static string CommandLine(Setting s) => s.Option;

    /// <summary>Where a setting was given in a plan.</summary>
    public static string InPlan(string planPath, long line, string key) =>
        $"{Path.GetFileName(planPath)}, line {line.ToString(System.Globalization.CultureInfo.InvariantCulture)}, \"{key}\"";

    /// <summary>A value that its setting does not allow.</summary>
    public static SurveyInputException NotAllowed(string source, string shownValue, string allowed) =>
        new($"{source}: the value {shownValue} is not allowed. Fix: give {allowed}.");

    /// <summary>A scale target naming no codebook subscale.</summary>
    public static SurveyInputException UnknownSubscale(string source, string name, IReadOnlyList<string> subscales, string codebook) =>
        new($"{source}: {InputErrors.Show(name)} is not a subscale of {codebook}. Fix: " +
            (subscales.Count == 0 ? "the codebook declares no subscales; leave out scale-targets or fill the codebook's subscale column."
                                  : $"use one of its subscales: {string.Join(", ", subscales)}."));

    /// <summary>The notice for a setting the command does not use.</summary>
    public static string NotApplicable(string source, Setting s, Commands command) =>
        $"note: {source} does not apply to '{SettingsCatalog.CommandName(command)}' (used by {CommandList(s.Commands)}); ignored.";

    private static string CommandList(Commands c) =>
        string.Join(", ", Enum.GetValues<Commands>().Where(x => x is Commands.Check or Commands.Screen or Commands.Dimensions or Commands.Shorten or Commands.Run && (c & x) != 0)
            .Select(SettingsCatalog.CommandName));
}

/// <summary>Merges the command line and the plan into the settings of one command, typed and checked.</summary>
public static class SettingsResolver
{
    /// <summary>
    /// Typed settings for <paramref name="command"/>: command-line values override plan values. A setting the command
    /// does not use is ignored with a notice (passed to <paramref name="notice"/>), whether it came from the command
    /// line or the plan. Nothing is read but the plan.
    /// </summary>
    /// <param name="command">The command.</param>
    /// <param name="commandLine">Settings given on the command line with their text (null = the option alone).</param>
    /// <param name="plan">The plan read, if any.</param>
    /// <param name="notice">Receives one line per ignored setting.</param>
    /// <exception cref="SurveyInputException">A value is not allowed (message names where it was given).</exception>
    public static SettingValues Resolve(Commands command, IReadOnlyList<(Setting Setting, string? Text)> commandLine, PlanContents? plan,
        Action<string> notice)
    {
        ArgumentNullException.ThrowIfNull(commandLine);
        ArgumentNullException.ThrowIfNull(notice);
        var given = new List<GivenSetting>();
        var onCommandLine = commandLine.Select(c => c.Setting.Name).ToHashSet(StringComparer.Ordinal);
        if (plan is not null)
        {
            foreach (var e in plan.Entries)
            {
                var s = SettingsCatalog.Get(e.Key);
                string source = SettingErrors.InPlan(plan.Path, e.Line, e.Key);
                object value;
                try { value = FromPlan(s, e); }
                catch (SettingValueException x) { throw SettingErrors.NotAllowed(source, Shown(e.Display), x.Allowed); }
                if (!s.AppliesTo(command)) { notice(SettingErrors.NotApplicable(source, s, command)); continue; }
                if (onCommandLine.Contains(s.Name)) continue;
                given.Add(new GivenSetting(s, value, source, true));
            }
        }
        foreach (var (s, text) in commandLine)
        {
            object value;
            try { value = SettingParser.Parse(s, text); }
            catch (SettingValueException x) { throw SettingErrors.NotAllowed(s.Option, text is null ? "(nothing)" : InputErrors.Show(text), x.Allowed); }
            if (!s.AppliesTo(command)) { notice(SettingErrors.NotApplicable(s.Option, s, command)); continue; }
            given.Add(new GivenSetting(s, value, s.Option, false));
        }
        return new SettingValues(command, given);
    }

    private static string Shown(string json) => json.Length > 40 ? json[..40] + "…" : json;

    private static object FromPlan(Setting s, PlanEntry e)
    {
        if (e.Items is { } items)
            return s.Kind == SettingKind.TextList ? SettingParser.ParseList(items) : SettingParser.Parse(s, string.Join(",", items));
        if (e.Pairs is { } pairs)
            return s.Kind == SettingKind.Targets ? SettingParser.ParseTargets(s, pairs) : throw new SettingValueException(s.Allowed);
        // A plan spells on/off as true/false; the JSON number or text of a whole number or number is parsed as on the command line.
        return SettingParser.Parse(s, e.Text ?? "");
    }
}
