using System.CommandLine;
using ItemReduce.Application.Settings;

namespace ItemReduce.Cli;

/// <summary>The options of one command, one per declared setting (<see cref="SettingsCatalog"/>). Every command accepts
/// every setting so that the command line and plans behave the same: a setting the command does not use is hidden from
/// its help and ignored with a notice. Values are taken as text and typed by <see cref="SettingParser"/>, so messages
/// speak of allowed values, never of program types.</summary>
internal sealed class CliOptions
{
    public CliOptions(Commands command)
    {
        Options = SettingsCatalog.All.Select(s => (s, new Option<string>(s.Option)
        {
            Description = Describe(s),
            HelpName = s.Kind switch
            {
                SettingKind.Flag => "true|false",
                SettingKind.Choice => string.Join("|", s.Choices),
                _ => s.ValueName,
            },
            Hidden = !s.AppliesTo(command),
            Arity = s.Kind == SettingKind.Flag ? ArgumentArity.ZeroOrOne : ArgumentArity.ExactlyOne,
        })).ToList();
    }

    /// <summary>Each setting with its option.</summary>
    public IReadOnlyList<(Setting Setting, Option<string> Option)> Options { get; }

    /// <summary>Help text of a setting: its help, the allowed values and the default.</summary>
    internal static string Describe(Setting s)
    {
        string text = DefaultText(s) == RequiredText ? "[required] " + s.Help : s.Help;
        if (s.Kind is SettingKind.Integer or SettingKind.Number or SettingKind.Choice or SettingKind.Targets) text += $" Allowed: {s.Allowed}.";
        string? def = DefaultText(s);
        if (def == RequiredText) text += " Give it on the command line or in the plan.";
        else if (def is not null && s.Kind != SettingKind.Flag) text += $" Default: {def}.";
        return text;
    }

    /// <summary>The README's options table (Markdown), generated from the declarations; a test keeps the README equal to it.</summary>
    internal static string MarkdownTable()
    {
        var sb = new System.Text.StringBuilder("| option | default | commands | meaning |\n| --- | --- | --- | --- |\n");
        string? group = null;
        foreach (var s in SettingsCatalog.All)
        {
            if (s.Group != group)
            {
                group = s.Group;
                sb.Append($"| **{group}** | | | |\n");
            }
            string name = s.Kind switch
            {
                SettingKind.Flag => s.Option,
                SettingKind.Choice => $"{s.Option} {string.Join("\\|", s.Choices)}",
                _ => $"{s.Option} {s.ValueName}",
            };
            string commands = s.Commands == Commands.All ? "all" : string.Join(", ",
                new[] { Commands.Check, Commands.Screen, Commands.Dimensions, Commands.Shorten, Commands.Run }.Where(s.AppliesTo).Select(SettingsCatalog.CommandName));
            string def = s.Kind == SettingKind.Flag ? (s.Default is true ? "on" : "off") : DefaultText(s) ?? "—";
            string meaning = s.Help;
            if (s.Kind is SettingKind.Integer or SettingKind.Number or SettingKind.Targets) meaning += $" Allowed: {s.Allowed}.";
            sb.Append($"| `{name}` | {def} | {commands} | {meaning.Replace("|", "\\|", StringComparison.Ordinal)} |\n");
        }
        return sb.ToString();
    }

    private const string RequiredText = "required";

    /// <summary>The default in words, or null when there is none to show.</summary>
    internal static string? DefaultText(Setting s) => s.DefaultText ?? (s.Default is null ? null : s.Kind switch
    {
        SettingKind.TextList => string.Join(", ", ((IReadOnlyList<string>)s.Default).Select(c => c.Length == 0 ? "empty cell" : c)),
        _ => SettingParser.Format(s.Default),
    });
}
