using System.Text.Json.Nodes;
using ItemReduce.Core.Correlation;
using MathNet.Numerics.LinearAlgebra;

namespace ItemReduce.IO.Jobs;

/// <summary>Runs the pipeline for a job and writes its outputs atomically into the output folder.</summary>
public static class SurveyJob
{
    /// <summary>The whole pipeline; writes summary.json (and more as stages land) into <see cref="JobSettings.Out"/>.</summary>
    public static void Run(JobSettings settings, TextWriter stdout, ProgressLog log)
    {
        OutputStaging.CheckDestination(settings.Out, settings.Force);
        var survey = SurveyLoader.Load(settings, log);
        var prepared = survey.Prepared;
        log.Step("computing correlations and eigenvalues");
        var r = PearsonCorrelation.Compute(prepared.Scored);
        var eig = Matrix<double>.Build.DenseOfArray(r).Evd(Symmetricity.Symmetric).EigenValues.Select(c => c.Real).OrderDescending().ToArray();

        var summary = new JsonObject
        {
            ["tool"] = new JsonObject { ["name"] = "itemreduce", ["version"] = Version },
            ["inputs"] = new JsonObject
            {
                ["responses"] = Path.GetFileName(settings.Responses),
                ["responsesSha256"] = survey.ResponsesSha256,
                ["codebook"] = Path.GetFileName(settings.Codebook),
                ["codebookSha256"] = survey.CodebookSha256,
            },
            ["seed"] = settings.Seed,
            ["respondents"] = new JsonObject
            {
                ["total"] = prepared.Raw.RespondentCount,
                ["flagged"] = 0,
                ["analysed"] = prepared.Scored.RespondentCount,
            },
            ["items"] = new JsonObject
            {
                ["total"] = prepared.Raw.ItemCount,
                ["analysed"] = prepared.Scored.ItemCount,
                ["reverseKeyed"] = JsonOut.Strs(prepared.Raw.Items.Where(i => i.Reverse).Select(i => i.Name)),
            },
            ["excludedItems"] = new JsonArray(prepared.ExcludedItems.Select(e => (JsonNode?)new JsonObject
            {
                ["item"] = e.Item,
                ["reason"] = e.Reason == Core.Data.ItemExclusionReason.AllMissing ? "all-missing" : "zero-variance",
                ["detail"] = e.Detail,
            }).ToArray()),
            ["missingShare"] = JsonOut.Num(prepared.RawSummary.MissingShare),
            ["factors"] = new JsonObject { ["retained"] = null },
            ["eigenvalues"] = JsonOut.Nums(eig),
            ["warnings"] = JsonOut.Strs(prepared.Warnings),
        };

        using var staging = OutputStaging.Begin(settings.Out, settings.Force);
        staging.WriteText("summary.json", JsonOut.Serialize(summary));
        staging.Commit();
        stdout.WriteLine($"Results written to {Path.GetFullPath(settings.Out)}");
        stdout.WriteLine(Path.Combine(Path.GetFullPath(settings.Out), "summary.json"));
    }

    /// <summary>Tool version (assembly informational version without build metadata).</summary>
    public static string Version =>
        (typeof(SurveyJob).Assembly.GetCustomAttributes(typeof(System.Reflection.AssemblyInformationalVersionAttribute), false)
            .OfType<System.Reflection.AssemblyInformationalVersionAttribute>().FirstOrDefault()?.InformationalVersion ?? "0.0.0").Split('+')[0];
}
