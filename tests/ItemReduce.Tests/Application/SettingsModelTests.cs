using ItemReduce.Application.Appendix;
using ItemReduce.Application.Jobs;
using ItemReduce.Application.Settings;
using ItemReduce.Cli;
using ItemReduce.Core.Correlation;
using ItemReduce.Core.Pipeline;
using ItemReduce.Report.Model;
using ItemReduce.Tests.Support;

namespace ItemReduce.Tests.Application;

/// <summary>
/// The settings model: every declared setting reaches exactly the parts of a job it says it concerns (driven by the
/// catalog, so a new setting is covered without a new test), the pipeline runs each stage with those records, the
/// appendix's settings table and per-scale lengths state what was done, and the README's options table is the one the
/// declarations generate.
/// </summary>
public class SettingsModelTests
{
    private static SettingValues Values(Commands command, params (Setting, string?)[] given) =>
        SettingsResolver.Resolve(command,
            [(SettingsCatalog.Get("responses"), "r.csv"), (SettingsCatalog.Get("codebook"), "c.csv"), .. given], null, _ => { });

    /// <summary>What each part of a job receives, as comparable values.</summary>
    private static Dictionary<Concerns, object> Parts(SettingValues v)
    {
        var job = SettingsMapping.ToJob(v);
        var stage = job.Pipeline.StageOptions();
        var intake = job.Intake;
        return new()
        {
            [Concerns.Intake] = $"{job.Responses}|{job.Codebook}|{job.Plan}|{intake.Delimiter}|{string.Join("/", intake.EffectiveMissingCodes)}|{intake.IdColumn}|{intake.SkipRows}",
            [Concerns.Screening] = stage.Screening,
            [Concerns.Dimensions] = stage.Dimensions,
            [Concerns.ShortForm] = stage.ShortForm with { ScaleTargets = null },
            [Concerns.Pipeline] = (stage.KeepFlagged, stage.Confirmatory),
            [Concerns.Outputs] = (job.Out, job.Force, job.NoPdf),
            [Concerns.Terminal] = SettingsMapping.ToTerminal(v),
            [Concerns.SelfCheck] = job.Pipeline.SelfCheck,
        };
    }

    public static TheoryData<string> SettingNames() => new(SettingsCatalog.All.Select(s => s.Name));

    [Theory]
    [MemberData(nameof(SettingNames))]
    public void Every_setting_changes_what_the_parts_it_concerns_receive_and_nothing_else(string name)
    {
        var s = SettingsCatalog.Get(name);
        var command = new[] { Commands.Run, Commands.Shorten, Commands.Dimensions, Commands.Screen, Commands.Check }.First(s.AppliesTo);
        var before = Parts(Values(command));
        var afterValues = Values(command, (s, s.Example));
        Assert.True(afterValues.IsGiven(name), $"{name}: example {s.Example} was not taken");
        Assert.NotEqual(SettingParser.Format(s.Default), SettingParser.Format(afterValues[name]));
        var after = Parts(afterValues);
        var targetsBefore = SettingsMapping.ToJob(Values(command)).Pipeline.StageOptions().ShortForm.ScaleTargets;
        var targetsAfter = SettingsMapping.ToJob(afterValues).Pipeline.StageOptions().ShortForm.ScaleTargets;
        foreach (var part in before.Keys)
        {
            bool changed = !Equals(before[part], after[part]) || (part == Concerns.ShortForm && !ReferenceEquals(targetsBefore, targetsAfter) &&
                !(targetsBefore ?? new Dictionary<string, int>()).OrderBy(kv => kv.Key).SequenceEqual((targetsAfter ?? new Dictionary<string, int>()).OrderBy(kv => kv.Key)));
            Assert.True(s.Concerns.HasFlag(part) == changed,
                $"{s.Option} {s.Example}: {part} {(changed ? "changed although the setting does not declare it" : "did not change although the setting concerns it")}");
        }
    }

    [Fact]
    public void Every_default_is_accepted_by_its_own_declaration_and_ranges_reach_core_limits()
    {
        foreach (var s in SettingsCatalog.All.Where(s => s.Default is double or ulong))
            Assert.True(s.InRange(Convert.ToDouble(s.Default, System.Globalization.CultureInfo.InvariantCulture)), s.Name);
        // The limits Core enforces (ParallelAnalysisOptions, ShortFormOptions) are the declared ones.
        Assert.Equal(ItemReduce.Core.Dimensions.ParallelAnalysisOptions.MaxReplicates, SettingsCatalog.Get("replicates").Max);
        Assert.Equal(ItemReduce.Core.ShortForm.ShortFormOptions.MaxItemsPerFactor, SettingsCatalog.Get("items-per-factor").Max);
        Assert.Equal(ItemReduce.Core.ShortForm.ShortFormOptions.MinItemsPerFactor, SettingsCatalog.Get("scale-targets").Min);
    }

