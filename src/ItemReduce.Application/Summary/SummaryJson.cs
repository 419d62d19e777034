using System.Text.Json.Nodes;
using ItemReduce.Application.Jobs;
using ItemReduce.Application.Settings;
using ItemReduce.Core.Data;
using ItemReduce.Core.Dimensions;
using ItemReduce.Core.Factoring;
using ItemReduce.Core.Pipeline;
using ItemReduce.Core.Screening;
using ItemReduce.Core.ShortForm;
using ItemReduce.IO.Outputs;
using static ItemReduce.IO.JsonOut;

namespace ItemReduce.Application.Summary;

/// <summary>Builds <c>summary.json</c>: every count, decision and rule of the run, in a fixed key order.</summary>
internal static class SummaryJson
{
    public static JsonObject Build(JobSettings settings, LoadedSurvey survey, PipelineResult result)
    {
        var prepared = result.Prepared;
        var rows = SettingsRecord.Rows(settings);
        var root = new JsonObject
        {
            ["tool"] = new JsonObject { ["name"] = "itemreduce", ["version"] = SurveyJob.Version },
            ["scope"] = result.Settings.Scope.ToString().ToLowerInvariant(),
            ["inputs"] = new JsonObject
            {
                ["responses"] = Path.GetFileName(settings.Responses),
                ["responsesSha256"] = survey.ResponsesSha256,
                ["codebook"] = Path.GetFileName(settings.Codebook),
                ["codebookSha256"] = survey.CodebookSha256,
                ["idColumn"] = survey.Intake.IdColumn,
                ["missingCodes"] = Strs(settings.Intake.EffectiveMissingCodes),
                ["plan"] = settings.Plan is null ? null : Path.GetFileName(settings.Plan),
                ["planSha256"] = settings.PlanSha256,
            },
            ["options"] = new JsonObject(rows.Select(x => KeyValuePair.Create(x.Setting.Name, SettingsRecord.Json(x.Value)))),
            ["optionsGiven"] = new JsonObject(rows.Where(x => x.Source != "default").Select(x => KeyValuePair.Create(x.Setting.Name, (JsonNode?)x.Source))),
            ["seed"] = settings.Seed,
            ["respondents"] = Respondents(result),
            ["items"] = new JsonObject
            {
                ["total"] = prepared.Raw.ItemCount,
                ["analysed"] = result.Analysed.ItemCount,
                ["reverseKeyed"] = Strs(prepared.Raw.Items.Where(i => i.Reverse).Select(i => i.Name)),
            },
            ["excludedItems"] = new JsonArray(prepared.ExcludedItems.Concat(result.ExcludedAfterScreening).Select(Excluded).ToArray()),
            ["missingShare"] = Num(prepared.RawSummary.MissingShare),
        };
        if (result.Screening is { } s) root["screening"] = Screening(s);
        root["factors"] = Factors(result);
        if (CorrelationTable.Of(result) is { } used)
        {
            root["correlation"] = new JsonObject
            {
                ["kind"] = used.Kind.ToString().ToLowerInvariant(),
                ["missingData"] = used.MissingData.ToString().ToLowerInvariant(),
                ["n"] = used.Respondents,
                ["sampleRespondents"] = used.SampleRespondents,
                ["stage"] = used.Stage,
                ["file"] = CorrelationTable.FileName,
                ["smoothed"] = result.Dimensions?.SmoothingApplied,
                ["smoothingMaxChange"] = result.Dimensions is { } dd ? Num(dd.Smoothing.MaxAbsoluteChange) : null,
            };
        }
        if (result.Dimensions is { } d)
        {
            root["effectiveRespondents"] = d.EffectiveRespondents;
            root["eigenvalues"] = Nums(d.Eigenvalues);
            root["parallelThresholds"] = Nums(d.ReferencePercentile);
            root["parallelMeans"] = Nums(d.ReferenceMean);
            root["parallelAnalysis"] = new JsonObject
            {
                ["reference"] = d.Reference.Kind.ToString().ToLowerInvariant(),
                ["replicates"] = d.Reference.Replicates,
                ["percentile"] = Num(d.Reference.PercentileLevel),
            };
            if (d.Reference.PermutedRespondents is int permuted)
            {
                root["parallelAnalysis"]!["permutedRespondents"] = permuted;
                root["parallelAnalysis"]!["subsampled"] = d.Reference.Subsampled;
            }
            root["kmo"] = Num(d.Kmo);
            root["msa"] = new JsonObject(result.Analysed.Items.Select((it, j) => KeyValuePair.Create(it.Name, Num(d.Msa[j]))));
            root["bartlett"] = new JsonObject { ["chi2"] = Num(d.Bartlett.ChiSquare), ["df"] = d.Bartlett.DegreesOfFreedom, ["p"] = Num(d.Bartlett.P) };
        }
        if (result.ShortForm is { } sf) AddShortForm(root, result, sf);
        if (result.Confirmatory is { } cfa) root["confirmatory"] = Confirmatory(cfa);
        if (result.SelfCheck is { } check) root["selfCheck"] = SelfCheckTables.Json(check);
        root["warnings"] = new JsonArray(RunWarnings.Of(result).Select(w => (JsonNode?)new JsonObject
        {
            ["code"] = w.Code,
            ["stage"] = w.Stage,
            ["message"] = w.Message,
            ["option"] = WarningSettings.OptionFor(w),
        }).ToArray());
        return root;
    }

