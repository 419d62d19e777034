namespace ItemReduce.Core.Screening;

/// <summary>
/// Options of the respondent-screening stage (<see cref="RespondentScreening"/>). Every threshold is a
/// suggestion for human review, never a rule for automatic deletion.
/// </summary>
public sealed record ScreeningOptions
{
    /// <summary>Upper end (excluded) of <see cref="CutoffP"/>; the lower end 0 is excluded too.</summary>
    public const double MaxCutoffP = 0.5;

    /// <summary>Upper end (excluded) of <see cref="MissingLimit"/>; the lower end 0 is included.</summary>
    public const double MaxMissingShareLimit = 1;

    /// <summary>
    /// Upper-tail probability of the distance cutoff: a respondent is atypical when P(χ²_df &gt; D²) &lt; CutoffP with
    /// df = items answered. Default 0.001 (common practice in multivariate outlier screening, no source).
    /// Range (0, 0.5).
    /// </summary>
    public double CutoffP { get; init; } = 0.001;

    /// <summary>Flag by the robust (ER estimate) distance when true (default), by the classical distance when false.
    /// Both distances are always reported when they can be computed. With fewer than 10 respondents per item the
    /// classical distance raises the flags even when this is true (with a warning).</summary>
    public bool UseRobust { get; init; } = true;

    /// <summary>
    /// Most respondents the robust estimate is fitted to; above this a systematic subsample of this size (every
    /// (n / cap)-th respondent) is used and the robust distances of all respondents are computed from that fit.
    /// Default 20,000 (the ER estimate makes a few dozen passes over its rows; at 20,000 rows the in-sample law
    /// is within about p / 20,000 of χ²); range ≥ 100.
    /// </summary>
    public int RobustMaxRows { get; init; } = 20_000;

    /// <summary>
    /// False: the robust fit takes plain fixed-point steps, without the SQUAREM extrapolation of <see cref="ErAlgorithm"/>
    /// (same fixed point to within the convergence tolerance, more passes over the rows). Not a user option: a switch
    /// for the comparisons in the tests and benchmarks. Default true.
    /// </summary>
    internal bool AccelerateRobustFit { get; init; } = true;

    /// <summary>
    /// Long-string limit as a share of the number of items: a run of identical consecutive answers at least
    /// max(<see cref="LongStringMinimum"/>, ⌈share × items⌉) long is flagged. Default 0.5 (our choice: half the
    /// questionnaire answered with one response option; common practice, no source). Range (0, 1].
    /// </summary>
    public double RunShare { get; init; } = 0.5;

    /// <summary>Smallest run length ever flagged, so short questionnaires are not over-flagged. Default 8 (our choice). Range ≥ 2.</summary>
    public int LongStringMinimum { get; init; } = 8;

    /// <summary>
    /// IRV (within-person SD, response-scale units) below this value is flagged as a flat profile. Default 0.2 (our
    /// choice for 5- to 7-point scales: one answer off an otherwise constant 20-item profile gives IRV ≈ 0.22;
    /// common practice is to inspect the low tail, no source). 0 disables the rule. Range ≥ 0.
    /// </summary>
    public double FlatSd { get; init; } = 0.2;

    /// <summary>
    /// Even-odd consistency below this value is flagged. Default −0.5 (our choice): the halves of the same scales
    /// clearly point in opposite directions. A threshold of 0 flagged 1.6–3 % of attentive simulated respondents even
    /// with 10 subscales (five- or six-item subscales, loadings 0.7), −0.5 about 0.5–0.9 %. Range [−1, 1].
    /// </summary>
    public double EvenOddMinimum { get; init; } = -0.5;

    /// <summary>Subscales (each with both halves answered) needed before even-odd consistency is computed and
    /// reported. Default 3, the least for a correlation. Range ≥ 3.</summary>
    public int EvenOddMinSubscales { get; init; } = 3;

    /// <summary>
    /// Subscales a respondent's even-odd coefficient must rest on before it can raise a flag. A correlation over a
    /// handful of points is very noisy: in our simulations (six-item subscales, loadings 0.7, factor correlations
    /// 0.3) the share of attentive respondents with a coefficient below −0.5 was 8.6 % with 4 subscales, 2.6 % with
    /// 6, 1.7 % with 8 and 0.5 % with 10. Default 10 (our choice); with fewer subscales the coefficient is reported
    /// but raises no flag. Range ≥ <see cref="EvenOddMinSubscales"/>.
    /// </summary>
    public int EvenOddFlagSubscales { get; init; } = 10;

    /// <summary>Share of items missing above which a respondent is flagged. Default 0.5 (common practice, no source). Range [0, 1).</summary>
    public double MissingLimit { get; init; } = 0.5;

    /// <summary>Throws <see cref="ArgumentException"/> naming the first option out of range.</summary>
    public void Validate()
    {
        static void Check(bool ok, string name, object value, string range)
        {
            if (!ok) throw new ArgumentException($"Screening option {name} = {value} is out of range; allowed: {range}.", name);
        }
        Check(CutoffP > 0 && CutoffP < MaxCutoffP, nameof(CutoffP), CutoffP, "(0, 0.5)");
        Check(RobustMaxRows >= 100, nameof(RobustMaxRows), RobustMaxRows, "≥ 100");
        Check(RunShare > 0 && RunShare <= 1, nameof(RunShare), RunShare, "(0, 1]");
        Check(LongStringMinimum >= 2, nameof(LongStringMinimum), LongStringMinimum, "≥ 2");
        Check(FlatSd >= 0 && !double.IsInfinity(FlatSd), nameof(FlatSd), FlatSd, "≥ 0, finite");
        Check(EvenOddMinimum >= -1 && EvenOddMinimum <= 1, nameof(EvenOddMinimum), EvenOddMinimum, "[−1, 1]");
        Check(EvenOddMinSubscales >= 3, nameof(EvenOddMinSubscales), EvenOddMinSubscales, "≥ 3");
        Check(EvenOddFlagSubscales >= EvenOddMinSubscales, nameof(EvenOddFlagSubscales), EvenOddFlagSubscales, $"≥ EvenOddMinSubscales ({EvenOddMinSubscales})");
        Check(MissingLimit >= 0 && MissingLimit < MaxMissingShareLimit, nameof(MissingLimit), MissingLimit, "[0, 1)");
    }
}
