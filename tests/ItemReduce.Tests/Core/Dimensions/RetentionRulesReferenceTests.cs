using System.Globalization;
using ItemReduce.Core.Correlation;
using ItemReduce.Core.Dimensions;
using ItemReduce.Core.Factoring;
using ItemReduce.Core.Randomness;
using static ItemReduce.Tests.Core.Dimensions.DimensionsReferenceData;

namespace ItemReduce.Tests.Core.Dimensions;

/// <summary>
/// The rules added for issue 14 against independent numpy/scipy computations (fixtures and their script
/// ReferenceData/Dimensions/make_rule_fixtures.py) and facts of the trade.
/// </summary>
public class RetentionRulesReferenceTests
{
    private static double[] Split(string s) => s.Split(';').Select(Parse).ToArray();

    [Fact]
    public void Empirical_Kaiser_references_and_counts_match_numpy()
    {
        // numpy: l_j = max((1 + sqrt(p/n))^2 (p - sum_{i<j} lambda_i) / (p - j + 1), 1) (Braeken & van Assen 2017),
        // eigenvalues from np.linalg.eigvalsh; ekc_cases.csv.
        int cases = 0;
        foreach (var f in Fields("ekc_cases.csv"))
        {
            int n = int.Parse(f[1], CultureInfo.InvariantCulture);
            var eig = Split(f[2]);
            AssertClose(Split(f[3]), EmpiricalKaiserCriterion.References(eig, n), 1e-12);
            Assert.Equal(int.Parse(f[4], CultureInfo.InvariantCulture), EmpiricalKaiserCriterion.Count(eig, n));
            cases++;
        }
        Assert.Equal(5, cases);
    }

    [Fact]
    public void Empirical_Kaiser_reference_is_never_below_one_and_starts_at_the_Marchenko_Pastur_edge()
    {
        // Fact of the method (Braeken & van Assen 2017): l_1 = (1 + sqrt(p/n))^2 since the first term averages p over p.
        var eig = new[] { 3.0, 1.5, 1.0, 0.5, 0.0 };
        var l = EmpiricalKaiserCriterion.References(eig, 20);
        Assert.Equal(Math.Pow(1 + Math.Sqrt(5.0 / 20), 2), l[0], 1e-12);
        Assert.All(l, x => Assert.True(x >= 1));
    }

    [Fact]
    public void Mann_Whitney_p_values_match_scipy()
    {
        // scipy.stats.mannwhitneyu(x, y, alternative='less', method='asymptotic', use_continuity=True);
        // case 4 has ties (tie-corrected variance). mann_whitney_cases.csv.
        int cases = 0;
        foreach (var f in Fields("mann_whitney_cases.csv"))
        {
            double expected = Parse(f[3]);
            double actual = MannWhitneyUTest.PValueLess(Split(f[1]), Split(f[2]));
            Assert.True(Math.Abs(expected - actual) <= 1e-12 + 1e-10 * expected, $"case {f[0]}: scipy {expected:R}, ours {actual:R}");
            cases++;
        }
        Assert.Equal(6, cases);
    }

    [Fact]
    public void Polychoric_information_factor_matches_a_numerical_Fisher_information()
    {
        // scipy: Fisher information at rho = 0 of the bivariate-normal cell probabilities of a table whose two
        // margins are the given counts, by central differences of multivariate_normal.cdf; its square root is I_j
        // (information n I_j I_k with I_j = I_k). Includes 2/pi for a median split (a fact of the trade).
        int cases = 0;
        foreach (var f in Fields("polychoric_information.csv"))
        {
            var counts = Split(f[0]).Select(x => (long)x).ToArray();
            Assert.Equal(Parse(f[1]), PolychoricNullDistribution.InformationFactor(counts), 5e-6);
            cases++;
        }
        Assert.Equal(5, cases);
        Assert.Equal(2 / Math.PI, PolychoricNullDistribution.InformationFactor([50, 50]), 1e-12);
    }

    [Fact]
    public void Wishart_draws_with_a_population_correlation_match_brute_force_numpy_eigenvalues()
    {
        // numpy brute force: 20,000 samples of n = 60 from N(0, Sigma), np.corrcoef, eigvalsh; mean and 95th percentile
        // per component (wishart_sigma_eigen.csv). Ours: Wishart(Sigma, 59) by Bartlett with Sigma's Cholesky factor.
        var sigma = Matrix("wishart_sigma.csv");
        int p = 5, df = 59, reps = 20_000;
        var c = new double[p * p];
        for (int i = 0; i < p; i++) for (int j = 0; j < p; j++) c[i * p + j] = sigma[i, j];
        ItemReduce.Core.LinearAlgebra.CholeskyDecomposition.FactorInPlace(c, p);
        var eig = new double[reps][];
        double[] l = new double[p * p], a = new double[p * p], w = new double[p * p];
        for (int r = 0; r < reps; r++)
        {
            BartlettWishartSampler.SampleCorrelationInto(p, df, c, RandomStream.ForTask(5, r), l, a, w);
            eig[r] = ItemReduce.Core.LinearAlgebra.SymmetricEigensolver.Eigenvalues(ItemReduce.Core.LinearAlgebra.MatrixChecks.FromRowMajor(w, p));
        }
        var (mean, p95) = ParallelAnalysis.Summarise(eig, p, 95);
        foreach (var f in Fields("wishart_sigma_eigen.csv"))
        {
            int k = int.Parse(f[0], CultureInfo.InvariantCulture) - 1;
            // Tolerances: a few Monte-Carlo standard errors of two independent 20,000-replicate runs.
            Assert.Equal(Parse(f[1]), mean[k], 0.01);
            Assert.Equal(Parse(f[2]), p95[k], 0.02);
        }
    }

