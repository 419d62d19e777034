using ItemReduce.Core.Correlation;
using ItemReduce.Core.Pipeline;
using static ItemReduce.IO.SafeCsvWriter;

namespace ItemReduce.IO.Outputs;

/// <summary>The item correlation matrix the analysis used, as recorded in correlations.csv and summary.json.</summary>
/// <param name="Kind">Coefficient.</param>
/// <param name="MissingData">Missing-data handling.</param>
/// <param name="Matrix">p × p in the analysed items' order (after any smoothing).</param>
/// <param name="Respondents">n the analysis used with it (see <see cref="CorrelationOptions.EffectiveRespondents"/>).</param>
/// <param name="SampleRespondents">Respondents of the sample correlated.</param>
/// <param name="Stage">"factoring" when the factor solutions were fitted to it, "dimensions" when only the dimensions
/// stage ran.</param>
public sealed record CorrelationTableData(CorrelationKind Kind, MissingDataHandling MissingData, double[,] Matrix, int Respondents,
    int SampleRespondents, string Stage);

/// <summary><c>correlations.csv</c>: item × item, first column the item, then one column per item.</summary>
public static class CorrelationTable
{
    /// <summary>File name.</summary>
    public const string FileName = "correlations.csv";

    /// <summary>The matrix of the factor solutions when they were fitted, else that of the dimensions stage; null when
    /// neither ran.</summary>
    public static CorrelationTableData? Of(PipelineResult result)
    {
        ArgumentNullException.ThrowIfNull(result);
        if (result.ShortForm?.Correlation is { } c)
            return new CorrelationTableData(c.Kind, c.MissingData, c.Matrix, c.Respondents, c.SampleRespondents, "factoring");
        if (result.Dimensions is { } d)
            return new CorrelationTableData(d.CorrelationKind, d.MissingData, d.CorrelationMatrix, d.EffectiveRespondents,
                result.Analysed.RespondentCount, "dimensions");
        return null;
    }

    /// <summary>The CSV text (round-trip precision, so that others can refit from it).</summary>
    public static string Write(IReadOnlyList<string> items, CorrelationTableData c)
    {
        ArgumentNullException.ThrowIfNull(items);
        ArgumentNullException.ThrowIfNull(c);
        var w = new SafeCsvWriter(["item", .. items]);
        for (int a = 0; a < items.Count; a++)
        {
            var row = new string[items.Count + 1];
            row[0] = Text(items[a]);
            for (int b = 0; b < items.Count; b++) row[b + 1] = Number(c.Matrix[a, b]);
            w.AppendRow(row);
        }
        return w.ToString();
    }
}
