using ItemReduce.Core;
using ItemReduce.Core.Correlation;
using ItemReduce.Core.Factoring;
using ItemReduce.Simulation;
using ItemReduce.Tests.Support;
using MathNet.Numerics.LinearAlgebra;

namespace ItemReduce.Tests.Core.Factoring;

public class ExtractionTests
{
    private const string Area = "Factoring";
    private static double[,] R2 => ReferenceData.Matrix(Area, "two_factor_correlation.csv");
    private static readonly FactoringOptions Tight = new() { Tolerance = 1e-9, MaxIterations = 20000, Rotation = FactorRotation.None };

    [Fact]
    public void Maximum_likelihood_uniquenesses_match_sklearn_FactorAnalysis()
    {
        // Expected: sklearn.decomposition.FactorAnalysis(n_components=2) on z-scores (ddof=0), whose
        // covariance equals the fixture correlation matrix (make_factoring_reference.py).
        var s = FactorAnalysis.Fit(R2, 3000, 2, Tight with { Extraction = FactorExtraction.MaximumLikelihood });
        Assert.True(s.Converged);
        LoadingAssert.Close(ReferenceData.Vector(Area, "two_factor_ml_uniqueness_sklearn.csv"), s.Uniquenesses, 2e-5);
    }

    [Fact]
    public void Maximum_likelihood_fit_statistics_match_numpy_computation_from_the_full_discrepancy()
    {
        // Expected: numpy F = ln|Σ̂| − ln|R| + tr(RΣ̂⁻¹) − p at the sklearn optimum, Bartlett χ², df, RMSEA, TLI
        // (formulas as cited in MaximumLikelihoodFactoring, from memory).
        var t = ReferenceData.Columns(Area, "two_factor_ml_fit.csv");
        var s = FactorAnalysis.Fit(R2, (int)t["n"][0], 2, Tight with { Extraction = FactorExtraction.MaximumLikelihood });
        var fit = s.Fit!;
        Assert.Equal(t["df"][0], fit.Df);
        Assert.Equal(13.0, fit.Df); // ((8 − 2)² − (8 + 2)) / 2 = 13: common practice, no source
        Assert.Equal(t["fmin"][0], fit.MinimumDiscrepancy, 1e-6);
        Assert.Equal(t["chisq"][0], fit.ChiSquare, 2e-3 * t["chisq"][0]);
        Assert.Equal(t["p"][0], fit.P, 2e-3);
        Assert.Equal(t["rmsea"][0], fit.Rmsea, 1e-4);
        Assert.Equal(t["tli"][0], fit.Tli, 1e-5);
    }

    [Fact]
    public void Minres_communalities_match_scipy_off_diagonal_least_squares()
    {
        // Expected: scipy.optimize BFGS over the full loading matrix minimising the off-diagonal residual sum
        // of squares (ULS), an independent formulation of minres.
        var s = FactorAnalysis.Fit(R2, 3000, 2, Tight);
        Assert.True(s.Converged);
        LoadingAssert.Close(ReferenceData.Vector(Area, "two_factor_minres_communality_scipy.csv"), s.Communalities, 1e-5);
    }

    [Fact]
    public void Principal_axis_communalities_match_numpy_iteration()
    {
        // Expected: numpy principal-axis iteration from SMC to a 1e-12 change.
        var s = FactorAnalysis.Fit(R2, 3000, 2, Tight with { Extraction = FactorExtraction.PrincipalAxis });
        Assert.True(s.Converged);
        LoadingAssert.Close(ReferenceData.Vector(Area, "two_factor_paf_communality_numpy.csv"), s.Communalities, 1e-6);
    }