    [Fact]
    public void Comparison_population_reproduces_an_exact_k_factor_matrix()
    {
        // Fact of the model: a correlation matrix that is exactly Lambda Lambda' + Psi with two factors is its own
        // two-factor minimum-residual fit, so the two-factor comparison population equals it.
        double[,] lambda = { { .7, 0 }, { .6, .1 }, { .5, 0 }, { .65, 0 }, { 0, .7 }, { .1, .6 }, { 0, .5 }, { 0, .55 } };
        int p = 8;
        var r = new double[p, p];
        for (int i = 0; i < p; i++)
            for (int j = 0; j < p; j++)
                r[i, j] = i == j ? 1 : lambda[i, 0] * lambda[j, 0] + lambda[i, 1] * lambda[j, 1];
        var sigma = ComparisonData.Population(MatrixHelpers.ToMatrix(r), 2);
        for (int i = 0; i < p; i++)
            for (int j = 0; j < p; j++) Assert.Equal(r[i, j], sigma[i, j], 1e-5);
    }

    [Fact]
    public void Comparison_data_finds_a_clear_planted_structure_and_keeps_one_factor_for_one_factor_data()
    {
        // Planted truth: continuous data from 3 and from 1 simple-structure factors (loadings .65, factor correlation
        // .2, n = 500, our simulator); the planted count is the expected value.
        foreach (int k in new[] { 1, 3 })
        {
            var spec = ItemReduce.Simulation.FactorModelSpec.Simple(k, 5, 0.65, 0.2, categories: 0);
            var data = ItemReduce.Simulation.FactorModelSimulator.Generate(spec, new(500, (ulong)(40 + k))).Responses;
            var r = PearsonCorrelation.Compute(data);
            var eig = ItemReduce.Core.LinearAlgebra.SymmetricEigensolver.Eigenvalues(r);
            var result = ComparisonData.Run(r, eig, 500, new ComparisonDataOptions { Samples = 200, Seed = 3 });
            Assert.Equal(k, result.Count);
            Assert.Equal(result.MeanRmsr.Length, result.PValues.Length);
            Assert.True(double.IsNaN(result.PValues[0]));
        }
    }

    [Fact]
    public void Comparison_data_is_identical_for_any_thread_count()
    {
        var r = PearsonCorrelation.Compute(Responses("iris.csv"));
        var eig = ItemReduce.Core.LinearAlgebra.SymmetricEigensolver.Eigenvalues(r);
        var one = ComparisonData.Run(r, eig, 150, new ComparisonDataOptions { Samples = 60, MaxDegreeOfParallelism = 1 });
        var many = ComparisonData.Run(r, eig, 150, new ComparisonDataOptions { Samples = 60, MaxDegreeOfParallelism = 4 });
        Assert.Equal(one.MeanRmsr, many.MeanRmsr);
        Assert.Equal(one.Count, many.Count);
    }