    [Theory]
    [InlineData("cutoff-p")]
    [InlineData("run-share")]
    [InlineData("flat-sd")]
    [InlineData("missing-limit")]
    public void Screening_values_at_the_declared_limits_pass_cores_validation_and_values_beyond_fail_it(string name)
    {
        var s = SettingsCatalog.Get(name);
        double tiny = 1e-9;
        foreach (double v in new[] { s.Min, s.Max, s.Min - tiny, s.Max + tiny }.Where(double.IsFinite))
        {
            bool declared = s.InRange(v);
            var values = Values(Commands.Run);
            var job = SettingsMapping.ToJob(values);
            var o = job.Pipeline.Screening;
            o = name switch
            {
                "cutoff-p" => o with { CutoffP = v },
                "run-share" => o with { RunShare = v },
                "flat-sd" => o with { FlatSd = v },
                _ => o with { MissingLimit = v },
            };
            var e = Record.Exception(o.Validate);
            Assert.True(declared == (e is null), $"{name} = {v}: declared {(declared ? "allowed" : "not allowed")}, Core {(e is null ? "accepts" : "rejects")}");
        }
    }

    private static (JobSettings Job, LoadedSurvey Survey, PipelineResult Result) RunFixture(params (string, string)[] given)
    {
        var values = Values(Commands.Run, [.. given.Select(g => (SettingsCatalog.Get(g.Item1), (string?)g.Item2))]);
        var job = SettingsMapping.ToJob(values) with
        {
            Responses = ReferenceData.PathOf("Settings", "responses.csv"),
            Codebook = ReferenceData.PathOf("Settings", "codebook.csv"),
        };
        var survey = SurveyLoader.Load(job, ProgressLog.Silent);
        return (job, survey, SurveyPipeline.Run(survey.Prepared, job.Pipeline with { Scope = PipelineScope.All }));
    }

    [Fact]
    public void The_pipeline_runs_every_stage_with_the_shared_correlation_and_seed()
    {
        var (_, _, r) = RunFixture(("correlation", "polychoric"), ("missing-data", "listwise"), ("seed", "77"), ("replicates", "20"));
        Assert.Equal(r.Settings.StageOptions().Screening, r.Screening!.Options);
        Assert.Equal(77ul, r.Settings.StageOptions().Dimensions.Seed);
        Assert.Equal(CorrelationKind.Polychoric, r.Dimensions!.CorrelationKind);
        Assert.Equal(MissingDataHandling.Listwise, r.Dimensions.MissingData);
        Assert.Equal(CorrelationKind.Polychoric, r.ShortForm!.Correlation.Kind);
        Assert.Equal(MissingDataHandling.Listwise, r.ShortForm.Correlation.MissingData);
        // Listwise: the factoring's n is the number of complete respondents (counted here from the fixture's rows).
        int complete = File.ReadAllLines(ReferenceData.PathOf("Settings", "responses.csv")).Skip(1)
            .Select(l => l.Split(',')).Count(c => r.Analysed.RespondentCount > 0 && !c.Contains("NA")
                && r.Screening.Respondents.Any(x => x.RespondentId == c[0] && !x.Flagged));
        Assert.Equal(complete, r.ShortForm.Correlation.Respondents);
    }

