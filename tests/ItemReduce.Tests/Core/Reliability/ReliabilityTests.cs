using ItemReduce.Core.Data;
using ItemReduce.Core.Reliability;
using ItemReduce.Tests.Core.Factoring;
using ItemReduce.Tests.Support;

namespace ItemReduce.Tests.Core.Reliability;

public class ReliabilityTests
{
    private const string Area = "Reliability";

    private static ResponseMatrix Likert()
    {
        var m = ReferenceData.Matrix(Area, "likert_items.csv");
        int n = m.GetLength(0), k = m.GetLength(1);
        var items = Enumerable.Range(0, k).Select(j => new ItemDefinition($"i{j + 1}", "S", false, 1, 5, null)).ToList();
        var v = new double[n * k];
        for (int i = 0; i < n; i++) for (int j = 0; j < k; j++) v[i * k + j] = m[i, j];
        return new ResponseMatrix(Enumerable.Range(0, n).Select(i => $"r{i}").ToList(), items, v);
    }

    [Fact]
    public void Alpha_interval_item_statistics_and_omega_match_numpy_on_fixture_data()
    {
        // Expected: make_reliability_reference.py — numpy textbook alpha on listwise-complete rows,
        // np.corrcoef item-rest correlations, scipy.stats.f.ppf Feldt interval, scipy ULS one-factor omega.
        var e = ReferenceData.Columns(Area, "likert_expected.csv");
        var items = ReferenceData.Columns(Area, "likert_item_expected.csv");
        var r = ScaleReliability.Compute(Likert());
        Assert.Equal((int)e["n"][0], r.Respondents);
        Assert.Equal(e["alpha"][0], r.Alpha, 1e-12);
        Assert.Equal(e["std_alpha"][0], r.StandardizedAlpha, 1e-12);
        Assert.Equal(e["ci_low"][0], r.AlphaCiLow, 1e-9);
        Assert.Equal(e["ci_high"][0], r.AlphaCiHigh, 1e-9);
        Assert.Equal(e["omega"][0], r.Omega, 1e-5);
        LoadingAssert.Close(items["alpha_if_deleted"], r.AlphaIfDeleted, 1e-12);
        LoadingAssert.Close(items["item_total_r"], r.ItemTotalCorrelations, 1e-12);
        LoadingAssert.Close(items["omega_loading"], r.OmegaLoadings, 1e-4);
    }

    [Fact]
    public void Feldt_interval_matches_scipy_f_quantiles()
    {
        // Expected: 1 − (1 − α)·scipy.stats.f.ppf(q, n − 1, (n − 1)(k − 1)), Feldt (1965).
        var t = ReferenceData.Columns(Area, "feldt_scipy.csv");
        for (int i = 0; i < t["alpha"].Length; i++)
        {
            var (lo, hi) = FeldtInterval.Compute(t["alpha"][i], (int)t["n"][i], (int)t["k"][i], t["confidence"][i]);
            Assert.Equal(t["low"][i], lo, 1e-8);
            Assert.Equal(t["high"][i], hi, 1e-8);
        }
    }

    [Theory]
    [InlineData(4, 0.3)]
    [InlineData(10, 0.15)]
    [InlineData(2, 0.6)]
    public void Equicorrelated_items_follow_the_Spearman_Brown_identity(int k, double r)
    {
        // Identity: standardized alpha = k r / (1 + (k − 1) r) (Spearman–Brown form); with equal variances the
        // raw alpha equals it too.
        var c = new double[k, k];
        for (int a = 0; a < k; a++) for (int b = 0; b < k; b++) c[a, b] = a == b ? 2.5 : 2.5 * r;
        var corr = new double[k, k];
        for (int a = 0; a < k; a++) for (int b = 0; b < k; b++) corr[a, b] = a == b ? 1 : r;
        double sb = k * r / (1 + (k - 1) * r);
        Assert.Equal(sb, CronbachAlpha.Standardized(corr), 12);
        Assert.Equal(sb, CronbachAlpha.FromCovariance(c), 12);
    }

    [Fact]
    public void Omega_from_loadings_matches_the_hand_formula()
    {
        // Hand computation of McDonald's (1999) ω = (Σλ)²/((Σλ)² + Σψ): λ = (.8, .7, .6, .5), ψ = 1 − λ²:
        // Σλ = 2.6, (Σλ)² = 6.76, Σψ = 4 − 1.74 = 2.26, ω = 6.76 / 9.02 = 0.749445676...
        double[] l = [0.8, 0.7, 0.6, 0.5];
        Assert.Equal(6.76 / 9.02, McDonaldOmega.FromLoadings(l, l.Select(x => 1 - x * x).ToArray()), 12);
    }

    [Fact]
    public void Overlap_corrected_short_full_correlation_matches_formula_and_fresh_error_replication()
    {
        // Expected (make_reliability_reference.py): numpy evaluation of the correction on the same covariance
        // (formula check); the correlation of the full form with the short items re-drawn with fresh errors
        // (replication, n = 200 000), and its population value from the planted model (tau-equivalent, where
        // alpha equals the reliability).
        var cov = ReferenceData.Matrix(Area, "overlap_covariance.csv");
        var e = ReferenceData.Columns(Area, "overlap_expected.csv");
        var (observed, corrected) = LevyOverlapCorrection.FromCovariance(cov, [0, 1, 2, 3], Enumerable.Range(0, 10).ToArray());
        Assert.Equal(e["observed_r"][0], observed, 1e-9);
        Assert.Equal(e["formula_r"][0], corrected, 1e-12);
        Assert.Equal(e["replication_r"][0], corrected, 0.005);
        Assert.Equal(e["population_r"][0], corrected, 0.005);
        Assert.True(observed - corrected > 0.1); // the uncorrected value is inflated
    }

    [Fact]
    public void Degenerate_scales_give_NaN_not_numbers()
    {
        var one = new double[,] { { 1.0 } };
        Assert.True(double.IsNaN(CronbachAlpha.FromCovariance(one)));
        Assert.Equal((double.NaN, double.NaN), FeldtInterval.Compute(double.NaN, 100, 5));
        Assert.Throws<ArgumentException>(() => FeldtInterval.Compute(0.8, 100, 5, 1.5));
    }
}
