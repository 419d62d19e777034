using ItemReduce.Core.Dimensions;
using static ItemReduce.IO.SafeCsvWriter;

namespace ItemReduce.IO.Outputs;

/// <summary>CSV tables of the dimensions stage.</summary>
public static class DimensionTables
{
    private const int Decimals = 6;

    /// <summary>
    /// <c>eigenvalues.csv</c>: component, observed, reference_mean, reference_percentile, retained; then the
    /// reduced-matrix (SMC diagonal) eigenvalue and its references, and the share of variance; then the empirical Kaiser
    /// reference and the comparison-data fit (row c: mean RMSR of a population with c factors and the p-value of
    /// "c factors fit better than c − 1"; empty where that population was not tried).
    /// </summary>
    public static string Eigenvalues(DimensionResult dimensions)
    {
        var w = new SafeCsvWriter(["component", "observed", "reference_mean", "reference_percentile", "retained",
            "share_of_variance", "reduced_observed", "reduced_reference_mean", "reduced_reference_percentile",
            "empirical_kaiser_reference", "comparison_rmsr", "comparison_p_value"]);
        var rows = dimensions.Components;
        int p = dimensions.Eigenvalues.Length;
        var share = dimensions.ProportionOfVariance;
        for (int c = 0; c < p; c++)
        {
            w.AppendRow([Integer(c + 1), Number(dimensions.Eigenvalues[c], Decimals), Number(dimensions.ReferenceMean[c], Decimals),
                Number(dimensions.ReferencePercentile[c], Decimals), Bool(c < dimensions.Retained), Number(share[c], Decimals),
                Number(At(dimensions.ReducedEigenvalues, c), Decimals), Number(At(dimensions.ReducedReferenceMean, c), Decimals),
                Number(At(dimensions.ReducedReferencePercentile, c), Decimals),
                Number(rows[c].EmpiricalKaiserReference, Decimals), Number(rows[c].ComparisonRmsr ?? double.NaN, Decimals),
                Number(rows[c].ComparisonPValue ?? double.NaN, Decimals)]);
        }
        return w.ToString();
    }

    /// <summary><c>map.csv</c>: components removed, average squared partial correlation (1976) and average fourth power (2000).</summary>
    public static string Map(DimensionResult dimensions)
    {
        var w = new SafeCsvWriter(["components_removed", "average_squared_partial", "average_fourth_power_partial"]);
        for (int m = 0; m < dimensions.MapCurve.Length; m++)
            w.AppendRow([Integer(m), Number(dimensions.MapCurve[m]), Number(At(dimensions.MapRevisedCurve, m))]);
        return w.ToString();
    }

    /// <summary><c>item-factorability.csv</c>: item and its measure of sampling adequacy (MSA).</summary>
    public static string Msa(IReadOnlyList<string> items, DimensionResult dimensions)
    {
        var w = new SafeCsvWriter(["item", "msa"]);
        for (int j = 0; j < items.Count; j++) w.AppendRow([Text(items[j]), Number(dimensions.Msa[j], Decimals)]);
        return w.ToString();
    }

    private static double At(double[]? a, int i) => a is not null && i < a.Length ? a[i] : double.NaN;
}
