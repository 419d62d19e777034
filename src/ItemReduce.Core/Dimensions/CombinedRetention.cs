namespace ItemReduce.Core.Dimensions;

/// <summary>Outcome of <see cref="CombinedRetention"/>.</summary>
/// <param name="Count">Number of factors retained.</param>
/// <param name="Start">The reduced-matrix parallel-analysis count the model starts from.</param>
/// <param name="Probabilities">Model probability of each step from <see cref="CombinedRetention.Steps"/> (count = start +
/// step); 0 for steps that would leave the allowed range.</param>
/// <param name="Features">The observable quantities the model read, in the order of <see cref="CombinedRetention.FeatureNames"/>.</param>
public sealed record CombinedRetentionResult(int Count, int Start, double[] Probabilities, double[] Features);

/// <summary>
/// Combined retention rule: gradient-boosted trees that read what the single rules found on one survey and correct
/// the reduced-matrix parallel-analysis count by −2 … +2. The idea of learning the number of factors from observable
/// features of simulated data with known structure follows Goretzko, D., &amp; Bühner, M. (2020). One model to rule
/// them all? Using machine learning algorithms to determine the number of factors in exploratory factor analysis.
/// Psychological Methods, 25(6), 776–786 (their "factor forest" is a tree ensemble on eigenvalue features; ours is a
/// smaller ensemble whose inputs are the published rules' own outputs). Auerswald, M., &amp; Moshagen, M. (2019). How
/// to determine the number of factors to retain in exploratory factor analysis: A comparison of extraction methods
/// under realistic conditions. Psychological Methods, 24(4), 468–491, recommend combining rules. The ensemble is
/// K-class gradient boosting (Friedman 2001, <see cref="BoostedTrees"/>): 300 rounds × 5 trees of depth ≤ 3.
/// <para>
/// Steps: (1) <see cref="Features"/>: the differences between each rule's count and the reduced-matrix count m, the
/// size of the survey (ln n, ln p, ln(p / m)) and how far the eigenvalues at m, m + 1 and m + 2 stand above or below
/// the random reference, in units of the reference's spread; (2) a score per step s: the start value plus the
/// shrunk leaf values of the step's trees; (3) keep the step with the highest score among those that
/// give a count in [max(1, m − 2) … m + 2], upwards no more than the largest count a factor model with positive
/// degrees of freedom allows and never above one factor when m ≤ 1 (a guard against splitting one-factor data;
/// from m = 0 the count stays 0 or becomes 1).
/// The coefficients (<see cref="CombinedRetentionModel"/>) were fitted by the project's own study program on a separate,
/// seeded training design of invented surveys, never on the evaluation grid (provenance in that file).
/// </para>
/// </summary>
public static class CombinedRetention
{
    /// <summary>Steps from the reduced-matrix count, one class of the model each.</summary>
    public static readonly int[] Steps = [-2, -1, 0, 1, 2];

    /// <summary>Names of the features, in order (also the column names of the study's tables).</summary>
    public static readonly string[] FeatureNames =
    [
        "d_pca95", "d_pca_mean", "d_reduced_mean", "d_cd", "d_ekc", "d_kaiser", "d_map",
        "ln_n", "ln_p", "ln_items_per_factor",
        "z_reduced_m", "z_reduced_m1", "z_reduced_m2", "z_pca_m", "z_pca_m1", "z_pca_m2",
        "ln_gap_m", "cd_p_m1",
    ];

    /// <summary>Largest difference between a rule and the reduced-matrix count that the features distinguish.</summary>
    internal const int DifferenceCap = 3;

