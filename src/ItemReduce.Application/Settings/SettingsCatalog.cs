using ItemReduce.Core.Correlation;
using ItemReduce.Core.Dimensions;
using ItemReduce.Core.Factoring;
using ItemReduce.Core.Randomness;
using ItemReduce.Core.Screening;
using ItemReduce.Core.SelfCheck;
using ItemReduce.Core.ShortForm;
using ItemReduce.IO;

namespace ItemReduce.Application.Settings;

/// <summary>
/// Every setting of every command, declared once. Defaults and ranges of analysis settings are read from the Core
/// option records and their range constants, so the command line, plan files and Core agree by construction.
/// To add a setting: declare it here (name, kind, commands, concerns, default, range or choices, example, help), then
/// give its value to the stage record in <see cref="SettingsMapping.ToJob"/>; the option, plan key, validation,
/// summary.json entry, appendix row and README row follow, and <c>SettingsReachStagesTests</c> checks the mapping.
/// </summary>
public static class SettingsCatalog
{
    private static readonly ScreeningOptions Screening = new();
    private static readonly CorrelationOptions Correlation = new();
    private static readonly DimensionOptions Dimensions = new();
    private static readonly ShortFormOptions ShortForm = new();

    private const string General = "general", ScreeningGroup = "screening", DimensionsGroup = "dimensions",
        ShortFormGroup = "factoring and short form", AppendixGroup = "appendix";