    [Fact]
    public void Criterion_gradients_match_finite_differences()
    {
        // Calculus check of the analytic gradients used by the optimiser.
        var r = Matrix<double>.Build.DenseOfArray(R2);
        double[] psi = [0.4, 0.5, 0.6, 0.55, 0.45, 0.5, 0.65, 0.75];
        var gm = MinimumResidual.Gradient(r, psi, 2);
        var gl = MaximumLikelihoodFactoring.Gradient(r, psi, 2);
        const double h = 1e-6;
        for (int j = 0; j < psi.Length; j++)
        {
            var up = (double[])psi.Clone(); up[j] += h;
            var dn = (double[])psi.Clone(); dn[j] -= h;
            Assert.Equal((MinimumResidual.Criterion(r, up, 2) - MinimumResidual.Criterion(r, dn, 2)) / (2 * h), gm[j], 6);
            Assert.Equal((MaximumLikelihoodFactoring.Criterion(r, up, 2) - MaximumLikelihoodFactoring.Criterion(r, dn, 2)) / (2 * h), gl[j], 5);
        }
    }

    [Theory]
    [InlineData(FactorExtraction.MinimumResidual, FactorRotation.Oblimin)]
    [InlineData(FactorExtraction.PrincipalAxis, FactorRotation.Oblimin)]
    [InlineData(FactorExtraction.MaximumLikelihood, FactorRotation.Oblimin)]
    [InlineData(FactorExtraction.MaximumLikelihood, FactorRotation.Promax)]
    [InlineData(FactorExtraction.MinimumResidual, FactorRotation.Varimax)]
    public void Planted_simple_structure_is_recovered(FactorExtraction extraction, FactorRotation rotation)
    {
        // Known truth: FactorModelSimulator, 3 factors × 5 continuous items, loadings .75/.65/.55/.7/.6,
        // factor correlation .35 (varimax: .0), n = 4000.
        double phi = rotation == FactorRotation.Varimax ? 0.0 : 0.35;
        double[] pattern = [0.75, 0.65, 0.55, 0.7, 0.6];
        var spec = new FactorModelSpec
        {
            ItemFactor = Enumerable.Range(0, 15).Select(j => j / 5).ToArray(),
            Loadings = Enumerable.Range(0, 15).Select(j => pattern[j % 5]).ToArray(),
            FactorCorrelations = new double[,] { { 1, phi, phi }, { phi, 1, phi }, { phi, phi, 1 } },
            Categories = 0,
        };
        var sim = FactorModelSimulator.Generate(spec, new FactorModelSimulator.Settings(4000, 7));
        var r = PearsonCorrelation.Compute(sim.Responses);
        var s = FactorAnalysis.Fit(r, 4000, 3, new FactoringOptions { Extraction = extraction, Rotation = rotation });
        Assert.True(s.Converged);
        var truth = new double[15, 3];
        for (int j = 0; j < 15; j++) truth[j, j / 5] = pattern[j % 5];
        LoadingAssert.Close(truth, s.Pattern, rotation == FactorRotation.Promax ? 0.08 : 0.06);
        for (int a = 0; a < 3; a++)
            for (int b = 0; b < 3; b++)
                Assert.Equal(a == b ? 1.0 : phi, s.FactorCorrelations[a, b], 0.07);
    }

    [Fact]
    public void Factors_are_signed_positive_ordered_by_variance_and_labelled_by_dominant_subscale()
    {
        // Alignment rules of our own (FactorAlignment). Second factor's items are mirrored so the raw solution
        // has a negative column.
        var spec = FactorModelSpec.Simple(2, 4, 0.7, 0.2, categories: 0) with
        {
            Loadings = [0.5, 0.5, 0.5, 0.5, -0.8, -0.8, -0.8, -0.8],
        };
        var sim = FactorModelSimulator.Generate(spec, new FactorModelSimulator.Settings(2000, 11, SubscaleNames: ["Calm", "Drive"]));
        var r = PearsonCorrelation.Compute(sim.Responses);
        var s = FactorAnalysis.Fit(r, 2000, 2, new FactoringOptions { ItemSubscales = sim.Codebook.Items.Select(i => i.Subscale).ToList() });
        for (int f = 0; f < 2; f++) Assert.True(Enumerable.Range(0, 8).Sum(j => s.Pattern[j, f]) > 0);
        Assert.True(s.VarianceExplained[0] >= s.VarianceExplained[1]);
        Assert.Equal(["Drive", "Calm"], s.FactorLabels);
        Assert.Equal(0, s.SubscaleFactor["Drive"]);
        Assert.Equal(1, s.SubscaleFactor["Calm"]);
        Assert.Equal(s.Communalities.Sum(), s.VarianceExplained.Sum(), 10);
    }

