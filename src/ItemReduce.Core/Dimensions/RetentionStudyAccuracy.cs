using System.Globalization;

namespace ItemReduce.Core.Dimensions;

/// <summary>
/// Measured accuracy of the default rule (<see cref="FactorsRule.ParallelReduced"/>) in the project's simulation
/// study (benchmarks/ItemReduce.DimensionStudy, results in benchmarks/results/dimensions-study-2026-12-02.md): 2,808
/// invented surveys, 1–6 factors, 3–10 four- to seven-point items per factor, symmetric and skewed answers, factor
/// correlations 0–.5, some cross-loadings, 936 surveys at each of n = 200, 500 and 1,000; 1,000 replicates. These are
/// the study's own numbers, copied here so the appendix can quote them; they must be updated when the study is re-run.
/// </summary>
public static class RetentionStudyAccuracy
{
    /// <summary>Respondent levels of the study and the default rule's hit rate at each.</summary>
    private static readonly (int Respondents, double HitRate)[] ByRespondents = [(200, 0.8216), (500, 0.9562), (1000, 0.9947)];

    /// <summary>Hit rate of the default rule over the whole study grid.</summary>
    public const double Overall = 0.9241;

    /// <summary>Respondent levels of the study and the combined rule's (<see cref="CombinedRetention"/>) hit rate at each.</summary>
    private static readonly (int Respondents, double HitRate)[] CombinedByRespondents = [(200, 0.8729), (500, 0.9829), (1000, 0.9957)];

    /// <summary>Hit rate of the combined rule over the whole study grid (its count recomputed from the stored features by
    /// the study program's rescore mode after the boosted model replaced the logistic one).</summary>
    public const double CombinedOverall = 0.9505;

    /// <summary>Hit rate of this project's <see cref="HullMethod"/> over the study grid (reported, not a default).</summary>
    public const double HullOverall = 0.5873;

    /// <summary>Surveys in the study.</summary>
    public const int Surveys = 2808;

    /// <summary>The study level nearest to <paramref name="respondents"/> (on a log scale) and the default rule's hit
    /// rate there; surveys larger than 1,000 get the 1,000 level (accuracy only grows with n in the study).</summary>
    public static (int Respondents, double HitRate) Nearest(int respondents)
    {
        double logN = Math.Log(Math.Max(respondents, 1));
        return ByRespondents.MinBy(l => Math.Abs(Math.Log(l.Respondents) - logN));
    }

    /// <summary>The study level nearest to <paramref name="respondents"/> and the combined rule's hit rate there.</summary>
    public static (int Respondents, double HitRate) NearestCombined(int respondents)
    {
        int level = Nearest(respondents).Respondents;
        return CombinedByRespondents.Single(l => l.Respondents == level);
    }

    /// <summary>The sentence of <see cref="Sentence"/> for the combined rule.</summary>
    public static string CombinedSentence(int respondents)
    {
        var (n, hit) = NearestCombined(respondents);
        return string.Create(CultureInfo.InvariantCulture,
            $"In simulated surveys of about this size ({n:N0} respondents; same design as for the default rule) the combined rule found the planted number of factors in {hit * 100:0.#}% of 936 surveys ({CombinedOverall * 100:0.#}% over all {Surveys:N0} surveys, against {Overall * 100:0.#}% for reduced-matrix parallel analysis); it was fitted on separate invented surveys, not on these.");
    }

    /// <summary>One sentence for reports: "In simulated surveys of about this size (500 respondents; …) the rule found
    /// the planted number of factors in 95.6% of 936 surveys (92.4% over all 2,808 surveys of 200 to 1,000 respondents)."</summary>
    public static string Sentence(int respondents)
    {
        var (n, hit) = Nearest(respondents);
        return string.Create(CultureInfo.InvariantCulture,
            $"In simulated surveys of about this size ({n:N0} respondents; 1–6 factors, 3–10 four- to seven-point items per factor, symmetric and skewed answers, factor correlations up to .5) the rule found the planted number of factors in {hit * 100:0.#}% of 936 surveys ({Overall * 100:0.#}% over all {Surveys:N0} surveys of 200 to 1,000 respondents).");
    }
}