    /// <summary>All settings, in help order.</summary>
    public static readonly IReadOnlyList<Setting> All =
    [
        new()
        {
            Name = "responses", Kind = SettingKind.Path, Commands = Commands.All, Concerns = Concerns.Intake, Group = General,
            ValueName = "FILE", Example = "other.csv", DefaultText = "required",
            Help = "Responses CSV: one row per respondent, one column per item, plus an id column.",
        },
        new()
        {
            Name = "codebook", Kind = SettingKind.Path, Commands = Commands.All, Concerns = Concerns.Intake, Group = General,
            ValueName = "FILE", Example = "other-codebook.csv", DefaultText = "required",
            Help = "Codebook CSV with header item,subscale,reverse,min,max,text.",
        },
        new()
        {
            Name = "plan", Kind = SettingKind.Path, Commands = Commands.All, Concerns = Concerns.Intake, Group = General,
            ValueName = "FILE", Example = "plan.json", DefaultText = "none", AllowedInPlan = false, Recorded = false,
            Help = "JSON plan holding any other setting (keys = option names without dashes); the command line overrides it.",
        },
        new()
        {
            Name = "out", Kind = SettingKind.Path, Commands = Commands.Writing, Concerns = Concerns.Outputs, Group = General,
            ValueName = "DIR", Default = "itemreduce-results", Example = "elsewhere", Recorded = false,
            Help = "Results folder, written only when the whole run succeeds.",
        },
        new()
        {
            Name = "force", Kind = SettingKind.Flag, Commands = Commands.Writing, Concerns = Concerns.Outputs, Group = General,
            Default = false, Example = "true", Recorded = false, Help = "Replace a results folder written by an earlier run; never one holding other files (see Outputs).",
        },
        new()
        {
            Name = "missing", Kind = SettingKind.TextList, Commands = Commands.All, Concerns = Concerns.Intake, Group = General,
            ValueName = "LIST", Default = IntakeOptions.DefaultMissingCodes, Example = "-99,99",
            Help = "Comma-separated missing-data codes, replacing the default list (empty cell, NA), e.g. --missing=-99,99. An empty cell is always missing.",
        },
        new()
        {
            Name = "id-column", Kind = SettingKind.Text, Commands = Commands.All, Concerns = Concerns.Intake, Group = General,
            ValueName = "NAME", DefaultText = "'respondent' if present, else the first column that is not an item", Example = "panel_id",
            Help = "Respondent-id column.",
        },
        new()
        {
            Name = "delimiter", Kind = SettingKind.Choice, Commands = Commands.All, Concerns = Concerns.Intake, Group = General,
            Choices = ["comma", "semicolon", "tab"], DefaultText = "detected from the header", Example = "semicolon",
            Help = "Field delimiter of the responses and codebook.",
        },
        new()
        {
            Name = "skip-rows", Kind = SettingKind.Integer, Commands = Commands.All, Concerns = Concerns.Intake, Group = General,
            ValueName = "N", Default = 0UL, Min = 0, Max = IntakeOptions.MaxSkipRows, Example = "2",
            Help = "Rows right after the header row that hold no answers (question texts or import codes of a survey-platform export); they are skipped.",
        },
        new()
        {
            Name = "seed", Kind = SettingKind.Integer, Commands = Commands.Dimensions | Commands.Shorten | Commands.Run,
            Concerns = Concerns.Dimensions | Concerns.ShortForm, Group = General,
            ValueName = "N", Default = RandomStream.DefaultSeed, Min = 0, Max = ulong.MaxValue, Example = "42",
            Help = "Seed of every random step. Same inputs and seed give identical results.",
        },
        new()
        {
            Name = "quiet", Kind = SettingKind.Flag, Commands = Commands.All, Concerns = Concerns.Terminal, Group = General,
            Default = false, Example = "true", Recorded = false, Help = "No progress messages and no warnings on the terminal.",
        },
        new()
        {
            Name = "json", Kind = SettingKind.Flag, Commands = Commands.Writing, Concerns = Concerns.Terminal, Group = General,
            Default = false, Example = "true", Recorded = false, Help = "Print summary.json on stdout instead of the readable summary (for scripts).",
        },
        new()
        {
            Name = "progress", Kind = SettingKind.Flag, Commands = Commands.All, Concerns = Concerns.Terminal, Group = General,
            Default = false, Example = "true", Recorded = false, Help = "Progress messages on stderr as plain lines even when stderr is not a terminal (in a terminal, steps longer than about two seconds are shown on a live status line).",
        },
        new()
        {
            Name = "verbose", Kind = SettingKind.Flag, Commands = Commands.All, Concerns = Concerns.Terminal, Group = General,
            Default = false, Example = "true", Recorded = false, Help = "Full details of unexpected internal errors.",
        },

        // Screening
        new()
        {
            Name = "cutoff-p", Kind = SettingKind.Number, Commands = Commands.Screen | Commands.Run, Concerns = Concerns.Screening,
            Group = ScreeningGroup, ValueName = "P", Default = Screening.CutoffP, Min = 0, Max = ScreeningOptions.MaxCutoffP, MinExclusive = true, MaxExclusive = true,
            Example = "0.01", Help = "Upper-tail probability of the chi-square cutoff for squared distances, df = items answered.",
        },
        new()
        {
            Name = "distance", Kind = SettingKind.Choice, Commands = Commands.Screen | Commands.Run, Concerns = Concerns.Screening,
            Group = ScreeningGroup, Choices = ["robust", "classical"], Default = Screening.UseRobust ? "robust" : "classical",
            Example = "classical", Help = "Distance that raises the atypical flag: robust (ER estimate for incomplete data on normal scores) or classical; both are reported.",
        },
        new()
        {
            Name = "run-share", Kind = SettingKind.Number, Commands = Commands.Screen | Commands.Run, Concerns = Concerns.Screening,
            Group = ScreeningGroup, ValueName = "P", Default = Screening.RunShare, Min = 0, Max = 1, MinExclusive = true, Example = "0.7",
            Help = $"Flag a run of identical consecutive answers covering at least this share of the items (the run must also be at least {Screening.LongStringMinimum} items long). With ordinal items the limit is raised where attentive respondents simulated from the survey's fitted model reach it too often (the rule text gives the limit used).",
        },
        new()
        {
            Name = "flat-sd", Kind = SettingKind.Number, Commands = Commands.Screen | Commands.Run, Concerns = Concerns.Screening,
            Group = ScreeningGroup, ValueName = "SD", Default = Screening.FlatSd, Min = 0, Example = "0.3",
            Help = "Flag respondents whose own answers have a standard deviation below this value (0 turns the rule off).",
        },
        new()
        {
            Name = "missing-limit", Kind = SettingKind.Number, Commands = Commands.Screen | Commands.Run, Concerns = Concerns.Screening,
            Group = ScreeningGroup, ValueName = "P", Default = Screening.MissingLimit, Min = 0, Max = ScreeningOptions.MaxMissingShareLimit, MaxExclusive = true, Example = "0.3",
            Help = "Flag respondents who left more than this share of items unanswered.",
        },
        new()
        {
            Name = "keep-flagged", Kind = SettingKind.Flag, Commands = Commands.Run, Concerns = Concerns.Pipeline, Group = ScreeningGroup,
            Default = false, Example = "true", Help = "Keep flagged respondents in the later stages (default: set aside).",
        },

        // Dimensions (and every correlation-based stage)
        new()
        {
            Name = "correlation", Kind = SettingKind.Choice, Commands = Commands.Correlating, Concerns = Concerns.Dimensions | Concerns.ShortForm,
            Group = DimensionsGroup, Choices = ["pearson", "polychoric"], Default = Correlation.Kind == CorrelationKind.Polychoric ? "polychoric" : "pearson", Example = "polychoric",
            Help = "Correlation coefficient of every correlation-based stage: dimensions, factoring, item judgements and short form.",
        },
        new()
        {
            Name = "missing-data", Kind = SettingKind.Choice, Commands = Commands.Correlating, Concerns = Concerns.Dimensions | Concerns.ShortForm,
            Group = DimensionsGroup, Choices = ["pairwise", "listwise"], Default = Correlation.MissingData == MissingDataHandling.Listwise ? "listwise" : "pairwise", Example = "listwise",
            Help = "Missing answers in the correlations: pairwise (each pair uses everyone who answered both) or listwise (complete respondents only).",
        },
        new()
        {
            Name = "replicates", Kind = SettingKind.Integer, Commands = Commands.Correlating, Concerns = Concerns.Dimensions, Group = DimensionsGroup,
            ValueName = "N", Default = (ulong)Dimensions.Replicates, Min = ParallelAnalysisOptions.MinReplicates, Max = ParallelAnalysisOptions.MaxReplicates,
            Example = "200", Help = "Parallel-analysis replicates.",
        },
        new()
        {
            Name = "percentile", Kind = SettingKind.Number, Commands = Commands.Correlating, Concerns = Concerns.Dimensions, Group = DimensionsGroup,
            ValueName = "P", Default = Dimensions.Percentile, Min = 0, Max = 100, MinExclusive = true, MaxExclusive = true, Example = "99",
            Help = "Percentile of the random eigenvalues used as threshold.",
        },
        new()
        {
            Name = "reference", Kind = SettingKind.Choice, Commands = Commands.Correlating, Concerns = Concerns.Dimensions, Group = DimensionsGroup,
            Choices = ["normal", "ordinal", "permutation"], Default = null,
            DefaultText = "normal; ordinal with --correlation polychoric", Example = "permutation",
            Help = "Parallel-analysis reference: normal (Wishart draws), ordinal (large-sample distribution of polychoric correlations of unrelated items with the observed answer distributions) or permutation (each item shuffled; above 50,000 respondents within one seeded random subsample of 50,000).",
        },
        new()
        {
            Name = "factors-rule", Kind = SettingKind.Choice, Commands = Commands.Correlating, Concerns = Concerns.Dimensions, Group = DimensionsGroup,
            Choices = ["parallel-reduced", "parallel", "map", "kaiser", "empirical-kaiser", "comparison-data", "combined"], Default = RuleName(Dimensions.FactorsRule),
            Example = "comparison-data",
            Help = "Rule that sets the number of factors: parallel-reduced (parallel analysis of the reduced matrix, chosen by the project's simulation study), parallel (principal components), map, kaiser, empirical-kaiser, comparison-data or combined (a model fitted to invented surveys adjusts the parallel-reduced count using the other rules and the eigenvalue margins).",
        },
        new()
        {
            Name = "factors", Kind = SettingKind.Integer, Commands = Commands.Correlating, Concerns = Concerns.Dimensions, Group = DimensionsGroup,
            ValueName = "N", DefaultText = "set by the rule", Min = 1, Max = int.MaxValue, Example = "2",
            Help = "Fix the number of factors instead of using a rule.",
        },
        new()
        {
            Name = "threads", Kind = SettingKind.Integer, Commands = Commands.Correlating, Concerns = Concerns.Dimensions, Group = DimensionsGroup,
            ValueName = "N", DefaultText = "all cores", Min = 1, Max = 1024, Example = "1",
            Help = "Worker threads for correlations, parallel analysis and the confirmatory fits. Results do not depend on it.",
        },

        // Factoring and short form
        new()
        {
            Name = "extraction", Kind = SettingKind.Choice, Commands = Commands.Shorten | Commands.Run, Concerns = Concerns.ShortForm,
            Group = ShortFormGroup, Choices = ["minres", "paf", "ml"], Default = ExtractionName(ShortForm.Factoring.Extraction), Example = "ml",
            Help = "Factor extraction: minimum residual, principal axis or maximum likelihood.",
        },
        new()
        {
            Name = "rotation", Kind = SettingKind.Choice, Commands = Commands.Shorten | Commands.Run, Concerns = Concerns.ShortForm,
            Group = ShortFormGroup, Choices = ["oblimin", "promax", "varimax", "none"], Default = ShortForm.Factoring.Rotation.ToString().ToLowerInvariant(),
            Example = "varimax", Help = "Rotation (oblimin = quartimin, gamma 0).",
        },
        new()
        {
            Name = "items-per-factor", Kind = SettingKind.Integer, Commands = Commands.Shorten | Commands.Run, Concerns = Concerns.ShortForm,
            Group = ShortFormGroup, ValueName = "N", Default = (ulong)ShortForm.ItemsPerFactor, Min = ShortFormOptions.MinItemsPerFactor,
            Max = ShortFormOptions.MaxItemsPerFactor, Example = "3", Help = "Short-form length of each scale without a target of its own.",
        },
        new()
        {
            Name = "scale-targets", Kind = SettingKind.Targets, Commands = Commands.Shorten | Commands.Run, Concerns = Concerns.ShortForm,
            Group = ShortFormGroup, ValueName = "LIST", DefaultText = "none", Min = ShortFormOptions.MinItemsPerFactor,
            Max = ShortFormOptions.MaxItemsPerFactor, Example = "S1=2",
            Help = "Short-form lengths of named codebook subscales, e.g. comfort=3,crew=5 (others use items-per-factor).",
        },
        new()
        {
            Name = "holdout", Kind = SettingKind.Number, Commands = Commands.Shorten | Commands.Run, Concerns = Concerns.ShortForm,
            Group = ShortFormGroup, ValueName = "P", Default = ShortForm.HoldoutFraction, Min = 0, Max = ShortFormOptions.MaxHoldoutFraction,
            Example = "0.5", Help = "Share of respondents held out to evaluate the short form on data it was not chosen on (0: none).",
        },
        new()
        {
            Name = "confirmatory", Kind = SettingKind.Flag, Commands = Commands.Shorten | Commands.Run, Concerns = Concerns.Pipeline, Group = ShortFormGroup,
            Default = true, Example = "false",
            Help = "Fit the full and short forms as confirmatory factor models (ML; casewise ML with missing answers) and report fit, loadings and composite reliability. On by default; --confirmatory false leaves the check out.",
        },

        // Appendix
        new()
        {
            Name = "self-check", Kind = SettingKind.Integer, Commands = Commands.Run, Concerns = Concerns.SelfCheck, Group = AppendixGroup,
            ValueName = "N", Default = (ulong)SelfCheckOptions.DefaultSurveys, Min = 0, Max = SelfCheckOptions.MaxSurveys, Example = "50",
            Help = "Simulated surveys of the self-check: surveys like this one are drawn from the fitted model and analysed with the same settings, to show how stable the screening, factor-count and item decisions are for this design (0 turns it off).",
        },
        new()
        {
            Name = "no-pdf", Kind = SettingKind.Flag, Commands = Commands.Run, Concerns = Concerns.Outputs, Group = AppendixGroup,
            Default = false, Example = "true", Help = "Do not draw appendix.pdf (tables.md and tables.tex are still written).",
        },
    ];

