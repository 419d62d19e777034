using ItemReduce.Core;
using ItemReduce.Core.Reliability;
using ItemReduce.Tests.Support;

namespace ItemReduce.Tests.Core.Reliability;

public class OmegaHierarchicalTests
{
    private const string Area = "Reliability";

    [Fact]
    public void Matches_scipy_second_order_fit_and_numpy_omega_h_on_four_oblique_factors()
    {
        // Expected: make_omega_hierarchical_reference.py — scipy.optimize.least_squares one-factor ULS fit to Φ,
        // numpy g = Pγ and (Σg)² / 1ᵀR1.
        var pattern = ReferenceData.Matrix(Area, "omegah_pattern.csv");
        var phi = ReferenceData.Matrix(Area, "omegah_phi.csv");
        var r = ReferenceData.Matrix(Area, "omegah_correlation.csv");
        var e = ReferenceData.Columns(Area, "omegah_expected.csv");
        var gamma = ReferenceData.Vector(Area, "omegah_gamma_scipy.csv");
        var general = ReferenceData.Vector(Area, "omegah_general_numpy.csv");

        var res = OmegaHierarchical.Compute(pattern, phi, r);

        Assert.Equal(e["total"][0], res.TotalVariance, 1e-10);
        for (int f = 0; f < gamma.Length; f++) Assert.Equal(gamma[f], res.SecondOrderLoadings[f], 1e-5);
        for (int j = 0; j < general.Length; j++) Assert.Equal(general[j], res.GeneralLoadings[j], 1e-5);
        Assert.Equal(e["omega_h"][0], res.OmegaH, 1e-5);
    }

    /// <summary>Planted higher-order model: 3 groups of 4 items, first-order loadings 0.6, second-order loadings 0.8,
    /// R model-implied. By hand: gⱼ = 0.48, (Σg)² = 5.76² = 33.1776; group part Σ_f (1 − 0.64)(4 · 0.6)² = 6.2208;
    /// uniquenesses 12 · 0.64 = 7.68; ω_h = 33.1776 / (33.1776 + 6.2208 + 7.68).</summary>
    [Fact]
    public void Planted_three_factor_higher_order_model_gives_the_closed_form_omega_h()
    {
        var (pattern, phi, r) = Planted([0.8, 0.8, 0.8], Enumerable.Repeat(0.6, 12).ToArray(), 4);
        var res = OmegaHierarchical.Compute(pattern, phi, r);
        Assert.Equal(33.1776 + 6.2208 + 7.68, res.TotalVariance, 1e-10);
        Assert.Equal(33.1776 / 47.0784, res.OmegaH, 1e-6);
        Assert.All(res.GeneralLoadings, g => Assert.Equal(0.48, g, 1e-6));
        Assert.All(Enumerable.Range(0, 12), j => Assert.Equal(0.6 * 0.6, res.GroupLoadings[j, j / 4], 1e-6));
    }

    /// <summary>Unequal loadings on 4 factors with a one-factor Φ (γ = 0.9, 0.7, 0.6, 0.5): the second-order fit recovers γ
    /// and ω_h = (Σ λⱼ γ_f(j))² / 1ᵀR1 with 1ᵀR1 = (Σg)² + Σ_f (1 − γ_f²)(Σ_{j∈f} λⱼ)² + Σ(1 − λⱼ²) (the model's variance
    /// decomposition; common practice, no source).</summary>
    [Fact]
    public void Planted_four_factor_model_recovers_second_order_loadings_and_closed_form()
    {
        double[] gamma = [0.9, 0.7, 0.6, 0.5];
        double[] lambda = [0.7, 0.6, 0.5, 0.65, 0.55, 0.45, 0.75, 0.6, 0.5, 0.4, 0.7, 0.6];
        var (pattern, phi, r) = Planted(gamma, lambda, 3);
        double sg = 0, group = 0, uniq = 0;
        for (int f = 0; f < 4; f++)
        {
            double s = lambda[(3 * f)..(3 * f + 3)].Sum();
            sg += gamma[f] * s;
            group += (1 - gamma[f] * gamma[f]) * s * s;
        }
        foreach (double l in lambda) uniq += 1 - l * l;
        var res = OmegaHierarchical.Compute(pattern, phi, r);
        for (int f = 0; f < 4; f++) Assert.Equal(gamma[f], res.SecondOrderLoadings[f], 1e-5);
        Assert.Equal(sg * sg / (sg * sg + group + uniq), res.OmegaH, 1e-5);
    }

    [Fact]
    public void Reflecting_a_factor_leaves_omega_h_unchanged()
    {
        var pattern = ReferenceData.Matrix(Area, "omegah_pattern.csv");
        var phi = ReferenceData.Matrix(Area, "omegah_phi.csv");
        var r = ReferenceData.Matrix(Area, "omegah_correlation.csv");
        var before = OmegaHierarchical.Compute(pattern, phi, r);
        var p2 = (double[,])pattern.Clone();
        var phi2 = (double[,])phi.Clone();
        for (int j = 0; j < p2.GetLength(0); j++) p2[j, 1] = -p2[j, 1];
        for (int f = 0; f < 4; f++) if (f != 1) { phi2[f, 1] = -phi2[f, 1]; phi2[1, f] = -phi2[1, f]; }
        var after = OmegaHierarchical.Compute(p2, phi2, r);
        Assert.Equal(before.OmegaH, after.OmegaH, 1e-8);
        Assert.Equal(pattern[0, 0], ReferenceData.Matrix(Area, "omegah_pattern.csv")[0, 0]); // inputs not changed
    }

    [Fact]
    public void Fewer_than_three_factors_is_rejected()
    {
        var ex = Assert.Throws<DataConditionException>(() => OmegaHierarchical.Compute(new double[5, 2], new double[2, 2], new double[5, 5]));
        Assert.Contains("at least 3", ex.Message);
    }

    private static (double[,] Pattern, double[,] Phi, double[,] R) Planted(double[] gamma, double[] lambda, int perFactor)
    {
        int k = gamma.Length, p = lambda.Length;
        var pattern = new double[p, k];
        for (int j = 0; j < p; j++) pattern[j, j / perFactor] = lambda[j];
        var phi = new double[k, k];
        for (int a = 0; a < k; a++)
            for (int b = 0; b < k; b++) phi[a, b] = a == b ? 1 : gamma[a] * gamma[b];
        var r = new double[p, p];
        for (int i = 0; i < p; i++)
            for (int j = 0; j < p; j++) r[i, j] = i == j ? 1 : lambda[i] * lambda[j] * phi[i / perFactor, j / perFactor];
        return (pattern, phi, r);
    }
}
