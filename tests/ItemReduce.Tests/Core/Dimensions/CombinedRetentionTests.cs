using System.Globalization;
using ItemReduce.Core.Dimensions;
using ItemReduce.Simulation;
using static ItemReduce.Tests.Core.Dimensions.DimensionsReferenceData;

namespace ItemReduce.Tests.Core.Dimensions;

/// <summary>
/// The combined retention rule: its committed coefficients against an independent scipy fit of the same penalised
/// likelihood on the committed training table (ReferenceData/Dimensions/make_combined_fixture.py → combined_fit.csv),
/// the step constraints, the feature scale and thread-count invariance.
/// </summary>
public class CombinedRetentionTests
{
    [Fact]
    public void Committed_coefficients_match_an_independent_scipy_fit_of_the_training_table()
    {
        // scipy.optimize.minimize (L-BFGS-B) of the same objective on benchmarks/results/.../training-datasets.csv;
        // the committed file came from the study program's Newton iterations.
        int f = CombinedRetention.FeatureNames.Length;
        var rows = Fields("combined_fit.csv").ToList();
        double Value(string kind, int index) => Parse(rows.Single(r => r[0] == kind && r[1] == index.ToString(CultureInfo.InvariantCulture))[2]);
        Assert.Equal(CombinedRetentionModel.Ridge, Value("ridge", 0));
        for (int j = 0; j < f; j++)
        {
            Assert.Equal(Value("mean", j), CombinedRetentionModel.Means[j], 1e-9);
            Assert.Equal(Value("sd", j), CombinedRetentionModel.StandardDeviations[j], 1e-9);
        }
        for (int c = 0; c < CombinedRetention.Steps.Length; c++)
        {
            Assert.Equal(Value("intercept", c), CombinedRetentionModel.Intercepts[c], 2e-4);
            for (int j = 0; j < f; j++) Assert.Equal(Value("weight", c * f + j), CombinedRetentionModel.Weights[c, j], 2e-4);
        }
    }

    [Fact]
    public void Steps_stay_in_the_allowed_range()
    {
        // Construction of the rule (see CombinedRetention): the step with the highest score among the allowed ones.
        int f = CombinedRetention.FeatureNames.Length, s = CombinedRetention.Steps.Length;
        var zero = new double[f];
        var ones = Enumerable.Repeat(1.0, f).ToArray();
        foreach (int favoured in new[] { 0, 1, 3, 4 })
        {
            var intercepts = new double[s];
            intercepts[favoured] = 5;
            var w = new double[s, f];
            int step = CombinedRetention.Steps[favoured];
            // A favoured step outside the allowed range leaves the count unchanged (all other scores are equal).
            int Expected(int m, int lowest, int highest) => m + step >= lowest && m + step <= highest ? m + step : m;
            // m = 3, 30 items: every step allowed.
            Assert.Equal(Expected(3, 1, 5), CombinedRetention.Decide(zero, 3, ComparisonData.MaxFactors(30), zero, ones, intercepts, w).Count);
            // m = 1: neither down to 0 nor up; m = 0: 0 or 1.
            Assert.Equal(1, CombinedRetention.Decide(zero, 1, ComparisonData.MaxFactors(30), zero, ones, intercepts, w).Count);
            Assert.Equal(Expected(0, 0, 1), CombinedRetention.Decide(zero, 0, ComparisonData.MaxFactors(30), zero, ones, intercepts, w).Count);
            // 6 items: a factor model needs positive degrees of freedom, (6 − k)² > 6 + k, so at most 2 factors; at least 1.
            Assert.Equal(Expected(2, 1, 2), CombinedRetention.Decide(zero, 2, ComparisonData.MaxFactors(6), zero, ones, intercepts, w).Count);
            var probabilities = CombinedRetention.Decide(zero, 2, 10, zero, ones, intercepts, w).Probabilities;
            Assert.Equal(1.0, probabilities.Sum(), 1e-12);
            Assert.Equal(0.0, probabilities[0]);
        }
    }

    [Fact]
    public void Eigenvalue_margin_is_in_units_of_the_reference_spread()
    {
        // Fact of the trade: the 95th percentile of a normal distribution lies 1.6449 standard deviations above the mean.
        double[] mean = [2.0, 1.0], p95 = [2.5, 1.2];
        Assert.Equal(Math.Asinh(1.6448536), CombinedRetention.Standardised([2.5, 0.5], mean, p95, 1), 1e-6);
        Assert.Equal(Math.Asinh(-0.5 / (0.2 / 1.6448536)), CombinedRetention.Standardised([2.5, 0.5], mean, p95, 2), 1e-6);
        Assert.Equal(0.0, CombinedRetention.Standardised([2.5, 0.5], mean, p95, 0));
        Assert.Equal(0.0, CombinedRetention.Standardised([2.5, 0.5], mean, p95, 3));
    }

    [Fact]
    public void Combined_rule_is_identical_for_any_thread_count_and_finds_a_clear_structure()
    {
        // Planted truth: three factors of six items with loadings .7, 500 respondents (a structure every published
        // rule recovers; common practice, no source).
        var spec = FactorModelSpec.Simple(3, 6, 0.7, 0.2, categories: 5);
        var data = FactorModelSimulator.Generate(spec, new FactorModelSimulator.Settings(500, 11)).Responses;
        var one = DimensionAnalysis.Run(data, new DimensionOptions { Replicates = 100, FactorsRule = FactorsRule.Combined, MaxDegreeOfParallelism = 1 });
        var many = DimensionAnalysis.Run(data, new DimensionOptions { Replicates = 100, FactorsRule = FactorsRule.Combined, MaxDegreeOfParallelism = 3 });
        Assert.Equal(3, one.Retained);
        Assert.Equal(FactorsRule.Combined, one.RuleUsed);
        Assert.Equal(one.Combined!.Probabilities, many.Combined!.Probabilities);
        Assert.Equal(one.Combined.Features, many.Combined.Features);
        Assert.Contains("combined rule", one.Reason, StringComparison.Ordinal);
    }
}
