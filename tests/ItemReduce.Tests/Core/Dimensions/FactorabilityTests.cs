using ItemReduce.Core.Correlation;
using ItemReduce.Core.Dimensions;
using ItemReduce.Core.LinearAlgebra;
using static ItemReduce.Tests.Core.Dimensions.DimensionsReferenceData;

namespace ItemReduce.Tests.Core.Dimensions;

/// <summary>KMO/MSA, Bartlett's sphericity test, SMCs and MAP against numpy implementations of the published
/// formulas (make_factorability_fixtures.py): the UCI wine data (178 × 13, sklearn.datasets.load_wine) and a
/// hand-written 4 × 4 correlation matrix with n = 120.</summary>
public class FactorabilityTests
{
    public static TheoryData<string> Cases => new() { "wine", "small" };

    private static (double[,] R, Dictionary<string, double[]> Q) Case(string name)
    {
        var q = Quantities($"{name}_factorability.csv");
        var r = name == "wine" ? PearsonCorrelation.Compute(Responses("wine.csv")) : Matrix("small_correlation.csv");
        return (r, q);
    }

    [Theory]
    [MemberData(nameof(Cases))]
    public void Kmo_and_per_item_msa_match_numpy(string name)
    {
        var (r, q) = Case(name);
        var kmo = KaiserMeyerOlkin.Compute(r);
        Assert.Equal(q["kmo"][0], kmo.Overall, 1e-10);
        AssertClose(q["msa"], kmo.PerItem, 1e-10);
    }

    [Theory]
    [MemberData(nameof(Cases))]
    public void Bartlett_statistic_df_and_p_match_numpy_and_scipy_chi2_sf(string name)
    {
        var (r, q) = Case(name);
        var b = BartlettSphericityTest.Compute(r, (int)q["n"][0]);
        Assert.Equal(q["bartlett_chisq"][0], b.ChiSquare, 1e-9 * q["bartlett_chisq"][0]);
        Assert.Equal((int)q["bartlett_df"][0], b.DegreesOfFreedom);
        // p from scipy.stats.chi2.sf; relative tolerance since wine's p is about 2.5e-224.
        Assert.Equal(1.0, b.P / q["bartlett_p"][0], 1e-7);
    }

    [Theory]
    [MemberData(nameof(Cases))]
    public void Smc_and_reduced_eigenvalues_match_numpy(string name)
    {
        var (r, q) = Case(name);
        AssertClose(q["smc"], SquaredMultipleCorrelation.Compute(r), 1e-11);
        AssertClose(q["reduced_eigenvalue"], SymmetricEigensolver.Eigenvalues(SquaredMultipleCorrelation.ReducedMatrix(r)), 1e-11);
    }

    [Theory]
    [MemberData(nameof(Cases))]
    public void Map_curves_and_counts_match_numpy(string name)
    {
        var (r, q) = Case(name);
        var map = VelicerMap.Compute(r);
        // 1e-9: the last point (m = p − 1) is exactly 1 in exact arithmetic (rank-1 residual) and both
        // implementations reach it by cancellation, so it carries ~1e-10 rounding noise.
        AssertClose(q["map"], map.Curve, 1e-9);
        AssertClose(q["map4"], map.RevisedCurve, 1e-9);
        Assert.Equal((int)q["map_count"][0], map.Count);
        Assert.Equal((int)q["map4_count"][0], map.RevisedCount);
    }

    [Fact]
    public void Identity_matrix_gives_chi_square_zero_and_p_one_and_map_count_zero()
    {
        // ln|I| = 0 ⇒ χ² = 0, p = 1 (Bartlett 1950 formula); all partial correlations 0 at m = 0 ⇒ MAP count 0.
        var id = new double[5, 5];
        for (int i = 0; i < 5; i++) id[i, i] = 1;
        var b = BartlettSphericityTest.Compute(id, 50);
        Assert.Equal(0, b.ChiSquare, 1e-14);
        Assert.Equal(10, b.DegreesOfFreedom);
        Assert.Equal(1, b.P, 1e-14);
        Assert.Equal(0, VelicerMap.Compute(id).Count);
    }

    [Fact]
    public void Kaiser_count_is_the_number_of_eigenvalues_above_one()
    {
        Assert.Equal(2, KaiserCriterion.Count([2.5, 1.0000001, 1.0, 0.4]));
        Assert.Contains("comparison only", KaiserCriterion.Caution);
    }
}
