using ItemReduce.Application.Jobs;
using ItemReduce.Core.Correlation;
using ItemReduce.Core.Data;
using ItemReduce.Core.Dimensions;
using ItemReduce.Core.Factoring;
using ItemReduce.Core.Pipeline;
using ItemReduce.IO;

namespace ItemReduce.Application.Settings;

/// <summary>What the terminal shows.</summary>
/// <param name="Quiet">No progress and no warnings.</param>
/// <param name="Progress">Progress even when stderr is not a terminal.</param>
/// <param name="Verbose">Full details of internal errors.</param>
/// <param name="Json">Print summary.json on stdout instead of the readable summary.</param>
public sealed record TerminalSettings(bool Quiet, bool Progress, bool Verbose, bool Json = false);

/// <summary>
/// Gives each setting's value to the record of the stage that reads it. The only place where settings meet the Core
/// option records; Core never sees a setting name.
/// </summary>
public static class SettingsMapping
{
    /// <summary>The job settings of <paramref name="values"/>; <paramref name="plan"/> is the plan read, if any.</summary>
    /// <exception cref="SurveyInputException">No responses or codebook given.</exception>
    public static JobSettings ToJob(SettingValues values, PlanContents? plan = null)
    {
        ArgumentNullException.ThrowIfNull(values);
        string responses = values.Text("responses")
            ?? throw new SurveyInputException("no responses file given. Fix: add --responses FILE (or \"responses\" in the plan).");
        string codebook = values.Text("codebook")
            ?? throw new SurveyInputException("no codebook given. Fix: add --codebook FILE (or \"codebook\" in the plan).");
        var defaults = new PipelineSettings();
        var screening = defaults.Screening with
        {
            CutoffP = values.Number("cutoff-p"),
            UseRobust = values.Text("distance") == "robust",
            RunShare = values.Number("run-share"),
            FlatSd = values.Number("flat-sd"),
            MissingLimit = values.Number("missing-limit"),
        };
        var dimensions = defaults.Dimensions with
        {
            Replicates = (int)values.Integer("replicates")!.Value,
            Percentile = values.Number("percentile"),
            Reference = (values.Text("reference") ?? (values.Text("correlation") == "polychoric" ? "ordinal" : "normal")) switch
            {
                "permutation" => ReferenceKind.Permutation,
                "ordinal" => ReferenceKind.Ordinal,
                _ => ReferenceKind.Normal,
            },
            FactorsRule = values.Text("factors-rule") switch
            {
                "parallel" => FactorsRule.Parallel,
                "map" => FactorsRule.Map,
                "kaiser" => FactorsRule.Kaiser,
                "empirical-kaiser" => FactorsRule.EmpiricalKaiser,
                "comparison-data" => FactorsRule.ComparisonData,
                "combined" => FactorsRule.Combined,
                _ => FactorsRule.ParallelReduced,
            },
            FixedFactors = values.Integer("factors") is ulong k ? (int)k : null,
            MaxDegreeOfParallelism = values.Integer("threads") is ulong t ? (int)t : -1,
        };
        var shortForm = defaults.ShortForm with
        {
            Factoring = defaults.ShortForm.Factoring with
            {
                Extraction = values.Text("extraction") switch
                {
                    "paf" => FactorExtraction.PrincipalAxis,
                    "ml" => FactorExtraction.MaximumLikelihood,
                    _ => FactorExtraction.MinimumResidual,
                },
                Rotation = values.Text("rotation") switch
                {
                    "promax" => FactorRotation.Promax,
                    "varimax" => FactorRotation.Varimax,
                    "none" => FactorRotation.None,
                    _ => FactorRotation.Oblimin,
                },
            },
            ItemsPerFactor = (int)values.Integer("items-per-factor")!.Value,
            ScaleTargets = values["scale-targets"] is IReadOnlyList<KeyValuePair<string, int>> targets
                ? targets.ToDictionary(kv => kv.Key, kv => kv.Value, StringComparer.Ordinal) : null,
            HoldoutFraction = values.Number("holdout"),
        };
        var pipeline = defaults with
        {
            Seed = values.Integer("seed")!.Value,
            Correlation = new CorrelationOptions
            {
                Kind = values.Text("correlation") == "polychoric" ? CorrelationKind.Polychoric : CorrelationKind.Pearson,
                MissingData = values.Text("missing-data") == "listwise" ? MissingDataHandling.Listwise : MissingDataHandling.Pairwise,
            },
            Screening = screening,
            KeepFlagged = values.Flag("keep-flagged"),
            Confirmatory = values.Flag("confirmatory"),
            SelfCheck = defaults.SelfCheck with { Surveys = (int)values.Integer("self-check")!.Value, IsDefault = !values.IsGiven("self-check") },
            Dimensions = dimensions,
            ShortForm = shortForm,
        };
        return new JobSettings
        {
            Responses = responses,
            Codebook = codebook,
            Plan = plan?.Path ?? values.Text("plan"),
            PlanSha256 = plan?.Sha256,
            Out = values.Text("out")!,
            Force = values.Flag("force"),
            Intake = new IntakeOptions(Delimiter(values.Text("delimiter")),
                values.IsGiven("missing") ? (IReadOnlyList<string>)values["missing"]! : null, values.Text("id-column"),
                (int)values.Integer("skip-rows")!.Value),
            Pipeline = pipeline,
            NoPdf = values.Flag("no-pdf"),
            Values = values,
        };
    }

    /// <summary>The terminal settings of <paramref name="values"/>.</summary>
    public static TerminalSettings ToTerminal(SettingValues values) =>
        new(values.Flag("quiet"), values.Flag("progress"), values.Flag("verbose"), values.Flag("json"));

    private static char? Delimiter(string? name) => name switch
    {
        "comma" => ',',
        "semicolon" => ';',
        "tab" => '\t',
        _ => null,
    };

    /// <summary>Checks the settings that need the codebook (before any response is read): every
    /// <c>scale-targets</c> name must be a codebook subscale, and a fixed factor count must be below the number of items.</summary>
    /// <exception cref="SurveyInputException">A target names no subscale of the codebook, or too many factors.</exception>
    public static void CheckAgainstCodebook(JobSettings job, Codebook codebook)
    {
        ArgumentNullException.ThrowIfNull(job);
        ArgumentNullException.ThrowIfNull(codebook);
        if (job.Values.IsGiven("factors") && job.Pipeline.Dimensions.FixedFactors is int k && k >= codebook.Count)
            throw SettingErrors.NotAllowed(job.Values.SourceOf("factors"), InputErrors.Show(k.ToString(System.Globalization.CultureInfo.InvariantCulture)),
                $"a whole number from 1 to {(codebook.Count - 1).ToString(System.Globalization.CultureInfo.InvariantCulture)} (fewer factors than the codebook's {codebook.Count.ToString(System.Globalization.CultureInfo.InvariantCulture)} items)");
        if (job.Pipeline.ShortForm.ScaleTargets is not { } targets || !job.Values.IsGiven("scale-targets")) return;
        var subscales = codebook.Subscales;
        foreach (string name in targets.Keys)
            if (!subscales.Contains(name))
                throw SettingErrors.UnknownSubscale(job.Values.SourceOf("scale-targets"), name, subscales, Path.GetFileName(job.Codebook));
    }
}
