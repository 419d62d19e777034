using System.CommandLine;
using System.Globalization;
using ItemReduce.IO;
using ItemReduce.IO.Jobs;

namespace ItemReduce.Cli;

/// <summary>
/// The command-line shell: parses options (merging a plan file), builds one <see cref="JobSettings"/>
/// and hands it to the job. Exit codes: 0 success, 2 input or usage problem, 1 unexpected internal failure.
/// </summary>
public static class CliApp
{
    public const int Ok = 0, InternalFailure = 1, InputProblem = 2;

    /// <summary>Runs the command line with the given writers.</summary>
    public static int Run(string[] args, TextWriter stdout, TextWriter stderr, bool stderrIsTerminal = false)
    {
        var o = new CliOptions();
        var root = Build(o, stdout, stderr, stderrIsTerminal);
        var config = new InvocationConfiguration { Output = stdout, Error = stderr, EnableDefaultExceptionHandler = false };
        bool verbose = args.Contains("--verbose");
        try
        {
            var parse = root.Parse(args);
            if (parse.Errors.Count > 0) return UsageError(parse, stderr);
            // Merge the plan file: its settings become options unless given on the command line.
            string? plan = parse.GetValue(o.Plan);
            if (plan is not null && parse.CommandResult.Command is { } cmd && cmd != root)
            {
                var known = cmd.Options.Where(x => x.Name.StartsWith("--", StringComparison.Ordinal) && x != o.Plan)
                    .Select(CliOptions.Key).ToHashSet(StringComparer.Ordinal);
                var extra = new List<string>();
                foreach (var (key, value) in PlanFile.Read(plan, known))
                {
                    var option = cmd.Options.First(x => CliOptions.Key(x) == key);
                    if (parse.GetResult(option) is { Implicit: false }) continue; // command line wins
                    extra.Add($"{option.Name}={value}");
                }
                parse = root.Parse([.. args, .. extra]);
                if (parse.Errors.Count > 0) return UsageError(parse, stderr, plan);
            }
            return parse.Invoke(config);
        }
        catch (SurveyInputException e)
        {
            stderr.WriteLine("itemreduce: " + e.Message);
            return InputProblem;
        }
        catch (Exception e)
        {
            stderr.WriteLine($"itemreduce: internal error: {e.Message.ReplaceLineEndings(" ")}" + (verbose ? "" : " (run with --verbose for details)"));
            if (verbose) stderr.WriteLine(e.ToString());
            return InternalFailure;
        }
    }

    private static int UsageError(ParseResult parse, TextWriter stderr, string? plan = null)
    {
        string where = plan is null ? "" : $" (options include the plan {Path.GetFileName(plan)})";
        stderr.WriteLine($"itemreduce: {parse.Errors[0].Message}{where}. Fix: see 'itemreduce {parse.CommandResult.Command.Name} --help'.");
        return InputProblem;
    }

    private static RootCommand Build(CliOptions o, TextWriter stdout, TextWriter stderr, bool stderrIsTerminal)
    {
        var root = new RootCommand("ItemReduce: screen respondents, decide the number of dimensions, trim an item bank to a reliable short form, and document every decision.");

        var check = new Command("check", "Validate the responses and codebook and print a data summary. Writes nothing.");
        foreach (var x in o.Common) check.Options.Add(x);
        check.SetAction(pr =>
        {
            var s = Settings(pr, o);
            var survey = SurveyLoader.Load(s, Log(pr, o, stderr, stderrIsTerminal));
            stdout.Write(DataCheckReport.Format(survey, s));
            return Ok;
        });
        root.Subcommands.Add(check);

        var run = new Command("run", "The whole pipeline: screen respondents, dimensions, factoring and short form, appendix.");
        foreach (var x in o.Common.Concat(o.Writing)) run.Options.Add(x);
        run.SetAction(pr =>
        {
            var s = Settings(pr, o);
            SurveyJob.Run(s, stdout, Log(pr, o, stderr, stderrIsTerminal));
            return Ok;
        });
        root.Subcommands.Add(run);

        foreach (var (name, what) in new[]
                 {
                     ("screen", "Flag careless and atypical respondents for human review."),
                     ("dimensions", "Decide how many dimensions the items measure."),
                     ("shorten", "Extract and rotate factors, judge items and build a short form."),
                 })
        {
            var c = new Command(name, what);
            foreach (var x in o.Common.Concat(o.Writing)) c.Options.Add(x);
            c.SetAction(pr =>
            {
                stderr.WriteLine($"itemreduce: '{name}' is not yet available in this version. Fix: use 'itemreduce run' for now.");
                return InputProblem;
            });
            root.Subcommands.Add(c);
        }
        return root;
    }

    private static ProgressLog Log(ParseResult pr, CliOptions o, TextWriter stderr, bool stderrIsTerminal)
    {
        if (pr.GetValue(o.Quiet)) return ProgressLog.Silent;
        return pr.GetValue(o.Progress) || stderrIsTerminal ? new ProgressLog(stderr) : ProgressLog.Silent;
    }

    /// <summary>Maps parsed options to the settings record.</summary>
    internal static JobSettings Settings(ParseResult pr, CliOptions o)
    {
        string responses = pr.GetValue(o.Responses)
            ?? throw new SurveyInputException("no responses file given. Fix: add --responses FILE (or \"responses\" in the plan).");
        string codebook = pr.GetValue(o.Codebook)
            ?? throw new SurveyInputException("no codebook given. Fix: add --codebook FILE (or \"codebook\" in the plan).");
        var given = new List<KeyValuePair<string, string>>();
        foreach (var option in pr.CommandResult.Command.Options)
        {
            if (option == o.Plan || option == o.Quiet || option == o.Progress || option == o.Verbose) continue;
            var r = pr.GetResult(option);
            if (r is null || r.Implicit) continue;
            given.Add(new(CliOptions.Key(option), string.Join(",", r.Tokens.Select(t => t.Value)) is { Length: > 0 } v ? v : "true"));
        }
        return new JobSettings
        {
            Responses = responses,
            Codebook = codebook,
            Plan = pr.GetValue(o.Plan),
            Out = pr.GetValue(o.Out) ?? "itemreduce-results",
            Force = pr.GetValue(o.Force),
            Seed = pr.GetValue(o.Seed) ?? 1,
            Intake = new IntakeOptions(ParseDelimiter(pr.GetValue(o.Delimiter)), ParseMissing(pr.GetValue(o.Missing)), pr.GetValue(o.IdColumn)),
            EffectiveOptions = given,
        };
    }

    private static char? ParseDelimiter(string? text) => text?.ToLowerInvariant() switch
    {
        null => null,
        "comma" or "," => ',',
        "semicolon" or ";" => ';',
        "tab" or "\\t" or "\t" => '\t',
        _ => throw new SurveyInputException($"--delimiter {InputErrors.Show(text)} is not supported. Fix: use comma, semicolon or tab."),
    };

    private static IReadOnlyList<string>? ParseMissing(string? text) =>
        text is null ? null : text.Split(',').Select(s => s.Trim()).ToList();

    internal static string Invariant(double v) => v.ToString("R", CultureInfo.InvariantCulture);
}
