namespace ItemReduce.Core.Screening;

/// <summary>Reason codes attached to flagged respondents (our own short kebab-case names).</summary>
public static class ScreeningReasons
{
    /// <summary>Robust (ER estimate) squared distance beyond the finite-sample cutoff for the items answered.</summary>
    public const string RobustDistance = "atypical-robust";

    /// <summary>Classical squared distance beyond the χ² cutoff (used for flags when the robust one is off or unavailable).</summary>
    public const string ClassicalDistance = "atypical-classical";

    /// <summary>Long run of identical consecutive answers (long-string index).</summary>
    public const string RepeatedAnswerRun = "repeated-answer-run";

    /// <summary>Very low within-person variability (IRV).</summary>
    public const string FlatProfile = "flat-profile";

    /// <summary>Low or negative even-odd consistency.</summary>
    public const string HalvesDisagree = "halves-disagree";

    /// <summary>More than the allowed share of items unanswered.</summary>
    public const string MostlyUnanswered = "mostly-unanswered";

    /// <summary>Long run of answers alternating between two values (alternating-run index).</summary>
    public const string AlternatingAnswers = "alternating-run";

    /// <summary>Answers more likely under uniform random answering than the fitted model allows an attentive respondent
    /// (<see cref="RandomAnsweringIndex"/> beyond its simulated cutoff).</summary>
    public const string RandomLikeAnswers = "random-like-answers";

    /// <summary>All codes in reporting order (new codes are appended).</summary>
    public static IReadOnlyList<string> All { get; } =
        [RobustDistance, ClassicalDistance, RepeatedAnswerRun, FlatProfile, HalvesDisagree, MostlyUnanswered, AlternatingAnswers, RandomLikeAnswers];
}
