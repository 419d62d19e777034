using System.CommandLine;
using ItemReduce.Application.Jobs;
using ItemReduce.Application.Settings;
using ItemReduce.Application.Summary;
using ItemReduce.Core.Pipeline;
using ItemReduce.IO;

namespace ItemReduce.Cli;

/// <summary>
/// The command-line shell: parses options (merging a plan file) into the declared settings, builds one
/// <see cref="JobSettings"/>, hands it to the job and prints the run's warnings (numbered, one line each, unless --quiet). Exit codes: 0 success, 2 input or usage problem, 1 unexpected internal failure.
/// </summary>
internal static class CliApp
{
    public const int Ok = 0, InternalFailure = 1, InputProblem = 2;

    /// <summary>Runs the command line with the given writers.</summary>
    /// <param name="args">Arguments.</param>
    /// <param name="stdout">Standard output.</param>
    /// <param name="stderr">Standard error.</param>
    /// <param name="stderrIsTerminal">True when stderr is a terminal (progress messages are shown).</param>
    /// <param name="stdoutIsTerminal">True when stdout is a terminal (the summary is drawn as tables).</param>
    public static int Run(string[] args, TextWriter stdout, TextWriter stderr, bool stderrIsTerminal = false, bool stdoutIsTerminal = false)
    {
        var root = Build(stdout, stderr, stderrIsTerminal, stdoutIsTerminal);
        var config = new InvocationConfiguration { Output = stdout, Error = stderr, EnableDefaultExceptionHandler = false };
        bool verbose = args.Contains("--verbose");
        try
        {
            var parse = root.Parse(args);
            if (parse.Errors.Count > 0) return UsageError(parse, stderr);
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

    private static int UsageError(ParseResult parse, TextWriter stderr)
    {
        stderr.WriteLine($"itemreduce: {parse.Errors[0].Message.TrimEnd('.')}. Fix: see 'itemreduce {parse.CommandResult.Command.Name} --help'.");
        return InputProblem;
    }

    internal static RootCommand Build(TextWriter stdout, TextWriter stderr, bool stderrIsTerminal, bool stdoutIsTerminal)
    {
        var root = new RootCommand("ItemReduce: screen respondents, decide the number of dimensions, trim an item bank to a reliable short form, and document every decision.");
        Add(Commands.Check, "Validate the responses and codebook and print a data summary. Writes nothing.", null);
        Add(Commands.Screen, "Flag careless and multivariate-atypical respondents for human review (respondent-flags.csv).", PipelineScope.Screen);
        Add(Commands.Dimensions, "Decide how many dimensions the items measure: eigenvalues, parallel analysis, MAP, KMO, Bartlett (eigenvalues.csv).",
            PipelineScope.Dimensions);
        Add(Commands.Shorten, "Extract and rotate factors, judge items, and build a short form with reliabilities (no screening: analyses the respondents given).",
            PipelineScope.Shorten);
        Add(Commands.Run, "The whole pipeline: screening, dimensions, factoring, reliability, short form and the methods appendix (appendix.pdf, tables.md, tables.tex).",
            PipelineScope.All);
        HelpExamples.Install(root, stdout);
        return root;

        void Add(Commands command, string description, PipelineScope? scope)
        {
            var c = new Command(SettingsCatalog.CommandName(command), description);
            var options = new CliOptions(command);
            foreach (var (_, option) in options.Options) c.Options.Add(option);
            c.SetAction(pr =>
            {
                var notices = new List<string>();
                var job = Settings(pr, command, options, notices.Add);
                var terminal = SettingsMapping.ToTerminal(job.Values);
                if (!terminal.Quiet) foreach (string n in notices) stderr.WriteLine("itemreduce: " + n);
                // In a terminal: a live status line for long steps; with --progress elsewhere: plain lines; else nothing.
                using var view = !terminal.Quiet && stderrIsTerminal ? new TerminalProgress(stderr) : null;
                var log = view is not null ? new ProgressLog(view.Report)
                    : !terminal.Quiet && terminal.Progress ? new ProgressLog(stderr) : ProgressLog.Silent;
                if (scope is null)
                {
                    var survey = SurveyLoader.Load(job, log);
                    view?.Dispose();
                    stdout.Write(DataCheckReport.Format(survey, job));
                    if (!terminal.Quiet) WarningLines.Write(stderr, survey.Prepared.Warnings);
                    return Ok;
                }
                var outcome = SurveyJob.Run(job, scope.Value, log);
                view?.Dispose();
                if (terminal.Json) stdout.Write(JsonOut.Serialize(outcome.Summary));
                else SummaryConsole.Write(RunSummary.Blocks(outcome.Summary, outcome.OutDir, outcome.Files), stdout, stdoutIsTerminal);
                stdout.Flush();
                if (!terminal.Quiet) WarningLines.Write(stderr, RunWarnings.Of(outcome.Result));
                return Ok;
            });
            root.Subcommands.Add(c);
        }
    }

    /// <summary>Types and checks every setting given on the command line and in the plan (nothing else is read) and
    /// maps them to the job settings.</summary>
    internal static JobSettings Settings(ParseResult pr, Commands command, CliOptions options, Action<string> notice)
    {
        var given = new List<(Setting, string?)>();
        foreach (var (setting, option) in options.Options)
        {
            var r = pr.GetResult(option);
            if (r is null || r.Implicit) continue;
            given.Add((setting, r.Tokens.Count == 0 ? null : r.Tokens[^1].Value));
        }
        PlanContents? plan = null;
        var planGiven = given.FirstOrDefault(g => g.Item1.Name == "plan");
        if (planGiven.Item1 is not null)
        {
            var known = SettingsCatalog.All.Where(s => s.AllowedInPlan).Select(s => s.Name).ToHashSet(StringComparer.Ordinal);
            plan = PlanFile.Read(planGiven.Item2 ?? "", known);
        }
        var values = SettingsResolver.Resolve(command, given, plan, notice);
        return SettingsMapping.ToJob(values, plan);
    }
}
