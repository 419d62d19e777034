using ItemReduce.Core;
using ItemReduce.Core.Dimensions;
using ItemReduce.Core.LinearAlgebra;
using ItemReduce.Core.Randomness;
using ItemReduce.Simulation;

namespace ItemReduce.Tests.Core.Dimensions;

public class ParallelAnalysisTests
{
    [Theory]
    [InlineData(1000, 100, 200)]
    [InlineData(4000, 200, 60)]
    public void Mean_largest_normal_reference_eigenvalue_sits_just_below_the_Marchenko_Pastur_edge(int n, int p, int reps)
    {
        // Marchenko & Pastur (1967), Math. USSR-Sbornik 1, 457–483: the spectrum of a p × p sample correlation
        // matrix of n uncorrelated variables has upper edge (1 + sqrt(p/n))². The largest eigenvalue fluctuates
        // on the Tracy–Widom scale σ = (√n + √p)(1/√n + 1/√p)^{1/3} / n (Johnstone 2001, Ann. Statist. 29,
        // 295–327, Theorem 1.1) around edge + μ_TW σ with μ_TW ≈ −1.21 (Tracy & Widom 1996; value from memory).
        // Finite-size corrections are O(σ), so we require edge − 3σ ≤ mean ≤ edge + 0.5σ.
        var reference = ParallelAnalysis.NormalReference(n, p, new ParallelAnalysisOptions
        {
            Replicates = reps,
            Seed = 42,
            IncludeReducedMatrix = false,
        });
        double edge = Math.Pow(1 + Math.Sqrt((double)p / n), 2);
        double sigma = (Math.Sqrt(n) + Math.Sqrt(p)) * Math.Pow(1 / Math.Sqrt(n) + 1 / Math.Sqrt(p), 1.0 / 3) / n;
        Assert.InRange(reference.Mean[0], edge - 3 * sigma, edge + 0.5 * sigma);
        // Spectrum sums to p (trace of a correlation matrix) — identity.
        Assert.Equal(p, reference.Mean.Sum(), 1e-9 * p);
    }

    private static double[][] WishartReplicates(int n, int p, int reps) =>
        Enumerable.Range(0, reps).Select(r =>
            SymmetricEigensolver.Eigenvalues(BartlettWishartSampler.SampleCorrelation(p, n - 1, RandomStream.ForTask(7, r, 1)))).ToArray();

    private static double[][] BruteForceReplicates(int n, int p, int reps) =>
        Enumerable.Range(0, reps).Select(r =>
        {
            var x = new double[n * p];
            var c = new double[p * p];
            ParallelAnalysis.BruteForceReplicate(n, p, RandomStream.ForTask(7, r, 2), x, c);
            var m = new double[p, p];
            Buffer.BlockCopy(c, 0, m, 0, c.Length * sizeof(double));
            return SymmetricEigensolver.Eigenvalues(m);
        }).ToArray();

    [Fact]
    public void Wishart_path_and_brute_force_simulation_agree_in_distribution()
    {
        // Both sample the eigenvalues of the correlation matrix of n i.i.d. N_p(0, I) vectors (Bartlett 1933).
        // Means: |difference| < 4.5 combined Monte-Carlo standard errors per component. Whole distribution of the
        // largest and smallest eigenvalue: two-sample Kolmogorov–Smirnov at α = 0.001, critical value
        // 1.95·sqrt(2/N) (asymptotic, from memory of standard tables).
        int n = 60, p = 8, reps = 3000;
        var a = WishartReplicates(n, p, reps);
        var b = BruteForceReplicates(n, p, reps);
        for (int c = 0; c < p; c++)
        {
            var xa = a.Select(e => e[c]).ToArray();
            var xb = b.Select(e => e[c]).ToArray();
            double se = Math.Sqrt(Variance(xa) / reps + Variance(xb) / reps);
            Assert.True(Math.Abs(xa.Average() - xb.Average()) < 4.5 * se, $"component {c + 1}: {xa.Average()} vs {xb.Average()} (SE {se})");
            if (c == 0 || c == p - 1)
            {
                Assert.True(KolmogorovSmirnov(xa, xb) < 1.95 * Math.Sqrt(2.0 / reps), $"KS for component {c + 1}");
                // 95th percentiles: asymptotic SE of a sample quantile sqrt(q(1 − q)/N) / f(x_q) (e.g. Serfling 1980,
                // Approximation Theorems of Mathematical Statistics, Section 2.3.3), with the density f estimated
                // from the pooled sample as 0.04 / (x_0.97 − x_0.93); tolerance 4.5 combined SEs.
                var pooled = xa.Concat(xb).Order().ToArray();
                double f = 0.04 / (ParallelAnalysis.Quantile(pooled, 0.97) - ParallelAnalysis.Quantile(pooled, 0.93));
                double seQ = Math.Sqrt(0.95 * 0.05 / reps) / f;
                double qa = ParallelAnalysis.Quantile(xa.Order().ToArray(), 0.95), qb = ParallelAnalysis.Quantile(xb.Order().ToArray(), 0.95);
                Assert.True(Math.Abs(qa - qb) < 4.5 * Math.Sqrt(2) * seQ, $"95th percentile of component {c + 1}: {qa} vs {qb}");
            }
        }
    }