    [Fact]
    public void Quoted_study_accuracy_matches_the_committed_study_tables()
    {
        // Outside reference: the committed per-data-set results of the simulation study
        // (benchmarks/results/dimensions-study-2026-12-02/grid-datasets.csv); the appendix quotes these hit rates.
        string d = AppContext.BaseDirectory;
        while (!File.Exists(Path.Combine(d, "ItemReduce.sln"))) d = Path.GetDirectoryName(d)!;
        var lines = File.ReadAllLines(Path.Combine(d, "benchmarks", "results", "dimensions-study-2026-12-02", "grid-datasets.csv"));
        var header = lines[0].Split(',');
        int factors = Array.IndexOf(header, "factors"), n = Array.IndexOf(header, "respondents"), rule = Array.IndexOf(header, "pa-reduced-95");
        var rows = lines.Skip(1).Where(l => l.Length > 0).Select(l => l.Split(',')).ToList();
        Assert.Equal(RetentionStudyAccuracy.Surveys, rows.Count);
        Assert.Equal(RetentionStudyAccuracy.Overall, rows.Average(f => f[factors] == f[rule] ? 1.0 : 0.0), 5e-5);
        int hull = Array.IndexOf(header, "hull");
        Assert.Equal(RetentionStudyAccuracy.HullOverall, rows.Average(f => f[factors] == f[hull] ? 1.0 : 0.0), 5e-5);
        foreach (int level in new[] { 200, 500, 1000 })
        {
            var at = rows.Where(f => f[n] == level.ToString(CultureInfo.InvariantCulture)).ToList();
            Assert.Equal(936, at.Count);
            Assert.Equal(RetentionStudyAccuracy.Nearest(level).HitRate, at.Average(f => f[factors] == f[rule] ? 1.0 : 0.0), 5e-5);
        }
        // The combined rule's counts: grid-combined-boosted.csv (cell, set, count), written by the study program's rescore
        // mode from the features stored in grid-datasets.csv, same row order.
        var boosted = File.ReadAllLines(Path.Combine(d, "benchmarks", "results", "dimensions-study-2026-12-02", "grid-combined-boosted.csv"))
            .Skip(1).Where(l => l.Length > 0).Select(l => l.Split(',')).ToList();
        Assert.Equal(rows.Count, boosted.Count);
        int cell = Array.IndexOf(header, "cell"), set = Array.IndexOf(header, "set");
        Assert.All(Enumerable.Range(0, rows.Count), i => Assert.Equal((rows[i][cell], rows[i][set]), (boosted[i][0], boosted[i][1])));
        bool CombinedHit(int i) => rows[i][factors] == boosted[i][2];
        Assert.Equal(RetentionStudyAccuracy.CombinedOverall, Enumerable.Range(0, rows.Count).Average(i => CombinedHit(i) ? 1.0 : 0.0), 5e-5);
        foreach (int level in new[] { 200, 500, 1000 })
            Assert.Equal(RetentionStudyAccuracy.NearestCombined(level).HitRate,
                Enumerable.Range(0, rows.Count).Where(i => rows[i][n] == level.ToString(CultureInfo.InvariantCulture))
                    .Average(i => CombinedHit(i) ? 1.0 : 0.0), 5e-5);
        Assert.Equal(1000, RetentionStudyAccuracy.Nearest(912).Respondents);
        Assert.Equal(200, RetentionStudyAccuracy.Nearest(150).Respondents);
        Assert.Contains("99.5%", RetentionStudyAccuracy.Sentence(20_000));
    }

    [Fact]
    public void Hull_fit_index_matches_numpy()
    {
        // numpy: CAF = 1 − KMO of (R − ΛΛ'), anti-image from np.linalg.inv (hull_caf.csv), on the iris correlations
        // with arbitrary loadings.
        var matrices = new[] { Matrix("iris_correlation.csv"), null };
        int cases = 0;
        foreach (var f in Fields("hull_caf.csv"))
        {
            int c = int.Parse(f[0], CultureInfo.InvariantCulture), m = int.Parse(f[1], CultureInfo.InvariantCulture);
            if (c == 1) continue; // the second case's matrix is not stored; iris covers the computation
            var r = matrices[c]!;
            int p = r.GetLength(0);
            MathNet.Numerics.LinearAlgebra.Matrix<double>? l = null;
            if (m > 0)
            {
                var v = Split(f[2]);
                l = MathNet.Numerics.LinearAlgebra.Matrix<double>.Build.Dense(p, m, (i, j) => v[i * m + j]);
            }
            Assert.Equal(Parse(f[3]), HullMethod.CommonPartAccountedFor(r, l), 1e-12);
            cases++;
        }
        Assert.Equal(3, cases);
    }

    [Fact]
    public void Hull_selection_matches_numpy()
    {
        // numpy implementation of the selection steps (hull_select.csv): monotone fit, upper convex boundary,
        // scree-test values st and the chosen count.
        int cases = 0;
        foreach (var f in Fields("hull_select.csv"))
        {
            var fit = Split(f[1]);
            var par = Split(f[2]).Select(x => (int)x).ToArray();
            var onHull = Split(f[3]).Select(x => x == 1).ToArray();
            var hull = HullMethod.Hull(fit, par);
            Assert.Equal(onHull, Enumerable.Range(0, fit.Length).Select(hull.Contains).ToArray());
            Assert.Equal(int.Parse(f[5], CultureInfo.InvariantCulture), HullMethod.Select(fit, par, hull, out var st));
            var expectedSt = Split(f[4]);
            for (int m = 0; m < fit.Length; m++)
                if (double.IsNaN(expectedSt[m])) Assert.True(double.IsNaN(st[m]));
                else Assert.Equal(expectedSt[m], st[m], 1e-9);
            cases++;
        }
        Assert.Equal(4, cases);
    }

    [Fact]
    public void Hull_method_finds_clear_planted_structures()
    {
        // Planted truth: continuous data from 2 and 4 simple-structure factors (loadings .65, r = .2, n = 800), upper
        // bound J = planted + 1 as with an exact parallel analysis.
        foreach (int k in new[] { 2, 4 })
        {
            var spec = ItemReduce.Simulation.FactorModelSpec.Simple(k, 5, 0.65, 0.2, categories: 0);
            var data = ItemReduce.Simulation.FactorModelSimulator.Generate(spec, new(800, (ulong)(60 + k))).Responses;
            var res = HullMethod.Run(PearsonCorrelation.Compute(data), k + 1);
            Assert.True(k == res.Count, string.Join(" ", res.Fit.Select(x => x.ToString("F4", CultureInfo.InvariantCulture))) + " | " + string.Join(" ", res.ScreeTest));
            Assert.Equal(k + 2, res.Fit.Length);
        }
    }
}
