using System.Globalization;
using ItemReduce.Core.Data;
using ItemReduce.Core.Dimensions;
using ItemReduce.Core.Screening;
using ItemReduce.Core.ShortForm;

namespace ItemReduce.Core.Pipeline;

/// <summary>
/// Runs the stages in order: screening → (set aside flagged respondents) → dimensions → factoring,
/// reliability and short form. Pure computation; progress goes to an optional callback.
/// </summary>
public static class SurveyPipeline
{
    /// <summary>Runs the stages selected by <see cref="PipelineSettings.Scope"/>.</summary>
    /// <param name="prepared">The prepared data.</param>
    /// <param name="settings">Stages and options.</param>
    /// <param name="progress">Optional callback told when each step starts.</param>
    /// <param name="screened">Optional callback given the screening result as soon as it exists (before the later stages
    /// run), e.g. so that the caller can write the respondent table while the analysis goes on.</param>
    /// <exception cref="AnalysisStoppedException">A stage cannot run on these data.</exception>
    public static PipelineResult Run(PreparedData prepared, PipelineSettings settings, Action<string>? progress = null,
        Action<ScreeningResult>? screened = null)
    {
        ArgumentNullException.ThrowIfNull(prepared);
        ArgumentNullException.ThrowIfNull(settings);
        var warnings = new WarningList("pipeline");
        var stage = settings.StageOptions();
        var ci = CultureInfo.InvariantCulture;

        ScreeningResult? screening = null;
        var analysed = prepared.Scored;
        IReadOnlyList<ExcludedItem> lateExcluded = [];
        if (settings.Scope is PipelineScope.Screen or PipelineScope.All)
        {
            progress?.Invoke($"screening {prepared.Scored.RespondentCount} respondents");
            screening = Stage("screening", () => RespondentScreening.Run(prepared.Scored, stage.Screening, prepared.AsAnswered, progress));
            screened?.Invoke(screening);
            if (settings.Scope == PipelineScope.All)
            {
                var keep = screening.RespondentsToAnalyse(stage.KeepFlagged);
                if (keep.Count < prepared.Scored.RespondentCount) analysed = prepared.Scored.SelectRespondents(keep);
                if (!stage.KeepFlagged && screening.FlaggedRespondents > 0)
                    warnings.Add(new AnalysisWarning("flagged-set-aside", "screening", string.Create(ci, $"{screening.FlaggedRespondents} flagged respondent(s) were set aside for the later stages; {analysed.RespondentCount} were analysed. Review the flags: they are prompts for human judgement, not proof of careless answering.")));
                var (kept, excluded) = ItemScreen.Find(analysed);
                if (excluded.Count > 0)
                {
                    lateExcluded = excluded;
                    foreach (var e in excluded) warnings.Add(new AnalysisWarning("item-left-out", "screening", $"Item {e.Item} was left out after screening: among the retained respondents {e.Detail}."));
                    analysed = analysed.SelectItems(kept);
                }
                int need = PreparedData.MinimumRespondents(analysed.ItemCount);
                if (analysed.RespondentCount < need)
                    throw new AnalysisStoppedException("dimensions", string.Create(ci,
                        $"only {analysed.RespondentCount} respondents remain after screening but {analysed.ItemCount} items need at least {need}"), null,
                        AnalysisStoppedException.TooFewAfterScreening);
            }
        }
        if (settings.Scope == PipelineScope.Screen)
            return new PipelineResult { Prepared = prepared, Settings = settings, Screening = screening, Analysed = analysed, Warnings = warnings };

        DimensionResult? dims = null;
        var dimOptions = stage.Dimensions;
        if (settings.Scope != PipelineScope.Shorten || dimOptions.FixedFactors is null)
        {
            progress?.Invoke($"dimensions: correlations, eigenvalues and parallel analysis ({dimOptions.Replicates} replicates)");
            dims = Stage("dimensions", () => DimensionAnalysis.Run(analysed, dimOptions, progress));
        }
        if (settings.Scope == PipelineScope.Dimensions)
            return new PipelineResult { Prepared = prepared, Settings = settings, Screening = screening, Analysed = analysed, ExcludedAfterScreening = lateExcluded, Dimensions = dims, Warnings = warnings };

        int k = dimOptions.FixedFactors ?? dims!.Retained;
        if (k < 1)
        {
            warnings.Add(new AnalysisWarning("no-dimension", "factoring", "No dimension stood out from random data; one factor was extracted so that items can still be judged. Treat the short form with particular caution."));
            k = 1;
        }
        int maxK = Math.Max(1, analysed.ItemCount / 3);
        if (k > maxK)
        {
            warnings.Add(new AnalysisWarning("factors-capped", "factoring", string.Create(ci, $"{k} factors were indicated but {analysed.ItemCount} items support at most {maxK} with three items each; {maxK} were extracted.")));
            k = maxK;
        }
        progress?.Invoke(string.Create(ci, $"factoring {analysed.ItemCount} items into {k} factor(s) and building the short form"));
        var shortForm = Stage("factoring", () => ShortFormBuilder.Build(analysed, k, stage.ShortForm, progress,
            dims is not null && stage.ShortForm.HoldoutFraction == 0 ? dims.CorrelationMatrix : null));
        Confirmatory.ConfirmatoryCheckResult? confirmatory = null;
        if (stage.Confirmatory)
        {
            progress?.Invoke("confirmatory factor analysis of the full and short forms");
            confirmatory = Confirm(analysed, shortForm, stage.ShortForm.Correlation.MissingData == Correlation.MissingDataHandling.Listwise,
                dimOptions.MaxDegreeOfParallelism, warnings);
        }
        var result = new PipelineResult
        {
            Prepared = prepared,
            Settings = settings,
            Screening = screening,
            Analysed = analysed,
            ExcludedAfterScreening = lateExcluded,
            Dimensions = dims,
            FactorsUsed = k,
            ShortForm = shortForm,
            Confirmatory = confirmatory,
            Warnings = warnings,
        };
        if (settings.Scope != PipelineScope.All || settings.SelfCheck.Surveys == 0) return result;
        long cells = (long)prepared.Scored.RespondentCount * analysed.ItemCount;
        if (settings.SelfCheck.IsDefault && cells > SelfCheck.SelfCheckOptions.MaxDefaultCells)
        {
            warnings.Add(new AnalysisWarning("self-check-skipped", "self-check", string.Create(ci,
                $"The self-check was skipped: with {prepared.Scored.RespondentCount} respondents × {analysed.ItemCount} items (more than {SelfCheck.SelfCheckOptions.MaxDefaultCells:N0} answers) each simulated survey costs about as much as the whole analysis. Set the number of simulated surveys explicitly to run it."),
                nameof(SelfCheck.SelfCheckOptions.Surveys)));
            return result;
        }
        progress?.Invoke(string.Create(ci, $"self-check: analysing {settings.SelfCheck.Surveys} simulated surveys that match this one"));
        try
        {
            return result with { SelfCheck = SelfCheck.DesignSelfCheck.Run(result, settings, progress) };
        }
        catch (DataConditionException e)
        {
            // The fitted model could not be simulated (e.g. a factor correlation matrix that is not positive definite).
            warnings.Add(new AnalysisWarning("self-check-not-run", "self-check", "The self-check could not simulate surveys from the fitted model: " + e.Message));
            return result;
        }
    }