    private static JsonObject Respondents(PipelineResult r)
    {
        var o = new JsonObject
        {
            ["total"] = r.Prepared.Raw.RespondentCount,
            ["flagged"] = r.Screening?.FlaggedRespondents ?? 0,
            ["analysed"] = r.Analysed.RespondentCount,
            ["keptFlagged"] = r.Settings.KeepFlagged,
        };
        if (r.Screening is { } s)
            o["reasons"] = new JsonObject(s.ReasonCounts.Select(c => KeyValuePair.Create(c.Code, (JsonNode?)c.Count)));
        return o;
    }

    private static JsonNode Excluded(ExcludedItem e) => new JsonObject
    {
        ["item"] = e.Item,
        ["reason"] = e.Reason == ItemExclusionReason.AllMissing ? "all-missing" : "zero-variance",
        ["detail"] = e.Detail,
    };

    private static JsonObject Screening(ScreeningResult s) => new()
    {
        ["distance"] = s.Options.UseRobust ? "robust" : "classical",
        ["cutoffP"] = Num(s.Options.CutoffP),
        ["rule"] = s.DistanceRule,
        ["ruleDescription"] = s.RuleDescription,
        ["reasonMeanings"] = new JsonObject(s.ReasonCounts.Select(c => KeyValuePair.Create(c.Code, (JsonNode?)c.Meaning))),
        ["robustEstimator"] = new JsonObject
        {
            ["available"] = s.Robust.Available,
            ["completeRows"] = s.Robust.CompleteRows,
            ["subsampled"] = s.Robust.Subsampled,
            ["rowsUsed"] = s.Robust.RowsUsed,
            ["supportSize"] = s.Robust.SupportSize,
            ["consistencyFactor"] = Num(s.Robust.ConsistencyFactor),
            ["reweightingFactor"] = Num(s.Robust.ReweightingFactor),
            ["nestedExtension"] = s.Robust.NestedExtension,
            ["converged"] = s.Robust.Converged,
            ["note"] = s.Robust.Note,
            ["method"] = s.Robust.Method,
            ["stagedCollapsed"] = s.Robust.StagedCollapsed,
            ["iterations"] = s.Robust.Iterations,
        },
        ["smallSampleFallback"] = s.SmallSampleFallback,
        ["repeatedRunLimit"] = s.RepeatedRunLimit,
        ["alternatingRunLimit"] = s.AlternatingRunLimit,
        ["randomAnswering"] = new JsonObject
        {
            ["computed"] = !double.IsNaN(s.RandomAnsweringCutoff),
            ["cutoff"] = Num(s.RandomAnsweringCutoff),
            ["flags"] = s.RandomAnsweringFlags,
        },
    };

    private static JsonObject Factors(PipelineResult r)
    {
        var o = new JsonObject { ["retained"] = r.FactorsUsed ?? r.Dimensions?.Retained };
        if (r.Dimensions is { } d)
        {
            o["byRule"] = new JsonObject
            {
                ["parallel"] = d.ByRule.Parallel,
                ["parallelReduced"] = d.ByRule.ParallelReduced,
                ["map"] = d.ByRule.Map,
                ["mapRevised"] = d.ByRule.MapRevised,
                ["kaiser"] = d.ByRule.Kaiser,
                ["parallelMean"] = d.ByRule.ParallelMean,
                ["parallelReducedMean"] = d.ByRule.ParallelReducedMean,
                ["empiricalKaiser"] = d.ByRule.EmpiricalKaiser,
                ["comparisonData"] = d.ByRule.ComparisonData,
                ["hull"] = d.ByRule.Hull,
                ["combined"] = d.ByRule.Combined,
            };
            o["indicated"] = d.Retained;
            o["rule"] = RuleName(d.RuleUsed);
            o["reason"] = d.Reason;
        }
        else if (r.Settings.Dimensions.FixedFactors is int k)
        {
            o["rule"] = "fixed";
            o["reason"] = $"The number of factors was set to {k} in the settings.";
        }
        return o;
    }

    internal static string RuleName(FactorsRule rule) => Settings.SettingsCatalog.RuleName(rule);

