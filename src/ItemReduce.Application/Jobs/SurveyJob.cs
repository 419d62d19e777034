using ItemReduce.Application.Summary;
using ItemReduce.Core.Pipeline;
using ItemReduce.IO;
using ItemReduce.IO.Outputs;

namespace ItemReduce.Application.Jobs;

/// <summary>What a finished job produced: the pipeline result, the summary.json model, the results folder (full path)
/// and the names of the files written there.</summary>
public sealed record JobOutcome(PipelineResult Result, System.Text.Json.Nodes.JsonObject Summary, string OutDir, IReadOnlyList<string> Files);

/// <summary>Runs the pipeline for a job and writes its outputs atomically into the output folder.</summary>
public static class SurveyJob
{
    /// <summary>Loads the data, runs the stages of <paramref name="scope"/> and writes their outputs into <see cref="JobSettings.Out"/>.
    /// Prints nothing on stdout; the caller shows the outcome (<see cref="RunSummary"/>).</summary>
    public static JobOutcome Run(JobSettings settings, PipelineScope scope, ProgressLog log)
    {
        string?[] inputs = [settings.Responses, settings.Codebook, settings.Plan];
        OutputStaging.CheckDestination(settings.Out, settings.Force, inputs);
        var survey = SurveyLoader.Load(settings, log);
        var pipelineSettings = settings.Pipeline with { Seed = settings.Seed, Scope = scope };
        var files = new List<string> { ResultsManifest.FileName };
        using var staging = OutputStaging.Begin(settings.Out, settings.Force, inputs);
        // The respondent table (one row per respondent, the largest output) is written while the later stages run.
        Task? flags = null;
        PipelineResult result;
        try
        {
            result = SurveyPipeline.Run(survey.Prepared, pipelineSettings, log.Step, screening => flags = Task.Run(() =>
            {
                log.Step("writing respondent-flags.csv");
                staging.WriteStream("respondent-flags.csv", stream => ScreeningTables.WriteRespondentFlags(screening, stream,
                    RespondentSamples.Labels(screening, pipelineSettings)));
            }));
        }
        catch (AnalysisStoppedException e)
        {
            WaitQuietly(flags);
            string fix = e.Code == AnalysisStoppedException.TooFewAfterScreening
                ? "keep the flagged respondents (--keep-flagged) or flag fewer (a smaller --cutoff-p), after reviewing the flags"
                : "check the data with 'itemreduce check', or adjust the options of that stage (see --help)";
            throw new SurveyInputException($"{Path.GetFileName(settings.Responses)}: {e.Message.TrimEnd('.')}. Fix: {fix}.");
        }
        catch
        {
            WaitQuietly(flags);
            throw;
        }

        void Write(string name, string text)
        {
            staging.WriteText(name, text);
            files.Add(name);
        }
        if (result.Screening is { } s)
        {
            files.Add("respondent-flags.csv");
            Write("centre-share-by-items.csv", ScreeningTables.CentreShareByItems(s));
        }
        log.Step("writing tables and summary");
        if (result.Dimensions is { } d)
        {
            Write("eigenvalues.csv", DimensionTables.Eigenvalues(d));
            Write("map.csv", DimensionTables.Map(d));
            Write("item-factorability.csv", DimensionTables.Msa(result.Analysed.Items.Select(i => i.Name).ToList(), d));
        }
        if (CorrelationTable.Of(result) is { } corr)
            Write(CorrelationTable.FileName, CorrelationTable.Write(result.Analysed.Items.Select(i => i.Name).ToList(), corr));
        if (result.ShortForm is { } sf)
        {
            var items = result.Analysed.Items;
            Write("loadings.csv", ShortFormTables.Loadings(items, sf));
            if (ShortFormTables.IsOblique(sf.FullSolution))
            {
                Write("structure-loadings.csv", ShortFormTables.StructureLoadings(items, sf.FullSolution));
                Write("factor-correlations.csv", ShortFormTables.FactorCorrelations(sf.FullSolution));
            }
            Write("item-decisions.csv", ShortFormTables.ItemDecisions(sf));
            Write("reliability.csv", ShortFormTables.Reliability(sf, result.Confirmatory));
            Write("short-form-codebook.csv", ShortFormTables.ShortFormCodebook(items, sf));
        }
        if (result.Confirmatory is { } cfa)
        {
            Write("confirmatory-fit.csv", ConfirmatoryTables.Fit(cfa));
            Write("confirmatory-loadings.csv", ConfirmatoryTables.Loadings(cfa));
        }
        if (result.SelfCheck is { } check) Write(SelfCheckTables.FileName, SelfCheckTables.Csv(check));
        // One pass over the data for the table and the appendix section alike.
        var descriptives = result.Dimensions is not null || result.ShortForm is not null
            ? Core.Data.ItemDescriptives.Compute(result.Analysed) : null;
        if (descriptives is not null) Write("item-descriptives.csv", ConfirmatoryTables.ItemDescriptivesTable(descriptives));
        var summary = SummaryJson.Build(settings, survey, result);
        Write("summary.json", JsonOut.Serialize(summary));
        if (scope == PipelineScope.All)
        {
            var doc = Appendix.AppendixBuilder.Build(settings, survey, result, descriptives);
            Write("tables.md", Report.Export.MarkdownTablesWriter.Write(doc));
            Write("tables.tex", Report.Export.LatexTablesWriter.Write(doc));
            staging.WriteStream("tables.docx", stream => Report.Export.DocxTablesWriter.Write(doc, stream));
            files.Add("tables.docx");
            if (!settings.NoPdf)
            {
                log.Step("drawing the appendix");
                staging.WriteStream("appendix.pdf", stream => Report.Pdf.PdfAppendixWriter.Write(doc, stream));
                files.Add("appendix.pdf");
            }
        }
        flags?.GetAwaiter().GetResult();
        staging.Commit();

        return new JobOutcome(result, summary, Path.GetFullPath(settings.Out), files.Order(StringComparer.Ordinal).ToList());
    }

    /// <summary>Waits for a background write before the staging folder is removed; its own error is superseded by the one
    /// being reported.</summary>
    private static void WaitQuietly(Task? task)
    {
        try { task?.Wait(); }
        catch (AggregateException) { }
    }

    /// <summary>Tool version (assembly informational version without build metadata).</summary>
    public static string Version =>
        (typeof(SurveyJob).Assembly.GetCustomAttributes(typeof(System.Reflection.AssemblyInformationalVersionAttribute), false)
            .OfType<System.Reflection.AssemblyInformationalVersionAttribute>().FirstOrDefault()?.InformationalVersion ?? "0.0.0").Split('+')[0];
}