    private static readonly Dictionary<string, Setting> ByName = All.ToDictionary(s => s.Name, StringComparer.Ordinal);

    /// <summary>The setting called <paramref name="name"/> (without dashes), or null.</summary>
    public static Setting? Find(string name) => ByName.GetValueOrDefault(name);

    /// <summary>The setting called <paramref name="name"/>; throws for an undeclared name (a programming error).</summary>
    public static Setting Get(string name) => ByName[name];

    /// <summary>Command name as typed.</summary>
    public static string CommandName(Commands c) => c.ToString().ToLowerInvariant();

    /// <summary>Option value of a retention rule.</summary>
    public static string RuleName(FactorsRule rule) => rule switch
    {
        FactorsRule.Parallel => "parallel",
        FactorsRule.ParallelReduced => "parallel-reduced",
        FactorsRule.Map => "map",
        FactorsRule.Kaiser => "kaiser",
        FactorsRule.EmpiricalKaiser => "empirical-kaiser",
        FactorsRule.ComparisonData => "comparison-data",
        FactorsRule.Hull => "hull",
        FactorsRule.Combined => "combined",
        _ => "fixed",
    };

    /// <summary>Option value of an extraction method.</summary>
    public static string ExtractionName(FactorExtraction e) => e switch
    {
        FactorExtraction.PrincipalAxis => "paf",
        FactorExtraction.MaximumLikelihood => "ml",
        _ => "minres",
    };
}