    [Fact]
    public void Heywood_case_is_detected_and_warned()
    {
        // One factor, three items: λ₁² = r₁₂ r₁₃ / r₂₃ = .8·.7/.5 = 1.12 > 1 (classic triad identity); R is
        // positive definite (det = .18), so ML is defined but must stop at the uniqueness bound.
        var r = new double[,] { { 1, .8, .7 }, { .8, 1, .5 }, { .7, .5, 1 } };
        foreach (var e in Enum.GetValues<FactorExtraction>())
        {
            var s = FactorAnalysis.Fit(r, 500, 1, new FactoringOptions { Extraction = e });
            Assert.Contains(0, s.HeywoodItems);
            Assert.Contains(s.Warnings, w => w.Message.Contains("Heywood"));
        }
    }

    [Fact]
    public void Maximum_likelihood_rejects_a_correlation_matrix_that_is_not_positive_definite()
    {
        // det = 1·(1 − .36) − .9·(.9 − .54) + .9·(.54 − .9) = −0.008 < 0 (hand computation).
        var r = new double[,] { { 1, .9, .9 }, { .9, 1, .6 }, { .9, .6, 1 } };
        var ex = Assert.Throws<DataConditionException>(() => FactorAnalysis.Fit(r, 500, 1, new FactoringOptions { Extraction = FactorExtraction.MaximumLikelihood }));
        Assert.Contains("positive definite", ex.Message);
        Assert.NotEmpty(FactorAnalysis.Fit(r, 500, 1).HeywoodItems); // minres still answers, flagged
    }

    [Fact]
    public void Iteration_cap_gives_a_flagged_result()
    {
        var s = FactorAnalysis.Fit(R2, 3000, 2, new FactoringOptions { Extraction = FactorExtraction.PrincipalAxis, MaxIterations = 10, Tolerance = 1e-9 });
        Assert.False(s.Converged);
        Assert.Contains(s.Warnings, w => w.Message.Contains("did not converge"));
    }

    [Fact]
    public void Invalid_input_is_rejected_with_the_value()
    {
        var ex = Assert.Throws<DataConditionException>(() => FactorAnalysis.Fit(R2, 3000, 8));
        Assert.Contains("factors = 8", ex.Message);
        var bad = (double[,])R2.Clone();
        bad[0, 1] = double.NaN;
        Assert.Throws<DataConditionException>(() => FactorAnalysis.Fit(bad, 3000, 2));
    }

    [Fact]
    public void Maximum_likelihood_fit_with_nonpositive_df_is_undefined_not_nonsense()
    {
        // p = 4, k = 2: df = ((4 − 2)² − 6)/2 = −1 (common practice, no source).
        var r = new double[,] { { 1, .5, .4, .3 }, { .5, 1, .35, .3 }, { .4, .35, 1, .45 }, { .3, .3, .45, 1 } };
        var s = FactorAnalysis.Fit(r, 300, 2, new FactoringOptions { Extraction = FactorExtraction.MaximumLikelihood });
        Assert.Equal(-1.0, s.Fit!.Df);
        Assert.True(double.IsNaN(s.Fit.Rmsea));
        Assert.Contains(s.Warnings, w => w.Message.Contains("degrees of freedom"));
    }
}
