using System.CommandLine;
using System.Globalization;
using ItemReduce.Core.Correlation;
using ItemReduce.Core.Dimensions;
using ItemReduce.Core.Factoring;
using ItemReduce.Core.Pipeline;
using ItemReduce.Core.Screening;
using ItemReduce.Core.ShortForm;
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
                var known = o.All.Where(x => x != o.Plan).Select(CliOptions.Key).ToHashSet(StringComparer.Ordinal);
                var extra = new List<string>();
                foreach (var (key, value) in PlanFile.Read(plan, known))
                {
                    var option = cmd.Options.FirstOrDefault(x => CliOptions.Key(x) == key);
                    if (option is null) continue; // a setting for another command
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
        stderr.WriteLine($"itemreduce: {parse.Errors[0].Message.TrimEnd('.')}{where}. Fix: see 'itemreduce {parse.CommandResult.Command.Name} --help'.");
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

        Add(root, "screen", "Flag careless and multivariate-atypical respondents for human review (respondent-flags.csv).",
            PipelineScope.Screen, o.ScreeningOptions);
        Add(root, "dimensions", "Decide how many dimensions the items measure: eigenvalues, parallel analysis, MAP, KMO, Bartlett (eigenvalues.csv).",
            PipelineScope.Dimensions, o.DimensionOptions);
        Add(root, "shorten", "Extract and rotate factors, judge items, and build a short form with reliabilities (no screening: analyses the respondents given).",
            PipelineScope.Shorten, o.DimensionOptions.Concat(o.ShortFormOptions));
        Add(root, "run", "The whole pipeline: screening, dimensions, factoring, reliability, short form and the methods appendix (appendix.pdf, tables.md, tables.tex).",
            PipelineScope.All, o.ScreeningOptions.Append(o.KeepFlagged).Concat(o.DimensionOptions).Concat(o.ShortFormOptions).Append(o.NoPdf));
        return root;

        void Add(RootCommand parent, string name, string description, PipelineScope scope, IEnumerable<Option> stageOptions)
        {
            var c = new Command(name, description);
            foreach (var x in o.Common.Concat(o.Writing).Concat(stageOptions)) c.Options.Add(x);
            c.SetAction(pr =>
            {
                SurveyJob.Run(Settings(pr, o), scope, stdout, Log(pr, o, stderr, stderrIsTerminal));
                return Ok;
            });
            parent.Subcommands.Add(c);
        }
    }

    private static ProgressLog Log(ParseResult pr, CliOptions o, TextWriter stderr, bool stderrIsTerminal)
    {
        if (pr.GetValue(o.Quiet)) return ProgressLog.Silent;
        return pr.GetValue(o.Progress) || stderrIsTerminal ? new ProgressLog(stderr) : ProgressLog.Silent;
    }

    /// <summary>Maps parsed options to the settings record, checking ranges.</summary>
    internal static JobSettings Settings(ParseResult pr, CliOptions o)
    {
        string responses = pr.GetValue(o.Responses)
            ?? throw new SurveyInputException("no responses file given. Fix: add --responses FILE (or \"responses\" in the plan).");
        string codebook = pr.GetValue(o.Codebook)
            ?? throw new SurveyInputException("no codebook given. Fix: add --codebook FILE (or \"codebook\" in the plan).");
        var given = new List<KeyValuePair<string, string>>();
        foreach (var option in pr.CommandResult.Command.Options)
        {
            if (option == o.Plan || option == o.Quiet || option == o.Progress || option == o.Verbose || option == o.Force) continue;
            var r = pr.GetResult(option);
            if (r is null || r.Implicit) continue;
            string value = string.Join(",", r.Tokens.Select(t => t.Value));
            if (option.Name is "--responses" or "--codebook" or "--out") value = Path.GetFileName(value.TrimEnd('/', '\\'));
            given.Add(new(CliOptions.Key(option), value.Length > 0 ? value : "true"));
        }

        var screening = new ScreeningOptions
        {
            CutoffP = Range(pr.GetValue(o.CutoffP), "--cutoff-p", 1e-12, 0.5, 0.001, "a probability such as 0.001"),
            UseRobust = Choice(pr.GetValue(o.Distance), "--distance", ["robust", "classical"], "robust") == "robust",
            LongStringShare = Range(pr.GetValue(o.RunShare), "--run-share", 0.01, 1, 0.5, "a share between 0 and 1"),
            FlatVariabilityLimit = Range(pr.GetValue(o.FlatSd), "--flat-sd", 0, 1000, 0.2, "a standard deviation such as 0.2"),
            MissingShareLimit = Range(pr.GetValue(o.MissingLimit), "--missing-limit", 0, 0.999, 0.5, "a share between 0 and 1"),
        };
        int? factors = pr.GetValue(o.Factors);
        if (factors is < 1) throw BadOption("--factors", factors.Value.ToString(CultureInfo.InvariantCulture), "a whole number of at least 1");
        int? threads = pr.GetValue(o.Threads);
        if (threads is < 1) throw BadOption("--threads", threads.Value.ToString(CultureInfo.InvariantCulture), "a whole number of at least 1");
        var correlation = Choice(pr.GetValue(o.Correlation), "--correlation", ["pearson", "polychoric"], "pearson") == "polychoric" ? CorrelationKind.Polychoric : CorrelationKind.Pearson;
        var dimensions = new DimensionOptions
        {
            Correlation = correlation,
            MissingData = Choice(pr.GetValue(o.MissingData), "--missing-data", ["pairwise", "listwise"], "pairwise") == "listwise" ? MissingDataHandling.Listwise : MissingDataHandling.Pairwise,
            Replicates = (int)Range(pr.GetValue(o.Replicates), "--replicates", 10, 1_000_000, 1000, "a whole number from 10 to 1000000"),
            Percentile = Range(pr.GetValue(o.Percentile), "--percentile", 50, 99.9, 95, "a percentile from 50 to 99.9"),
            Reference = Choice(pr.GetValue(o.Reference), "--reference", ["normal", "ordinal", "permutation"], correlation == CorrelationKind.Polychoric ? "ordinal" : "normal") switch
            {
                "permutation" => ReferenceKind.Permutation,
                "ordinal" => ReferenceKind.Ordinal,
                _ => ReferenceKind.Normal,
            },
            FactorsRule = Choice(pr.GetValue(o.FactorsRule), "--factors-rule", ["parallel-reduced", "parallel", "map", "kaiser", "empirical-kaiser", "comparison-data"], "parallel-reduced") switch
            {
                "parallel" => RetentionRule.Parallel,
                "map" => RetentionRule.Map,
                "empirical-kaiser" => RetentionRule.EmpiricalKaiser,
                "comparison-data" => RetentionRule.ComparisonData,
                "kaiser" => RetentionRule.Kaiser,
                _ => RetentionRule.ParallelReduced,
            },
            FixedFactors = factors,
            MaxDegreeOfParallelism = threads ?? -1,
        };
        var factoring = new FactoringOptions
        {
            Extraction = Choice(pr.GetValue(o.Extraction), "--extraction", ["minres", "paf", "ml"], "minres") switch
            {
                "paf" => FactorExtraction.PrincipalAxis,
                "ml" => FactorExtraction.MaximumLikelihood,
                _ => FactorExtraction.MinimumResidual,
            },
            Rotation = Choice(pr.GetValue(o.Rotation), "--rotation", ["oblimin", "promax", "varimax", "none"], "oblimin") switch
            {
                "promax" => FactorRotation.Promax,
                "varimax" => FactorRotation.Varimax,
                "none" => FactorRotation.None,
                _ => FactorRotation.Oblimin,
            },
        };
        var shortForm = new ShortFormOptions
        {
            Factoring = factoring,
            ItemsPerScale = (int)Range(pr.GetValue(o.ItemsPerFactor), "--items-per-factor", 2, 1000, 4, "a whole number of at least 2"),
            ScaleTargets = ParseTargets(pr.GetValue(o.ScaleTargets)),
            HoldoutFraction = Range(pr.GetValue(o.Holdout), "--holdout", 0, 0.9, 0, "a share from 0 (none) to 0.9, e.g. 0.5"),
        };
        return new JobSettings
        {
            Responses = responses,
            Codebook = codebook,
            Plan = pr.GetValue(o.Plan),
            Out = pr.GetValue(o.Out) ?? "itemreduce-results",
            Force = pr.GetValue(o.Force),
            Seed = pr.GetValue(o.Seed) ?? 1,
            Intake = new IntakeOptions(ParseDelimiter(pr.GetValue(o.Delimiter)), ParseMissing(pr.GetValue(o.Missing)), pr.GetValue(o.IdColumn)),
            Pipeline = new PipelineSettings { Screening = screening, KeepFlagged = pr.GetValue(o.KeepFlagged), Dimensions = dimensions, ShortForm = shortForm },
            NoPdf = pr.GetValue(o.NoPdf),
            EffectiveOptions = given,
        };
    }

    private static SurveyInputException BadOption(string name, string value, string allowed) =>
        new($"{name} {InputErrors.Show(value)} is not allowed. Fix: give {allowed}.");

    private static double Range(double? value, string name, double min, double max, double fallback, string allowed)
    {
        if (value is null) return fallback;
        double v = value.Value;
        if (!double.IsFinite(v) || v < min || v > max) throw BadOption(name, v.ToString("R", CultureInfo.InvariantCulture), allowed);
        return v;
    }

    private static double Range(int? value, string name, int min, int max, int fallback, string allowed) =>
        Range(value is null ? null : (double?)value.Value, name, min, max, fallback, allowed);

    private static string Choice(string? value, string name, string[] allowed, string fallback)
    {
        if (value is null) return fallback;
        string v = value.Trim().ToLowerInvariant();
        if (!allowed.Contains(v)) throw BadOption(name, value, "one of " + string.Join(", ", allowed));
        return v;
    }

    private static IReadOnlyDictionary<string, int>? ParseTargets(string? text)
    {
        if (string.IsNullOrWhiteSpace(text)) return null;
        var d = new Dictionary<string, int>(StringComparer.Ordinal);
        foreach (string part in text.Split(',', StringSplitOptions.RemoveEmptyEntries | StringSplitOptions.TrimEntries))
        {
            int eq = part.LastIndexOf('=');
            if (eq <= 0 || !int.TryParse(part[(eq + 1)..], NumberStyles.None, CultureInfo.InvariantCulture, out int n) || n < 1)
                throw BadOption("--scale-targets", part, "subscale=length pairs such as comfort=3,crew=5");
            d[part[..eq].Trim()] = n;
        }
        return d;
    }

    private static char? ParseDelimiter(string? text) => text?.ToLowerInvariant() switch
    {
        null => null,
        "comma" or "," => ',',
        "semicolon" or ";" => ';',
        "tab" or "\\t" or "\t" => '\t',
        _ => throw BadOption("--delimiter", text, "comma, semicolon or tab"),
    };

    private static IReadOnlyList<string>? ParseMissing(string? text) =>
        text is null ? null : text.Split(',').Select(s => s.Trim()).ToList();
}