    private static double Variance(double[] x)
    {
        double m = x.Average();
        return x.Sum(v => (v - m) * (v - m)) / (x.Length - 1);
    }

    private static double KolmogorovSmirnov(double[] a, double[] b)
    {
        var sa = a.Order().ToArray();
        var sb = b.Order().ToArray();
        int i = 0, j = 0;
        double d = 0;
        while (i < sa.Length && j < sb.Length)
        {
            double x = Math.Min(sa[i], sb[j]);
            while (i < sa.Length && sa[i] <= x) i++;
            while (j < sb.Length && sb[j] <= x) j++;
            d = Math.Max(d, Math.Abs((double)i / sa.Length - (double)j / sb.Length));
        }
        return d;
    }

    [Fact]
    public void Results_do_not_depend_on_the_number_of_threads()
    {
        var o = new ParallelAnalysisOptions { Replicates = 64, Seed = 123 };
        var one = ParallelAnalysis.NormalReference(300, 20, o with { MaxDegreeOfParallelism = 1 });
        var two = ParallelAnalysis.NormalReference(300, 20, o with { MaxDegreeOfParallelism = 2 });
        Assert.Equal(one.Mean, two.Mean);
        Assert.Equal(one.Percentile, two.Percentile);
        Assert.Equal(one.ReducedMean, two.ReducedMean);
        Assert.Equal(one.ReducedPercentile, two.ReducedPercentile);

        var survey = FactorModelSimulator.Generate(FactorModelSpec.Simple(2, 4, 0.6), new FactorModelSimulator.Settings(200, 5, MissingRate: 0.05));
        double[,] Correlate(ItemReduce.Core.Data.ResponseMatrix d) => ItemReduce.Core.Correlation.PearsonCorrelation.Compute(d);
        var p1 = ParallelAnalysis.PermutationReference(survey.Responses, Correlate, o with { MaxDegreeOfParallelism = 1 });
        var p2 = ParallelAnalysis.PermutationReference(survey.Responses, Correlate, o with { MaxDegreeOfParallelism = 2 });
        Assert.Equal(p1.Percentile, p2.Percentile);
        Assert.Equal(p1.ReducedPercentile, p2.ReducedPercentile);
    }

    [Fact]
    public void Different_seeds_give_different_references_and_the_same_seed_the_same()
    {
        var o = new ParallelAnalysisOptions { Replicates = 20, IncludeReducedMatrix = false };
        var a = ParallelAnalysis.NormalReference(100, 5, o with { Seed = 1 });
        var b = ParallelAnalysis.NormalReference(100, 5, o with { Seed = 1 });
        var c = ParallelAnalysis.NormalReference(100, 5, o with { Seed = 2 });
        Assert.Equal(a.Mean, b.Mean);
        Assert.NotEqual(a.Mean, c.Mean);
    }

    [Fact]
    public void Retained_count_stops_at_the_first_eigenvalue_not_above_the_reference()
    {
        // Horn's rule applied sequentially (common practice, no source for the stopping convention).
        Assert.Equal(1, ParallelAnalysis.RetainedCount([3.0, 0.9, 1.5], [1.2, 1.1, 1.0]));
        Assert.Equal(0, ParallelAnalysis.RetainedCount([1.0, 0.9], [1.0, 0.8])); // equality is not "exceeds"
        Assert.Equal(2, ParallelAnalysis.RetainedCount([2.0, 1.5], [1.2, 1.1]));
    }

    [Fact]
    public void Quantile_is_hyndman_fan_type_7()
    {
        // Hyndman & Fan (1996) type 7, hand-computed: h = (5 − 1)·0.95 = 3.8 ⇒ 4 + 0.8·(5 − 4) = 4.8
        // (also numpy.percentile([1,2,3,4,5], 95), numpy's default "linear" method).
        Assert.Equal(4.8, ParallelAnalysis.Quantile([1, 2, 3, 4, 5], 0.95), 1e-15);
        Assert.Equal(3.0, ParallelAnalysis.Quantile([1, 2, 3, 4, 5], 0.5), 1e-15);
    }

    [Fact]
    public void Invalid_options_are_rejected_with_the_allowed_range()
    {
        var ex = Assert.Throws<ArgumentException>(() => ParallelAnalysis.NormalReference(100, 5, new ParallelAnalysisOptions { Replicates = 5 }));
        Assert.Contains("[10, 100000]", ex.Message);
        Assert.Throws<ArgumentException>(() => ParallelAnalysis.NormalReference(100, 5, new ParallelAnalysisOptions { Percentile = 100 }));
        Assert.Throws<DataConditionException>(() => ParallelAnalysis.NormalReference(5, 5, new ParallelAnalysisOptions()));
    }
}