    private static void AddShortForm(JsonObject root, PipelineResult r, ShortFormResult sf)
    {
        var s = sf.FullSolution;
        root["extraction"] = ExtractionName(s.Extraction);
        root["rotation"] = s.Rotation.ToString().ToLowerInvariant();
        root["solution"] = new JsonObject
        {
            ["factors"] = s.Pattern.GetLength(1),
            ["factorLabels"] = Strs(s.FactorLabels),
            ["converged"] = s.Converged,
            ["iterations"] = s.Iterations,
            ["varianceExplained"] = Nums(s.VarianceExplained),
            ["heywoodItems"] = Strs(s.HeywoodItems.Select(j => r.Analysed.Items[j].Name)),
        };
        root["fit"] = s.Fit is { } f
            ? new JsonObject { ["chi2"] = Num(f.ChiSquare), ["df"] = f.Df, ["p"] = Num(f.P), ["rmsea"] = Num(f.Rmsea), ["tli"] = Num(f.Tli) }
            : null;
        root["shortForm"] = new JsonObject
        {
            ["items"] = Strs(sf.SelectedIndices.Order().Select(j => r.Analysed.Items[j].Name)),
            ["scales"] = new JsonArray(sf.Scales.Select(sc => (JsonNode?)new JsonObject
            {
                ["scale"] = sc.Scale,
                ["factor"] = $"F{sc.HomeFactor + 1}",
                ["target"] = sc.Target,
                ["items"] = Strs(sc.SelectedItems),
            }).ToArray()),
            ["holdout"] = new JsonObject
            {
                ["fraction"] = Num(r.Settings.ShortForm.HoldoutFraction),
                ["selectionRespondents"] = sf.SelectionRespondents,
                ["holdoutRespondents"] = sf.HoldoutRespondents,
            },
            ["reliability"] = new JsonArray(sf.Reliability.Select(x => (JsonNode?)new JsonObject
            {
                ["scale"] = x.Scale,
                ["form"] = x.FormLabel,
                ["items"] = x.Items,
                ["respondents"] = x.Respondents,
                ["alpha"] = Num(x.Alpha),
                ["alphaCi"] = Nums([x.AlphaCiLow, x.AlphaCiHigh]),
                ["omega"] = Num(x.Omega),
                ["shortFullR"] = Num(x.ShortFullCorrelation),
            }).ToArray()),
            ["caution"] = ShortFormBuilder.ValidationCaution,
            ["omegaHierarchical"] = sf.OmegaHierarchical is { } h
                ? new JsonObject
                {
                    ["omegaH"] = Num(h.OmegaH),
                    ["secondOrderLoadings"] = Nums(h.SecondOrderLoadings),
                    ["totalVariance"] = Num(h.TotalVariance),
                }
                : null,
        };
    }

    /// <summary>The <c>confirmatory</c> block: one entry per form and sample with estimator, respondents, convergence, the
    /// fit statistics of confirmatory-fit.csv and the composite reliability per scale.</summary>
    private static JsonObject Confirmatory(Core.Confirmatory.ConfirmatoryCheckResult c) => new()
    {
        ["missingData"] = c.Listwise ? "listwise" : "casewise",
        ["fits"] = new JsonArray(c.Fits.Select(f => (JsonNode?)new JsonObject
        {
            ["form"] = ConfirmatoryTables.FormName(f.Form),
            ["sample"] = ConfirmatoryTables.SampleName(f.Sample),
            ["fitted"] = f.Result is not null,
            ["estimator"] = f.Result is { } r0 ? ConfirmatoryTables.EstimatorName(r0.Estimator) : null,
            ["respondents"] = f.Result?.Respondents,
            ["converged"] = f.Result?.Converged,
            ["iterations"] = f.Result?.Iterations,
            ["statistics"] = f.Result is { Fit: var x } ? new JsonObject
            {
                ["chi2"] = Num(x.Chi2),
                ["df"] = x.Df,
                ["p"] = Num(x.PValue),
                ["cfi"] = Num(x.Cfi),
                ["tli"] = Num(x.Tli),
                ["rmsea"] = Num(x.Rmsea),
                ["rmseaCi90"] = Nums([x.RmseaLow, x.RmseaHigh]),
                ["srmr"] = Num(x.Srmr),
                ["scaledChi2"] = Num(x.ScaledChi2),
                ["scalingFactor"] = Num(x.ScalingFactor),
                ["robustCfi"] = Num(x.RobustCfi),
                ["robustTli"] = Num(x.RobustTli),
                ["robustRmsea"] = Num(x.RobustRmsea),
                ["independenceChi2"] = Num(x.IndependenceChi2),
                ["independenceDf"] = x.IndependenceDf,
                ["robustRespondents"] = x.RobustRespondents,
            } : null,
            ["compositeReliability"] = f.Result is { } r1
                ? new JsonObject(r1.Factors.Select((name, k) => KeyValuePair.Create(name, Num(r1.CompositeReliability[k])))) : null,
        }).ToArray()),
        ["files"] = Strs(["confirmatory-fit.csv", "confirmatory-loadings.csv"]),
    };

    internal static string ExtractionName(FactorExtraction e) => Settings.SettingsCatalog.ExtractionName(e);
}
