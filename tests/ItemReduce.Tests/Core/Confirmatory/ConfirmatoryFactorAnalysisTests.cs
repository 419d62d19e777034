using System.Globalization;
using ItemReduce.Core;
using ItemReduce.Core.Confirmatory;
using ItemReduce.Core.Data;
using ItemReduce.Tests.Support;

namespace ItemReduce.Tests.Core.Confirmatory;

/// <summary>
/// Confirmatory factor analysis against an independent numpy/scipy implementation (fixtures and the script that made
/// them: ReferenceData/Confirmatory/make_confirmatory_reference.py; respondent-by-respondent −2 ln L minimised by scipy
/// BFGS + Newton polish, expected information from duplication matrices and Kronecker products, Γ from fourth moments,
/// RMSEA interval from scipy.stats.ncx2). Data: our own simulated two-factor five-point survey (300 respondents, 7 items),
/// complete and with 8% missing answers.
/// </summary>
public class ConfirmatoryFactorAnalysisTests
{
    private const string Area = "Confirmatory";
    private const double Tolerance = 1e-4;

    private static ResponseMatrix Load(string file)
    {
        var rows = ReferenceData.Numbers(Area, file);
        int p = rows[0].Length;
        var items = Enumerable.Range(0, p).Select(j => new ItemDefinition($"i{j + 1}", null, false, 1, 5, null)).ToList();
        return new ResponseMatrix(Enumerable.Range(0, rows.Length).Select(i => $"r{i}").ToList(), items, rows.SelectMany(r => r).ToArray());
    }

    private static Dictionary<string, double> Expected(string file) =>
        ReferenceData.Lines(Area, file)
            .Select(l => l.Split(',')).ToDictionary(a => a[0], a => double.Parse(a[1], CultureInfo.InvariantCulture));

    private static readonly int[] Right = [0, 0, 0, 0, 1, 1, 1];
    private static readonly int[] Wrong = [0, 0, 0, 1, 1, 1, 1];

    private static ConfirmatoryResult Fit(string data, int[] factors, bool listwise = false) =>
        ConfirmatoryFactorAnalysis.Fit(Load(data), Enumerable.Range(0, 7).ToArray(), factors, ["A", "B"], listwise);

    private static void Close(double expected, double actual, string what, double tolerance = Tolerance)
    {
        double scale = Math.Max(Math.Abs(expected), 1e-3);
        Assert.True(Math.Abs(expected - actual) <= tolerance * scale, $"{what}: expected {expected:R}, got {actual:R}");
    }

    [Theory]
    [InlineData("cfa_complete_data.csv", "cfa_complete_expected.csv", "right", false)]
    [InlineData("cfa_complete_data.csv", "cfa_complete_wrong_expected.csv", "wrong", false)]
    [InlineData("cfa_missing_data.csv", "cfa_missing_expected.csv", "right", false)]
    [InlineData("cfa_missing_data.csv", "cfa_missing_listwise_expected.csv", "right", true)]
    public void Estimates_and_every_fit_statistic_match_the_scipy_reference(string data, string expectedFile, string model, bool listwise)
    {
        var e = Expected(expectedFile);
        var r = Fit(data, model == "right" ? Right : Wrong, listwise);
        Assert.True(r.Converged);
        Assert.Equal((int)e["respondents"], r.Respondents);
        var f = r.Fit;
        Assert.Equal((int)e["df"], f.Df);
        foreach (var (name, value) in new (string, double)[]
                 {
                     ("chi2", f.Chi2), ("p_value", f.PValue), ("cfi", f.Cfi), ("tli", f.Tli), ("rmsea", f.Rmsea), ("rmsea_ci_low", f.RmseaLow),
                     ("rmsea_ci_high", f.RmseaHigh), ("srmr", f.Srmr), ("scaled_chi2", f.ScaledChi2), ("scaling_factor", f.ScalingFactor),
                     ("robust_cfi", f.RobustCfi), ("robust_tli", f.RobustTli), ("robust_rmsea", f.RobustRmsea), ("independence_chi2", f.IndependenceChi2),
                 })
            Close(e[name], value, name);
        for (int j = 0; j < 7; j++)
        {
            Close(e[$"loading_{j}"], r.Estimates[j].Estimate, $"loading {j}");
            Close(e[$"loading_se_{j}"], r.Estimates[j].StandardError, $"loading se {j}");
            Close(e[$"standardized_{j}"], r.Estimates[j].Standardized, $"standardized {j}");
            Close(e[$"uniqueness_{j}"], r.UniqueVariances[j], $"uniqueness {j}");
        }
        Close(e["correlation_0"], r.Estimates[7].Estimate, "factor correlation");
        Close(e["correlation_se_0"], r.Estimates[7].StandardError, "factor correlation se");
    }

    [Fact]
    public void Robust_scaling_uses_all_respondents_below_the_cap_and_the_documented_evenly_spaced_rows_above_it()
    {
        var data = Load("cfa_missing_data.csv");
        Assert.Equal(data.RespondentCount, Fit("cfa_missing_data.csv", Right).Fit.RobustRespondents);
        var patterns = MissingDataPatterns.From(data, Enumerable.Range(0, 7).ToArray(), listwise: false);
        Assert.Same(patterns, patterns.EvenlySpaced(patterns.Respondents));
        // The rule stated in the README: row ⌊j·N/cap⌋ for j = 0..cap−1 (N = 300, cap = 8).
        var capped = patterns.EvenlySpaced(8);
        Assert.Equal(new[] { 0, 37, 75, 112, 150, 187, 225, 262 }.Select(j => patterns.RowIndex[j]), capped.RowIndex);
        Assert.Equal(8, capped.Patterns.Sum(g => g.Count));
    }