    /// <summary>The confirmatory check never stops a run: a failure becomes a warning and no confirmatory result.</summary>
    private static Confirmatory.ConfirmatoryCheckResult? Confirm(ResponseMatrix analysed, ShortFormResult shortForm, bool listwise,
        int maxDegreeOfParallelism, WarningList warnings)
    {
        try
        {
            return Confirmatory.ConfirmatoryCheck.Run(analysed, shortForm, listwise, maxDegreeOfParallelism);
        }
        catch (Exception e) when (e is DataConditionException or LinearAlgebra.MatrixNotPositiveDefiniteException or LinearAlgebra.NonConvergenceException)
        {
            warnings.Add(new AnalysisWarning("confirmatory-not-fitted", "confirmatory", "The confirmatory factor analysis could not be run: " + e.Message));
            return null;
        }
    }

    private static T Stage<T>(string name, Func<T> run)
    {
        try
        {
            return run();
        }
        catch (DataConditionException e)
        {
            throw new AnalysisStoppedException(name, e.Message, e);
        }
        catch (Exception e) when (e is Factoring.FactorNonConvergenceException or LinearAlgebra.NonConvergenceException
                                       or LinearAlgebra.MatrixNotPositiveDefiniteException)
        {
            // Data-driven numerical failures (an iteration cap, a singular matrix): a property of these data.
            throw new AnalysisStoppedException(name, e.Message, e);
        }
    }
}
