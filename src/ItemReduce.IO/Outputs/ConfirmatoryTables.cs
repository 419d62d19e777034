using ItemReduce.Core.Confirmatory;
using ItemReduce.Core.Data;
using ItemReduce.Core.ShortForm;
using static ItemReduce.IO.SafeCsvWriter;

namespace ItemReduce.IO.Outputs;

/// <summary>CSV tables of the confirmatory check and the item descriptives.</summary>
public static class ConfirmatoryTables
{
    private const int Decimals = 6;

    /// <summary>"full" / "short".</summary>
    public static string FormName(ScaleForm f) => f == ScaleForm.Full ? "full" : "short";

    /// <summary>"analysis" / "holdout".</summary>
    public static string SampleName(ConfirmatorySample s) => s == ConfirmatorySample.Analysis ? "analysis" : "holdout";

    /// <summary>"ML" / "FIML" (listwise deletion is ML on the complete rows).</summary>
    public static string EstimatorName(ConfirmatoryEstimator e) => e == ConfirmatoryEstimator.MaximumLikelihood ? "ML" : "FIML";

    /// <summary><c>confirmatory-fit.csv</c>: one row per fitted form and sample.</summary>
    public static string Fit(ConfirmatoryCheckResult check)
    {
        var w = new SafeCsvWriter(["form", "sample", "respondents", "estimator", "chi2", "df", "p_value", "cfi", "tli", "rmsea", "rmsea_ci_low",
            "rmsea_ci_high", "srmr", "scaled_chi2", "scaling_factor", "robust_cfi", "robust_tli", "robust_rmsea"]);
        foreach (var fit in check.Fits)
        {
            if (fit.Result is not { } r) continue;
            var f = r.Fit;
            w.AppendRow([FormName(fit.Form), SampleName(fit.Sample), Integer(r.Respondents), EstimatorName(r.Estimator), Number(f.Chi2, Decimals),
                Integer(f.Df), Number(f.PValue, Decimals), Number(f.Cfi, Decimals), Number(f.Tli, Decimals), Number(f.Rmsea, Decimals),
                Number(f.RmseaLow, Decimals), Number(f.RmseaHigh, Decimals), Number(f.Srmr, Decimals), Number(f.ScaledChi2, Decimals),
                Number(f.ScalingFactor, Decimals), Number(f.RobustCfi, Decimals), Number(f.RobustTli, Decimals), Number(f.RobustRmsea, Decimals)]);
        }
        return w.ToString();
    }

    /// <summary><c>confirmatory-loadings.csv</c>: loadings (item set) then factor correlations (item empty, factor "A~B").</summary>
    public static string Loadings(ConfirmatoryCheckResult check)
    {
        var w = new SafeCsvWriter(["form", "sample", "item", "factor", "estimate", "se", "standardized"]);
        foreach (var fit in check.Fits)
        {
            if (fit.Result is not { } r) continue;
            foreach (var e in r.Estimates)
                w.AppendRow([FormName(fit.Form), SampleName(fit.Sample), Text(e.Item), Text(e.Factor), Number(e.Estimate, Decimals),
                    Number(e.StandardError, Decimals), Number(e.Standardized, Decimals)]);
        }
        return w.ToString();
    }

    /// <summary>Composite reliability of <paramref name="scale"/> from the fit of the given form and reliability sample; NaN when
    /// there is none.</summary>
    public static double CompositeReliability(ConfirmatoryCheckResult? check, string scale, ScaleForm form, SampleRole role)
    {
        var sample = role == SampleRole.Holdout ? ConfirmatorySample.Holdout : ConfirmatorySample.Analysis;
        var r = check?.Fits.FirstOrDefault(f => f.Form == form && f.Sample == sample)?.Result;
        if (r is null) return double.NaN;
        int k = r.Factors.ToList().IndexOf(scale);
        return k < 0 ? double.NaN : r.CompositeReliability[k];
    }

    /// <summary><c>item-descriptives.csv</c>: item, n, mean, sd, skewness, excess_kurtosis, lowest_share, highest_share, missing_share.</summary>
    public static string ItemDescriptivesTable(IReadOnlyList<ItemDescriptive> rows)
    {
        var w = new SafeCsvWriter(["item", "n", "mean", "sd", "skewness", "excess_kurtosis", "lowest_share", "highest_share", "missing_share"]);
        foreach (var d in rows)
            w.AppendRow([Text(d.Item), Integer(d.Respondents), Number(d.Mean, Decimals), Number(d.StandardDeviation, Decimals), Number(d.Skewness, Decimals),
                Number(d.ExcessKurtosis, Decimals), Number(d.LowestShare, Decimals), Number(d.HighestShare, Decimals), Number(d.MissingShare, Decimals)]);
        return w.ToString();
    }
}