    [Fact]
    public void Planted_model_fits_and_an_item_moved_to_the_wrong_factor_fits_clearly_worse()
    {
        // The data were simulated from the "right" model (script above); thresholds are common practice, no source.
        var right = Fit("cfa_complete_data.csv", Right).Fit;
        var wrong = Fit("cfa_complete_data.csv", Wrong).Fit;
        Assert.True(right.Cfi > 0.98, $"CFI {right.Cfi}");
        Assert.True(wrong.Cfi < right.Cfi - 0.05, $"CFI right {right.Cfi}, wrong {wrong.Cfi}");
        Assert.True(wrong.Rmsea > right.Rmsea + 0.03, $"RMSEA right {right.Rmsea}, wrong {wrong.Rmsea}");
        Assert.True(wrong.Srmr > right.Srmr);
    }

    [Fact]
    public void Complete_data_chi_square_is_N_times_the_ML_discrepancy()
    {
        // χ² = N·F_ML, F_ML = ln|Σ̂| + tr(S Σ̂⁻¹) − ln|S| − p with the divide-by-N S (textbook definition, e.g. Bollen 1989, eq. 4.67).
        var data = Load("cfa_complete_data.csv");
        var r = Fit("cfa_complete_data.csv", Right);
        int n = data.RespondentCount, p = 7;
        var x = new double[n, p];
        var mean = new double[p];
        for (int i = 0; i < n; i++) for (int j = 0; j < p; j++) { x[i, j] = data[i, j]; mean[j] += x[i, j] / n; }
        var s = new double[p, p];
        for (int i = 0; i < n; i++) for (int a = 0; a < p; a++) for (int b = 0; b < p; b++) s[a, b] += (x[i, a] - mean[a]) * (x[i, b] - mean[b]) / n;
        var sigma = new double[p, p];
        double phi = r.Estimates[7].Estimate;
        for (int a = 0; a < p; a++)
            for (int b = 0; b < p; b++)
                sigma[a, b] = r.Estimates[a].Estimate * r.Estimates[b].Estimate * (Right[a] == Right[b] ? 1 : phi) + (a == b ? r.UniqueVariances[a] : 0);
        var sm = MathNet.Numerics.LinearAlgebra.Matrix<double>.Build.DenseOfArray(s);
        var gm = MathNet.Numerics.LinearAlgebra.Matrix<double>.Build.DenseOfArray(sigma);
        double fml = Math.Log(gm.Determinant()) + (sm * gm.Inverse()).Trace() - Math.Log(sm.Determinant()) - p;
        Close(n * fml, r.Fit.Chi2, "N·F_ML", 1e-8);
    }

    [Fact]
    public void A_factor_with_one_item_is_refused_as_not_identified()
    {
        var e = Assert.Throws<DataConditionException>(() => ConfirmatoryFactorAnalysis.Fit(Load("cfa_complete_data.csv"), Enumerable.Range(0, 7).ToArray(),
            [0, 0, 0, 0, 0, 0, 1], ["A", "B"], false));
        Assert.Contains("not identified", e.Message);
    }
}

/// <summary>Noncentral χ² CDF against scipy.stats.ncx2.cdf (ReferenceData/Confirmatory/make_ncx2_reference.py).</summary>
public class NoncentralChiSquareTests
{
    [Fact]
    public void Cdf_matches_scipy()
    {
        foreach (var r in ReferenceData.Numbers("Confirmatory", "ncx2_cdf.csv"))
        {
            double actual = NoncentralChiSquare.Cdf(r[0], r[1], r[2]);
            Assert.True(Math.Abs(actual - r[3]) <= 1e-10 + 1e-8 * r[3], $"x={r[0]}, df={r[1]}, nc={r[2]}: scipy {r[3]:R}, ours {actual:R}");
        }
    }

    [Fact]
    public void Noncentrality_root_reproduces_the_probability()
    {
        double l = NoncentralChiSquare.NoncentralityFor(60, 20, 0.95);
        Assert.True(Math.Abs(NoncentralChiSquare.Cdf(60, 20, l) - 0.95) < 1e-10);
        Assert.Equal(0, NoncentralChiSquare.NoncentralityFor(5, 20, 0.05));
    }
}

/// <summary>Item descriptives against numpy/scipy.stats.skew/kurtosis (bias=True)
/// (ReferenceData/Confirmatory/make_descriptives_reference.py on cfa_missing_data.csv).</summary>
public class ItemDescriptivesTests
{
    [Fact]
    public void Descriptives_match_scipy()
    {
        var rows = ReferenceData.Numbers("Confirmatory", "cfa_missing_data.csv");
        var items = Enumerable.Range(0, 7).Select(j => new ItemDefinition($"i{j + 1}", null, false, 1, 5, null)).ToList();
        var data = new ResponseMatrix(Enumerable.Range(0, rows.Length).Select(i => $"r{i}").ToList(), items, rows.SelectMany(r => r).ToArray());
        var actual = ItemDescriptives.Compute(data);
        var expected = ReferenceData.Numbers("Confirmatory", "descriptives_expected.csv");
        for (int j = 0; j < 7; j++)
        {
            var a = actual[j];
            double[] got = [a.Respondents, a.Mean, a.StandardDeviation, a.Skewness, a.ExcessKurtosis, a.LowestShare, a.HighestShare, a.MissingShare];
            for (int c = 0; c < got.Length; c++)
                Assert.True(Math.Abs(got[c] - expected[j][c]) <= 1e-12 * Math.Max(1, Math.Abs(expected[j][c])), $"item {j}, column {c}: scipy {expected[j][c]:R}, ours {got[c]:R}");
        }
    }
}