    /// <summary>The observable features of one survey (see the type summary). <paramref name="m"/> is the
    /// reduced-matrix parallel-analysis count.</summary>
    public static double[] Features(RuleCounts counts, int m, IReadOnlyList<double> eigenvalues, IReadOnlyList<double> reducedEigenvalues,
        ParallelAnalysisReference reference, ComparisonDataResult? comparison, int respondents)
    {
        ArgumentNullException.ThrowIfNull(counts);
        ArgumentNullException.ThrowIfNull(eigenvalues);
        ArgumentNullException.ThrowIfNull(reducedEigenvalues);
        ArgumentNullException.ThrowIfNull(reference);
        if (reference.ReducedMean is null || reference.ReducedPercentile is null)
            throw new ArgumentException("The combined rule needs the reduced-matrix reference.", nameof(reference));
        int p = eigenvalues.Count;
        double D(int? k) => Math.Clamp((k ?? m) - m, -DifferenceCap, DifferenceCap);
        var x = new double[FeatureNames.Length];
        x[0] = D(counts.Parallel);
        x[1] = D(counts.ParallelMean);
        x[2] = D(counts.ParallelReducedMean);
        x[3] = D(counts.ComparisonData);
        x[4] = D(counts.EmpiricalKaiser);
        x[5] = D(counts.Kaiser);
        x[6] = D(counts.Map);
        x[7] = Math.Log(respondents);
        x[8] = Math.Log(p);
        x[9] = Math.Log((double)p / Math.Max(m, 1));
        x[10] = Standardised(reducedEigenvalues, reference.ReducedMean, reference.ReducedPercentile, m);
        x[11] = Standardised(reducedEigenvalues, reference.ReducedMean, reference.ReducedPercentile, m + 1);
        x[12] = Standardised(reducedEigenvalues, reference.ReducedMean, reference.ReducedPercentile, m + 2);
        x[13] = Standardised(eigenvalues, reference.Mean, reference.Percentile, m);
        x[14] = Standardised(eigenvalues, reference.Mean, reference.Percentile, m + 1);
        x[15] = Standardised(eigenvalues, reference.Mean, reference.Percentile, m + 2);
        x[16] = m >= 1 && m < p ? Math.Log(Math.Max(eigenvalues[m - 1], 1e-12) / Math.Max(eigenvalues[m], 1e-12)) : 0;
        x[17] = comparison is { } cd && m + 1 <= cd.PValues.Length && m >= 1 ? cd.PValues[m] : 1;
        return x;
    }

    /// <summary>asinh of how far eigenvalue number <paramref name="component"/> (1-based) lies above the reference mean, in
    /// units of (percentile − mean) / 1.645, i.e. about a z-score at the 95th percentile; 0 outside 1..p.</summary>
    internal static double Standardised(IReadOnlyList<double> observed, IReadOnlyList<double> mean, IReadOnlyList<double> percentile, int component)
    {
        if (component < 1 || component > observed.Count) return 0;
        int j = component - 1;
        double spread = Math.Max((percentile[j] - mean[j]) / 1.6448536269514722, 1e-9);
        return Math.Asinh((observed[j] - mean[j]) / spread);
    }

    /// <summary>Which steps are allowed from the reduced-matrix count <paramref name="m"/>: not below one factor (nor below
    /// 0), never more than one factor when m ≤ 1 (so one-factor data is not split by the model), and upwards no more
    /// than <paramref name="maxCount"/>.</summary>
    public static bool[] Allowed(int m, int maxCount)
    {
        int lowest = Math.Max(Math.Min(1, m), m - 2);
        int highest = m <= 1 ? 1 : Math.Max(m, maxCount);
        return Steps.Select(step => m + step >= lowest && (step <= 0 || m + step <= highest)).ToArray();
    }

    /// <summary>Applies the fitted model to features of a survey of <paramref name="items"/> items whose reduced-matrix
    /// count is <paramref name="m"/>. Counts above m are allowed only up to the largest count a k-factor model can have
    /// with positive degrees of freedom (<see cref="ComparisonData.MaxFactors"/>).</summary>
    public static CombinedRetentionResult Decide(double[] features, int m, int items) =>
        Decide(features, m, ComparisonData.MaxFactors(items), CombinedRetentionModel.Trees);

    /// <summary>As <see cref="Decide(double[], int, int)"/> with an explicit model (used by the study program while fitting).</summary>
    public static CombinedRetentionResult Decide(double[] features, int m, int maxCount, BoostedTrees model)
    {
        ArgumentNullException.ThrowIfNull(features);
        ArgumentNullException.ThrowIfNull(model);
        return Choose(model.Scores(features), m, maxCount, features);
    }

    /// <summary>The step with the highest class score among the allowed ones (<see cref="Allowed"/>), and the softmax
    /// probabilities of the allowed steps (0 for the others).</summary>
    internal static CombinedRetentionResult Choose(double[] score, int m, int maxCount, double[] features)
    {
        int s = Steps.Length;
        var allowed = Allowed(m, maxCount);
        double top = double.NegativeInfinity;
        for (int c = 0; c < s; c++) if (allowed[c]) top = Math.Max(top, score[c]);
        var prob = new double[s];
        double sum = 0;
        for (int c = 0; c < s; c++) { prob[c] = allowed[c] ? Math.Exp(score[c] - top) : 0; sum += prob[c]; }
        int best = Array.IndexOf(Steps, 0);
        for (int c = 0; c < s; c++)
        {
            prob[c] /= sum;
            if (allowed[c] && prob[c] > prob[best]) best = c;
        }
        return new CombinedRetentionResult(m + Steps[best], m, prob, features);
    }
}
