using System.CommandLine;
using System.CommandLine.Help;
using System.CommandLine.Invocation;
using ItemReduce.Application.Jobs;
using ItemReduce.Application.Settings;

namespace ItemReduce.Cli;

/// <summary>Worked examples shown at the end of each command's help; they use the bundled sample survey, so they can be
/// typed as shown from the repository folder (a test runs the parser over each).</summary>
internal static class HelpExamples
{
    private const string Sample = "sample-surveys/ferry-riders";

    /// <summary>Examples of <paramref name="command"/>: a comment line and the command line (without "itemreduce").</summary>
    internal static IReadOnlyList<(string What, string Line)> Of(Commands command) => command switch
    {
        Commands.Check =>
        [
            ("Check a responses file against its codebook (writes nothing)", $"check --responses {Sample}/responses.csv --codebook {Sample}/codebook.csv"),
            ("Same, with the settings kept in a plan file", $"check --plan {Sample}/plan.json"),
            ("A survey-platform export with two extra header rows and -99 for 'no answer'",
                $"check --responses {Sample}/platform-export.csv --codebook {Sample}/codebook.csv --skip-rows 2 --missing=-99"),
        ],
        Commands.Screen =>
        [
            ("Flag respondents for review", $"screen --plan {Sample}/plan.json --out screening-results"),
            ("Stricter cutoff and the classical distance", $"screen --plan {Sample}/plan.json --cutoff-p 0.001 --distance classical --out screening-strict"),
        ],
        Commands.Dimensions =>
        [
            ("How many dimensions? (parallel analysis decides)", $"dimensions --plan {Sample}/plan.json --out dimension-results"),
            ("Polychoric correlations, the MAP rule decides", $"dimensions --plan {Sample}/plan.json --correlation polychoric --factors-rule map --out dimension-map"),
        ],
        Commands.Shorten =>
        [
            ("Short form with four items per scale", $"shorten --plan {Sample}/plan.json --items-per-factor 4 --out short-form"),
            ("Named lengths for two scales and a 30 % holdout", $"shorten --plan {Sample}/plan.json --scale-targets comfort=3,crew=5 --holdout 0.3 --out short-form-holdout"),
        ],
        _ =>
        [
            ("The whole pipeline on the sample survey", $"run --plan {Sample}/plan.json --out results"),
            ("Same from explicit files, without the PDF", $"run --responses {Sample}/responses.csv --codebook {Sample}/codebook.csv --no-pdf --out results-tables"),
            ("For scripts: summary.json on stdout, no warnings", $"run --plan {Sample}/plan.json --out results-json --json --quiet"),
        ],
    };

    /// <summary>Replaces the help action so that each command's help ends with its examples, and the version action so
    /// that <c>itemreduce --version</c> prints the same version summary.json records.</summary>
    internal static void Install(RootCommand root, TextWriter stdout)
    {
        var help = root.Options.OfType<HelpOption>().First();
        help.Action = new WithExamples((SynchronousCommandLineAction)help.Action!, stdout);
        var version = root.Options.OfType<VersionOption>().First();
        version.Action = new PrintVersion(stdout);
    }

    /// <summary>The examples block for a command name, or empty for the root command.</summary>
    internal static string Text(string commandName)
    {
        var command = Enum.GetValues<Commands>().FirstOrDefault(c => SettingsCatalog.CommandName(c) == commandName && c is Commands.Check or
            Commands.Screen or Commands.Dimensions or Commands.Shorten or Commands.Run);
        if (command == 0) return "Examples:\n  itemreduce run --plan " + Sample + "/plan.json --out results\n  itemreduce run --help\n";
        var sb = new System.Text.StringBuilder("Examples:\n");
        foreach (var (what, line) in Of(command)) sb.Append("  # ").Append(what).Append("\n  itemreduce ").Append(line).Append("\n\n");
        return sb.ToString().TrimEnd('\n') + "\n";
    }

    private sealed class WithExamples(SynchronousCommandLineAction inner, TextWriter stdout) : SynchronousCommandLineAction
    {
        public override int Invoke(ParseResult parseResult)
        {
            int code = inner.Invoke(parseResult);
            stdout.WriteLine(Text(parseResult.CommandResult.Command.Name));
            return code;
        }
    }

    private sealed class PrintVersion(TextWriter stdout) : SynchronousCommandLineAction
    {
        public override int Invoke(ParseResult parseResult)
        {
            stdout.WriteLine("itemreduce " + SurveyJob.Version);
            return 0;
        }
    }
}
