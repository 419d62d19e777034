using ItemReduce.Core.Screening;

namespace ItemReduce.Tests.Core.Screening;

public class FastMcdTests
{
    private static (double[] X, int N, int P, double[][] Rows) Load(string file)
    {
        var (header, rows) = ScreeningFixtures.Read(file);
        int p = header.Count(h => h.StartsWith('x'));
        return (rows.SelectMany(r => r.Take(p)).ToArray(), rows.Length, p, rows);
    }

    private static double[] RobustD2(double[] x, int n, int p, FastMcdEstimate fit)
    {
        var d = new MahalanobisDistance(fit.Location, fit.Scatter);
        return d.Compute(Dense(x, n, p)).D2;
    }

    private static ItemReduce.Core.Data.ResponseMatrix Dense(double[] x, int n, int p) =>
        new(Enumerable.Range(1, n).Select(i => i.ToString(System.Globalization.CultureInfo.InvariantCulture)).ToList(),
            Enumerable.Range(1, p).Select(j => new ItemReduce.Core.Data.ItemDefinition("x" + j, null, false, double.MinValue, double.MaxValue, null)).ToList(), x);

    [Theory]
    [InlineData("mcd_small.csv", false)]
    [InlineData("mcd_large.csv", true)]
    public void Robust_distances_agree_with_scikit_learn_MinCovDet(string file, bool nested)
    {
        // Reference: sklearn.covariance.MinCovDet(random_state=0) dist_ (mcd_reference.py). Its default
        // support_fraction=None gives h = ceil((n + p + 1) / 2); ours is ⌊(n + p + 1) / 2⌋ — one row apart at most.
        // sklearn's reweighted covariance divides by n_w and is not rescaled, ours uses n_w − 1 and the normal-theory
        // factor, so distances differ by a near-constant factor: compare ranks and detections, not raw values.
        var (x, n, p, rows) = Load(file);
        var fit = FastMcd.Fit(x, n, p, new FastMcdSettings(Seed: 7));
        Assert.Equal(nested, fit.Nested);
        Assert.Equal((n + p + 1) / 2, fit.SupportSize);
        var ours = RobustD2(x, n, p, fit);
        var theirs = rows.Select(r => r[p + 1]).ToArray();
        double rho = ScreeningFixtures.Spearman(ours, theirs);
        Assert.True(rho > 0.99, $"Spearman {rho}");

        // The same planted outliers are detected (χ²_p 0.999 quantile, both sets of distances).
        double cut = ChiSquareTail.UpperQuantile(0.001, p);
        var planted = Enumerable.Range(0, n).Where(i => rows[i][p] == 1).ToArray();
        int oursFound = planted.Count(i => ours[i] > cut), theirsFound = planted.Count(i => theirs[i] > cut);
        Assert.Equal(planted.Length, theirsFound);
        Assert.Equal(planted.Length, oursFound);

        // Reweighted locations agree (sklearn location_).
        var (_, loc) = ScreeningFixtures.Read(file.Replace(".csv", "_location.csv"));
        for (int j = 0; j < p; j++) Assert.Equal(loc[j][0], fit.Location[j], 0.03);
    }

    [Fact]
    public void Planted_outliers_lie_far_out_on_the_robust_scale_and_clean_rows_are_chi_square_calibrated()
    {
        // Known truth from mcd_reference.py: 90 planted outliers (3 %) in the large set; the planted block
        // should sit far out on the robust scale and have no influence on the robust location.
        var (x, n, p, rows) = Load("mcd_large.csv");
        var fit = FastMcd.Fit(x, n, p, new FastMcdSettings(Seed: 3));
        var d = RobustD2(x, n, p, fit);
        var clean = Enumerable.Range(0, n).Where(i => rows[i][p] == 0).Select(i => d[i]).ToArray();
        var bad = Enumerable.Range(0, n).Where(i => rows[i][p] == 1).Select(i => d[i]).ToArray();
        Assert.True(bad.Min() > clean.OrderBy(v => v).ElementAt((int)(0.99 * clean.Length)));
        // Under normality reweighted distances of clean rows are ≈ χ²_p: the median near χ²_p(0.5) (4.35 for p = 5).
        double median = clean.OrderBy(v => v).ElementAt(clean.Length / 2);
        Assert.Equal(ChiSquareTail.UpperQuantile(0.5, p), median, 0.4);
    }

