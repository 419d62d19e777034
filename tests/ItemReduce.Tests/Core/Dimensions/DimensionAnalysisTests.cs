using ItemReduce.Core;
using ItemReduce.Core.Correlation;
using ItemReduce.Core.Data;
using ItemReduce.Core.Dimensions;
using ItemReduce.Core.Randomness;
using ItemReduce.Simulation;
using static ItemReduce.Tests.Core.Dimensions.DimensionsReferenceData;

namespace ItemReduce.Tests.Core.Dimensions;

public class DimensionAnalysisTests
{
    private static ResponseMatrix Planted(int factors, int itemsPerFactor, int n, ulong seed, double loading = 0.65, double missing = 0) =>
        FactorModelSimulator.Generate(FactorModelSpec.Simple(factors, itemsPerFactor, loading, factorCorrelation: 0.2),
            new FactorModelSimulator.Settings(n, seed, MissingRate: missing)).Responses;

    [Theory]
    [InlineData(1, 8, 300, ReferenceKind.Normal)]
    [InlineData(1, 8, 300, ReferenceKind.Permutation)]
    [InlineData(2, 6, 400, ReferenceKind.Normal)]
    [InlineData(2, 6, 400, ReferenceKind.Permutation)]
    [InlineData(3, 5, 600, ReferenceKind.Normal)]
    [InlineData(3, 5, 600, ReferenceKind.Permutation)]
    [InlineData(4, 6, 800, ReferenceKind.Normal)]
    public void Parallel_analysis_recovers_the_planted_number_of_factors(int k, int itemsPerFactor, int n, ReferenceKind reference)
    {
        // Known truth: FactorModelSimulator plants k correlated (φ = 0.2) factors, loadings 0.65, 5 categories.
        var data = Planted(k, itemsPerFactor, n, (ulong)(100 + k));
        var res = DimensionAnalysis.Run(data, new DimensionOptions { Replicates = 200, Reference = reference, Seed = 9 });
        Assert.Equal(k, res.ByRule.Parallel);
        Assert.Equal(k, res.ByRule.ParallelReduced);
        Assert.Equal(k, res.Retained);
        Assert.Equal(FactorsRule.ParallelReduced, res.RuleUsed);
        Assert.Equal(k, res.ByRule.Map);
        Assert.Equal(k, res.ByRule.EmpiricalKaiser);
        Assert.Equal(k, res.ByRule.ComparisonData);
    }

    [Fact]
    public void Missing_answers_pairwise_still_recover_the_planted_factors()
    {
        var data = Planted(2, 6, 500, 31, missing: 0.1);
        var res = DimensionAnalysis.Run(data, new DimensionOptions { Replicates = 100 });
        Assert.Equal(2, res.Retained);
        Assert.InRange(res.EffectiveRespondents, 350, 450); // ≈ 500 · 0.9² pairwise
        Assert.Contains(res.Warnings, w => w.Message.Contains("effective sample size"));
        var listwise = DimensionAnalysis.Run(data, new DimensionOptions { Replicates = 100, Correlation = new CorrelationOptions { MissingData = MissingDataHandling.Listwise } });
        Assert.Equal(2, listwise.Retained);
        Assert.Contains(listwise.Warnings, w => w.Message.Contains("Listwise"));
    }

    [Fact]
    public void Polychoric_option_recovers_planted_factors()
    {
        var data = Planted(2, 5, 500, 41);
        var res = DimensionAnalysis.Run(data, new DimensionOptions { Replicates = 100, Correlation = new CorrelationOptions { Kind = CorrelationKind.Polychoric } });
        Assert.Equal(CorrelationKind.Polychoric, res.CorrelationKind);
        Assert.Equal(2, res.Retained);
        // Polychoric correlations of discretised normal data exceed the attenuated Pearson ones on average.
        var pearson = PearsonCorrelation.Compute(data);
        double sp = 0, sq = 0;
        for (int i = 0; i < 10; i++) for (int j = 0; j < i; j++) { sp += Math.Abs(pearson[i, j]); sq += Math.Abs(res.CorrelationMatrix[i, j]); }
        Assert.True(sq > sp);
    }

