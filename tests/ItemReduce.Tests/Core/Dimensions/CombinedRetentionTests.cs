using System.Globalization;
using ItemReduce.Core.Dimensions;
using ItemReduce.Simulation;
using static ItemReduce.Tests.Core.Dimensions.DimensionsReferenceData;

namespace ItemReduce.Tests.Core.Dimensions;

/// <summary>
/// The combined retention rule: the boosting algorithm and the committed model against scikit-learn's
/// GradientBoostingClassifier (ReferenceData/Dimensions/make_combined_fixture.py → boosting_small.csv,
/// combined_grid_rows.csv), the step constraints, the feature scale and thread-count invariance.
/// </summary>
public class CombinedRetentionTests
{
    [Fact]
    public void Boosting_reproduces_scikit_learn_scores_on_invented_data()
    {
        // scikit-learn 1.2.1 GradientBoostingClassifier(n_estimators=25, learning_rate=0.1, max_depth=3) fitted on the
        // 160 "fit" rows; decision_function of all 240. On the fitted rows the scores depend only on how the trees
        // partition them, so they must agree to rounding. On the 80 held-out rows a cut point can differ where two
        // features split the fitted rows identically (scikit-learn tries the features in random order and keeps the
        // first of equal splits, we keep table order), so only the predicted class is compared there (≥ 76 of 80).
        var rows = Fields("boosting_small.csv");
        double[] X(string[] r) => r[2..7].Select(Parse).ToArray();
        int Argmax(IReadOnlyList<double> s) => Enumerable.Range(0, 3).MaxBy(c => s[c]);
        var fit = rows.Where(r => r[0] == "fit").ToArray();
        var labels = fit.Select(r => int.Parse(r[1], CultureInfo.InvariantCulture)).ToArray();
        var model = GradientBoosting.Fit(fit.Select(X).ToArray(), labels, 3, 25, 0.1, 3);
        Assert.Equal(160, fit.Length);
        foreach (var r in fit)
        {
            var s = model.Scores(X(r));
            for (int c = 0; c < 3; c++) Assert.Equal(Parse(r[7 + c]), s[c], 1e-9);
        }
        var heldOut = rows.Where(r => r[0] == "score").ToArray();
        Assert.Equal(80, heldOut.Length);
        int same = heldOut.Count(r => Argmax(model.Scores(X(r))) == Argmax(r[7..10].Select(Parse).ToArray()));
        Assert.True(same >= 76, $"{same} of 80");
    }

    [Fact]
    public void Committed_model_agrees_with_scikit_learn_fitted_on_the_training_tables()
    {
        // scikit-learn's fit of the same settings on the committed training tables, applied with the same allowed steps
        // to every 10th grid data set. scikit-learn visits the features in a random order and keeps the first of equal
        // splits, ours in table order, so trees can differ where two features split the same surveys; on the whole grid
        // the two disagreed on 11 of 2,808 surveys. Required here: at least 275 of the 281 rows.
        var rows = Fields("combined_grid_rows.csv");
        Assert.Equal(281, rows.Length);
        int f = CombinedRetention.FeatureNames.Length, agree = 0;
        foreach (var r in rows)
        {
            var x = r[3..(3 + f)].Select(Parse).ToArray();
            int m = int.Parse(r[1], CultureInfo.InvariantCulture), items = int.Parse(r[2], CultureInfo.InvariantCulture);
            if (CombinedRetention.Decide(x, m, items).Count == int.Parse(r[^1], CultureInfo.InvariantCulture)) agree++;
        }
        Assert.True(agree >= 275, $"{agree} of 281");
    }

    [Fact]
    public void Steps_stay_in_the_allowed_range()
    {
        // Construction of the rule (see CombinedRetention): the step with the highest score among the allowed ones.
        var features = new double[CombinedRetention.FeatureNames.Length];
        foreach (int favoured in new[] { 0, 1, 3, 4 })
        {
            var score = new double[CombinedRetention.Steps.Length];
            score[favoured] = 5;
            int step = CombinedRetention.Steps[favoured];
            // A favoured step outside the allowed range leaves the count unchanged (all other scores are equal).
            int Expected(int m, int lowest, int highest) => m + step >= lowest && m + step <= highest ? m + step : m;
            // m = 3, 30 items: every step allowed.
            Assert.Equal(Expected(3, 1, 5), CombinedRetention.Choose(score, 3, ComparisonData.MaxFactors(30), features).Count);
            // m = 1: neither down to 0 nor up; m = 0: 0 or 1.
            Assert.Equal(1, CombinedRetention.Choose(score, 1, ComparisonData.MaxFactors(30), features).Count);
            Assert.Equal(Expected(0, 0, 1), CombinedRetention.Choose(score, 0, ComparisonData.MaxFactors(30), features).Count);
            // 6 items: a factor model needs positive degrees of freedom, (6 − k)² > 6 + k, so at most 2 factors; at least 1.
            Assert.Equal(Expected(2, 1, 2), CombinedRetention.Choose(score, 2, ComparisonData.MaxFactors(6), features).Count);
            var probabilities = CombinedRetention.Choose(score, 2, 10, features).Probabilities;
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