    [Fact]
    public void Classical_distances_are_masked_by_a_planted_cluster_where_robust_ones_are_not()
    {
        // Known truth (mcd_reference.py): 20 of 400 rows (5 %) form a tight cluster against the correlation
        // structure. Such a cluster pulls the sample mean and inflates the sample covariance in its own direction
        // (masking, Rousseeuw & Van Driessen 1999, Section 1), so few of its rows pass the classical cutoff, while
        // robust distances (ours and sklearn's, previous test) find all of them.
        var (x, n, p, rows) = Load("mcd_small.csv");
        var all = Enumerable.Range(0, n).ToArray();
        var (mean, flat) = RowMoments.MeanCovariance(x, p, all, n - 1);
        var cov = new double[p, p];
        for (int j = 0; j < p; j++) for (int k = 0; k < p; k++) cov[j, k] = flat[j * p + k];
        var classical = new MahalanobisDistance(mean, cov).Compute(Dense(x, n, p)).D2;
        var robust = RobustD2(x, n, p, FastMcd.Fit(x, n, p, new FastMcdSettings(Seed: 2)));
        double cut = ChiSquareTail.UpperQuantile(0.001, p);
        var planted = all.Where(i => rows[i][p] == 1).ToArray();
        Assert.True(planted.Count(i => classical[i] > cut) < planted.Length / 2);
        Assert.Equal(planted.Length, planted.Count(i => robust[i] > cut));
    }

    [Fact]
    public void Same_seed_gives_identical_fits_and_affine_rescaling_leaves_distances_unchanged()
    {
        var (x, n, p, _) = Load("mcd_small.csv");
        var a = FastMcd.Fit(x, n, p, new FastMcdSettings(Seed: 42));
        var b = FastMcd.Fit(x, n, p, new FastMcdSettings(Seed: 42));
        Assert.Equal(a.Location, b.Location);
        Assert.Equal(a.RawLogDeterminant, b.RawLogDeterminant);
        // Affine equivariance of the MCD (paper, Section 1): y = 2x + 1 gives the same distances.
        var y = x.Select(v => 2 * v + 1).ToArray();
        var c = FastMcd.Fit(y, n, p, new FastMcdSettings(Seed: 42));
        var da = RobustD2(x, n, p, a);
        var dc = RobustD2(y, n, p, c);
        for (int i = 0; i < n; i++) Assert.Equal(da[i], dc[i], 1e-6 * Math.Max(1, da[i]));
    }

    [Fact]
    public void Reweighting_factor_matches_numerical_integration_in_scipy()
    {
        // Expected: p · 0.975 / ∫₀^q x f_χ²p(x) dx with q = χ²_p(0.975), by scipy.integrate.quad
        // (reweighting_factor_reference.py) — an independent check of the closed form 0.975 / F_χ²(p+2)(q).
        var (_, rows) = ScreeningFixtures.Read("reweighting_factor.csv");
        foreach (var r in rows)
        {
            int p = (int)r[0];
            double q = ChiSquareTail.UpperQuantile(0.025, p);
            Assert.Equal(r[1], 0.975 / ChiSquareTail.Cdf(q, p + 2), 1e-9);
        }
        var (x, n, pp, _) = Load("mcd_small.csv");
        var fit = FastMcd.Fit(x, n, pp, new FastMcdSettings(Seed: 1));
        Assert.Equal(rows.Single(r => r[0] == pp)[1], fit.ReweightingFactor, 1e-9);
    }

    [Fact]
    public void More_than_h_identical_rows_are_an_exact_fit()
    {
        // 60 of 100 rows identical: any h-subset (h = 52) can be chosen inside them, det = 0.
        int n = 100, p = 3;
        var x = new double[n * p];
        for (int i = 40; i < n; i++) { x[i * p] = 1; x[i * p + 1] = 2; x[i * p + 2] = 3; }
        for (int i = 0; i < 40; i++) for (int j = 0; j < p; j++) x[i * p + j] = Math.Sin(i * 7 + j * 3) * 3;
        Assert.Throws<FastMcdExactFitException>(() => FastMcd.Fit(x, n, p, new FastMcdSettings(Seed: 1)));
    }

    [Fact]
    public void Invalid_inputs_are_rejected()
    {
        Assert.Throws<ArgumentException>(() => FastMcd.Fit(new double[6], 2, 3, new FastMcdSettings()));
        Assert.Throws<ArgumentException>(() => FastMcd.Fit(new double[30], 10, 3, new FastMcdSettings(SupportSize: 3)));
    }

    [Fact]
    public void Selection_returns_the_order_statistic_of_a_sort()
    {
        // Property: Select(a, k) equals the k-th value of the sorted array, with many ties and without.
        var rng = new ItemReduce.Core.Randomness.RandomStream(11);
        foreach (int n in new[] { 1, 2, 3, 10, 101, 5000 })
            foreach (bool ties in new[] { false, true })
            {
                var a = Enumerable.Range(0, n).Select(_ => ties ? rng.NextInt(7) : rng.NextGaussian()).ToArray();
                var sorted = a.Order().ToArray();
                foreach (int k in new[] { 0, n / 3, n / 2, n - 1 })
                    Assert.Equal(sorted[k], FastMcd.Select((double[])a.Clone(), k));
            }
    }
}