    [Fact]
    public void Iris_result_exposes_everything_for_the_tables_and_the_chart()
    {
        // Eigenvalues: np.linalg.eigvalsh of np.corrcoef(iris) (make_eigen_fixtures.py).
        var res = DimensionAnalysis.Run(Responses("iris.csv"), new DimensionOptions { Replicates = 100, Seed = 3 });
        AssertClose(Vector("iris_correlation_eigenvalues.csv"), res.Eigenvalues, 1e-12);
        Assert.False(res.SmoothingApplied);
        Assert.Equal(150, res.EffectiveRespondents);
        Assert.Equal(4, res.ReferenceMean.Length);
        Assert.Equal(4, res.ReferencePercentile.Length);
        Assert.Equal(4, res.ReducedEigenvalues!.Length);
        Assert.Equal(4, res.ReducedReferencePercentile!.Length);
        Assert.Equal(4, res.Msa.Length);
        Assert.Equal(6, res.Bartlett.DegreesOfFreedom);
        Assert.Equal(1.0, res.ProportionOfVariance.Sum(), 1e-12);
        var rows = res.Components;
        Assert.Equal([1, 2, 3, 4], rows.Select(r => r.Component));
        Assert.Equal(res.Retained, rows.Count(r => r.Retained));
        Assert.Equal(FactorsRule.ParallelReduced, res.RuleUsed);
        Assert.True(Enumerable.Range(0, res.Retained).All(c => res.ReducedEigenvalues[c] > res.ReducedReferencePercentile[c]));
        Assert.Equal(res.Retained, res.ByRule.ParallelReduced);
        Assert.Contains(res.Warnings, w => w.Message == KaiserCriterion.Caution);
        Assert.False(string.IsNullOrWhiteSpace(res.Reason));
        Assert.Equal(res.MapCurve.Length, res.MapRevisedCurve.Length);
    }

    [Fact]
    public void Fixed_count_overrides_the_rules_and_says_so()
    {
        // Property: a fixed count wins over the rules, which are still reported (planted truth k = 2).
        var res = DimensionAnalysis.Run(Planted(2, 5, 300, 5), new DimensionOptions { Replicates = 50, FixedFactors = 3 });
        Assert.Equal(3, res.Retained);
        Assert.Equal(FactorsRule.Fixed, res.RuleUsed);
        Assert.Contains("set to 3", res.Reason);
        Assert.Equal(2, res.ByRule.Parallel);
    }

    [Fact]
    public void Inconsistent_pairwise_correlations_are_smoothed_and_reported()
    {
        // Three groups of respondents each answer only two of three items: r_ab ≈ +1, r_bc ≈ +1, r_ac ≈ −1,
        // which no correlation matrix can hold, so the pairwise matrix is indefinite.
        var rng = new RandomStream(8);
        var v = new List<double>();
        for (int g = 0; g < 3; g++)
            for (int i = 0; i < 60; i++)
            {
                double z = rng.NextGaussian(), e = 0.2 * rng.NextGaussian();
                v.AddRange(g switch
                {
                    0 => [z, z + e, double.NaN],
                    1 => [double.NaN, z, z + e],
                    _ => [z, double.NaN, -z + e],
                });
            }
        var items = new[] { "a", "b", "c" }.Select(n => new ItemDefinition(n, null, false, -9, 9, null)).ToList();
        var data = new ResponseMatrix(Enumerable.Range(0, 180).Select(i => $"r{i}").ToList(), items, v.ToArray());
        var res = DimensionAnalysis.Run(data, new DimensionOptions { Replicates = 50 });
        Assert.True(res.SmoothingApplied);
        Assert.True(res.Smoothing.MinEigenvalueBefore < 0);
        Assert.True(res.Smoothing.MinEigenvalueAfter > 0);
        Assert.Contains(res.Warnings, w => w.Message.Contains("not positive definite"));
    }

    [Fact]
    public void Invalid_settings_are_rejected()
    {
        var data = Planted(1, 4, 100, 2);
        Assert.Throws<ArgumentException>(() => DimensionAnalysis.Run(data, new DimensionOptions { FactorsRule = FactorsRule.Fixed }));
        var ex = Assert.Throws<DataConditionException>(() => DimensionAnalysis.Run(data, new DimensionOptions { FixedFactors = 5 }));
        Assert.Contains("[1, 4]", ex.Message);
        Assert.Throws<ArgumentException>(() => DimensionAnalysis.Run(data, new DimensionOptions { Replicates = 0 }));
        Assert.Throws<DataConditionException>(() => DimensionAnalysis.Run(data.SelectRespondents([0, 1, 2, 3, 4]), new DimensionOptions()));
    }
}