    [Fact]
    public void Appendix_settings_table_and_scale_lengths_state_what_was_done()
    {
        var (job, survey, r) = RunFixture(("scale-targets", "alpha=2"), ("items-per-factor", "3"), ("replicates", "30"),
            ("percentile", "90"), ("extraction", "paf"), ("rotation", "varimax"), ("correlation", "polychoric"), ("cutoff-p", "0.01"));
        var doc = AppendixBuilder.Build(job, survey, r);
        var table = doc.Blocks.OfType<TableBlock>().Single(t => t.Title == AppendixBuilder.SettingsTableTitle);
        var rows = table.Rows.ToDictionary(x => x.Cells[0], x => (Value: x.Cells[1], Source: x.Cells[2]));
        var sf = r.ShortForm!;
        var d = r.Dimensions!;
        // Each value stated equals what the stage did, read from its result.
        Assert.Equal(d.Reference.Replicates.ToString(System.Globalization.CultureInfo.InvariantCulture), rows["--replicates"].Value);
        Assert.Equal(d.Reference.PercentileLevel.ToString(System.Globalization.CultureInfo.InvariantCulture), rows["--percentile"].Value);
        Assert.Equal("paf", rows["--extraction"].Value);
        Assert.Equal(ItemReduce.Core.Factoring.FactorExtraction.PrincipalAxis, sf.FullSolution.Extraction);
        Assert.Equal("varimax", rows["--rotation"].Value);
        Assert.Equal(ItemReduce.Core.Factoring.FactorRotation.Varimax, sf.FullSolution.Rotation);
        Assert.Equal(sf.Correlation.Kind.ToString().ToLowerInvariant(), rows["--correlation"].Value);
        Assert.Equal(sf.Correlation.MissingData.ToString().ToLowerInvariant(), rows["--missing-data"].Value);
        Assert.Equal("default", rows["--missing-data"].Source);
        Assert.Equal(r.Screening!.Options.CutoffP.ToString("R", System.Globalization.CultureInfo.InvariantCulture), rows["--cutoff-p"].Value);
        Assert.Equal(r.Settings.Seed.ToString(System.Globalization.CultureInfo.InvariantCulture), rows["--seed"].Value);
        Assert.Equal("command line", rows["--scale-targets"].Source);
        // No terminal-only or output-location settings in the table.
        Assert.DoesNotContain("--quiet", rows.Keys);
        Assert.DoesNotContain("--out", rows.Keys);

        // Per-scale lengths: the sentence gives each scale's kept and requested length, as counted from the kept items.
        string text = string.Join("\n", doc.Blocks.OfType<ParagraphBlock>().Select(p => p.Text));
        Assert.DoesNotMatch(@"up to \d+ (items )?per scale", text); // the old summary that hid per-scale lengths
        var kept = sf.Judgements.Where(j => j.Decision == ItemReduce.Core.ShortForm.ItemDecision.Keep).GroupBy(j => j.Scale).ToDictionary(g => g.Key, g => g.Count());
        Assert.Equal(2, kept["alpha"]);
        Assert.Equal(3, kept["beta"]);
        Assert.Contains("alpha 2 of 2 requested, beta 3 of 3 requested", text);
    }

    [Fact]
    public void Combined_rule_reaches_the_decision_and_the_appendix_states_its_study_accuracy()
    {
        var (job, survey, r) = RunFixture(("factors-rule", "combined"), ("replicates", "30"));
        var d = r.Dimensions!;
        Assert.Equal(ItemReduce.Core.Dimensions.FactorsRule.Combined, d.RuleUsed);
        Assert.Equal(d.ByRule.Combined, d.Retained);
        var doc = AppendixBuilder.Build(job, survey, r);
        string text = string.Join("\n", doc.Blocks.OfType<ParagraphBlock>().Select(p => p.Text));
        // The quoted figures are the study's (checked against the committed tables in RetentionRulesReferenceTests).
        Assert.Contains(ItemReduce.Core.Dimensions.RetentionStudyAccuracy.CombinedSentence(d.EffectiveRespondents), text);
        Assert.Contains("Goretzko", text);
    }

    [Fact]
    public void Readme_options_table_is_the_one_the_declarations_generate()
    {
        string root = AppContext.BaseDirectory;
        while (!File.Exists(Path.Combine(root, "ItemReduce.sln"))) root = Path.GetDirectoryName(root)!;
        string readme = File.ReadAllText(Path.Combine(root, "README.md")).ReplaceLineEndings("\n");
        const string begin = "<!-- options table: generated from src/ItemReduce.Application/Settings/SettingsCatalog.cs -->\n", end = "<!-- end of options table -->";
        int a = readme.IndexOf(begin, StringComparison.Ordinal), b = readme.IndexOf(end, StringComparison.Ordinal);
        Assert.True(a >= 0 && b > a, "README lacks the options-table markers");
        string expected = CliOptions.MarkdownTable();
        if (Environment.GetEnvironmentVariable("ITEMREDUCE_WRITE_README") == "1")
            File.WriteAllText(Path.Combine(root, "README.md"), readme[..(a + begin.Length)] + expected + readme[b..]);
        Assert.Equal(expected, readme[(a + begin.Length)..b]);
    }
}
