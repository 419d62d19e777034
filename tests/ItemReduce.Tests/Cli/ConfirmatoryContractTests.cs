using System.Text.Json;
using UglyToad.PdfPig;

namespace ItemReduce.Tests.Cli;

/// <summary>
/// End-to-end contracts of the confirmatory check on a simulated three-factor survey with a holdout: file names and exact
/// columns, analysis and holdout rows, the respondent sample column agreeing with the counts in summary.json, ω from the
/// confirmatory loadings in reliability.csv, and the appendix section with its rules of thumb and source.
/// </summary>
public class ConfirmatoryContractTests : IClassFixture<PipelineContractTests.RunOnce>
{
    private readonly PipelineContractTests.RunOnce _run;
    public ConfirmatoryContractTests(PipelineContractTests.RunOnce run) => _run = run;

    private string[] Lines(string name) => File.ReadAllLines(Path.Combine(_run.Survey.Out, name));
    private JsonElement Summary => JsonDocument.Parse(File.ReadAllText(Path.Combine(_run.Survey.Out, "summary.json"))).RootElement;

    [Fact]
    public void Fit_and_loading_files_have_the_exact_columns_and_both_samples()
    {
        Assert.True(_run.Result.Code == 0, _run.Result.Err);
        var fit = Lines("confirmatory-fit.csv");
        Assert.Equal("form,sample,respondents,estimator,chi2,df,p_value,cfi,tli,rmsea,rmsea_ci_low,rmsea_ci_high,srmr,scaled_chi2,scaling_factor,robust_cfi,robust_tli,robust_rmsea", fit[0]);
        var keys = fit.Skip(1).Select(l => string.Join(',', l.Split(',')[..2])).ToList();
        Assert.Equal(["full,analysis", "full,holdout", "short,analysis", "short,holdout"], keys);
        Assert.Equal("form,sample,item,factor,estimate,se,standardized", Lines("confirmatory-loadings.csv")[0]);
        // Three planted factors: three factor-correlation rows (item empty, factor "A~B") per form and sample.
        var correlationRows = Lines("confirmatory-loadings.csv").Skip(1).Where(l => l.Split(',')[2].Length == 0).ToList();
        Assert.Equal(3 * 4, correlationRows.Count);
        Assert.All(correlationRows, l => Assert.Contains("~", l.Split(',')[3]));
        // The planted model is the codebook's structure, so the fit is good (common practice: CFI above .95).
        Assert.All(fit.Skip(1), l => Assert.True(double.Parse(l.Split(',')[7], System.Globalization.CultureInfo.InvariantCulture) > 0.95, l));
    }

    [Fact]
    public void End_of_run_summary_shows_the_short_form_fit_on_the_holdout_first()
    {
        Assert.True(_run.Result.Code == 0, _run.Result.Err);
        var lines = _run.Result.Out.Split('\n').Select(l => l.Trim()).ToList();
        int at = lines.IndexOf("Confirmatory fit");
        Assert.True(at >= 0, _run.Result.Out);
        Assert.Equal(["form", "sample", "respondents", "CFI", "RMSEA", "SRMR"], lines[at + 1].Split(' ', StringSplitOptions.RemoveEmptyEntries));
        // The first row is the short form on the holdout, with the values of confirmatory-fit.csv rounded to 3 decimals.
        var row = lines[at + 2].Split(' ', StringSplitOptions.RemoveEmptyEntries);
        var csv = Lines("confirmatory-fit.csv").Single(l => l.StartsWith("short,holdout,", StringComparison.Ordinal)).Split(',');
        var ci = System.Globalization.CultureInfo.InvariantCulture;
        string R(string v) => double.Parse(v, ci).ToString("F3", ci);
        Assert.Equal(new[] { "short", "holdout", csv[2], R(csv[7]), R(csv[9]), R(csv[12]) }, row);
        Assert.Contains(lines, l => l.StartsWith("Rules of thumb, not pass/fail tests (Hu & Bentler, 1999)", StringComparison.Ordinal));
    }

    [Fact]
    public void Sample_column_is_last_and_agrees_with_the_holdout_counts()
    {
        var header = Lines("respondent-flags.csv")[0].Split(',');
        Assert.Equal("sample", header[^1]);
        var samples = Lines("respondent-flags.csv").Skip(1).Select(l => l.Split(',')[^1]).ToList();
        Assert.All(samples, s => Assert.Contains(s, new[] { "analysis", "holdout", "set-aside" }));
        var holdout = Summary.GetProperty("shortForm").GetProperty("holdout");
        Assert.Equal(holdout.GetProperty("holdoutRespondents").GetInt32(), samples.Count(s => s == "holdout"));
        Assert.Equal(holdout.GetProperty("selectionRespondents").GetInt32(), samples.Count(s => s == "analysis"));
        var fits = Summary.GetProperty("confirmatory").GetProperty("fits").EnumerateArray().ToList();
        Assert.Equal(4, fits.Count);
    }

    [Fact]
    public void Reliability_gains_omega_from_the_confirmatory_loadings()
    {
        var lines = Lines("reliability.csv");
        // omega_cfa keeps its place (13th column); later columns are appended after it.
        Assert.Equal("omega_cfa", lines[0].Split(',')[12]);
        Assert.All(lines.Skip(1), l => Assert.InRange(double.Parse(l.Split(',')[12], System.Globalization.CultureInfo.InvariantCulture), 0.3, 1.0));
        // omega_h (appended last): one bank-level value on the full-form rows of the fitting sample, empty on the others.
        Assert.Equal("omega_h", lines[0].Split(',')[^1]);
        var omegaH = lines.Skip(1).Select(l => l.Split(',')).Where(c => c[1] == "full").Select(c => c[^1]).Distinct().ToList();
        if (Summary.GetProperty("shortForm").GetProperty("omegaHierarchical").ValueKind == System.Text.Json.JsonValueKind.Null)
            Assert.All(lines.Skip(1), l => Assert.Equal("", l.Split(',')[^1]));
        else
        {
            Assert.Single(omegaH);
            Assert.InRange(double.Parse(omegaH[0], System.Globalization.CultureInfo.InvariantCulture), 0.0, 1.0);
            Assert.All(lines.Skip(1).Select(l => l.Split(',')).Where(c => c[1] != "full"), c => Assert.Equal("", c[^1]));
        }
    }

    [Fact]
    public void Item_descriptives_and_appendix_section()
    {
        Assert.Equal("item,n,mean,sd,skewness,excess_kurtosis,lowest_share,highest_share,missing_share", Lines("item-descriptives.csv")[0]);
        using var pdf = PdfDocument.Open(Path.Combine(_run.Survey.Out, "appendix.pdf"));
        string text = string.Join("\n", pdf.GetPages().Select(p => p.Text));
        Assert.Contains("Confirmatory factor analysis", text);
        Assert.Contains("Fit of the confirmatory models", text);
        Assert.Contains("Hu, L., & Bentler, P. M. (1999)", text);
        Assert.Contains("not pass/fail tests", text);
        Assert.Contains("Item descriptives", text);
    }
}
