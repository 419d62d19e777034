namespace ItemReduce.Core.Screening;

/// <summary>Screening outcome of one respondent. NaN marks a value that could not be computed.</summary>
/// <param name="RespondentId">Id from the input, rows in input order.</param>
/// <param name="ItemsAnswered">Items answered = degrees of freedom of both distances.</param>
/// <param name="D2">Classical squared Mahalanobis distance (sample mean, pairwise n − 1 covariance) on the items answered.</param>
/// <param name="RobustD2">Robust squared distance (ER location and scatter, on the items' normal scores) on the items
/// answered; for a respondent outside the final estimate, the leave-in distance (<see cref="ErAlgorithm.LeaveIn"/>).
/// NaN when the robust fit is unavailable.</param>
/// <param name="Cutoff">Cutoff of the distance that raises the atypical flag, df = <paramref name="ItemsAnswered"/>: the
/// in-sample Beta quantile (<see cref="BetaDistanceLaw"/>) at <see cref="ScreeningOptions.CutoffP"/> times the ordinal
/// calibration factor when the robust rule is in use, otherwise the χ² upper quantile.</param>
/// <param name="PValue">P(χ²_df &gt; D2).</param>
/// <param name="RobustPValue">P(D² &gt; RobustD2 / f) under the law of <see cref="BetaDistanceLaw"/>, f the ordinal
/// calibration factor (<see cref="RobustEstimatorDetails.ConsistencyFactor"/>).</param>
/// <param name="LongString">Longest run of identical consecutive answers (0 with no answers).</param>
/// <param name="Irv">Within-person SD (n − 1) of the answers; NaN with fewer than 2 answers.</param>
/// <param name="EvenOdd">Spearman–Brown corrected even-odd consistency; NaN when not computable.</param>
/// <param name="MissingShare">Share of items not answered, in [0, 1].</param>
/// <param name="Flagged">True when at least one reason applies.</param>
/// <param name="Reasons">Reason codes from <see cref="ScreeningReasons"/>, in the order of <see cref="ScreeningReasons.All"/>.</param>
/// <param name="AlternatingRun">Longest run of answers alternating between two values (<see cref="Screening.AlternatingRun"/>).</param>
/// <param name="PersonTotal">Person–total correlation (<see cref="PersonTotalCorrelation"/>); NaN when not computable.</param>
/// <param name="Synonyms">Psychometric-synonyms coefficient (<see cref="PsychometricSynonyms"/>); NaN when not computable.</param>
/// <param name="Antonyms">Psychometric-antonyms coefficient; NaN when not computable.</param>
/// <param name="RandomAnswering">Log likelihood ratio of uniform random answering against the fitted model
/// (<see cref="RandomAnsweringIndex"/>); NaN when not computed.</param>
public sealed record RespondentScreeningRow(
    string RespondentId,
    int ItemsAnswered,
    double D2,
    double RobustD2,
    double Cutoff,
    double PValue,
    double RobustPValue,
    int LongString,
    double Irv,
    double EvenOdd,
    double MissingShare,
    bool Flagged,
    IReadOnlyList<string> Reasons,
    int AlternatingRun = 0,
    double PersonTotal = double.NaN,
    double Synonyms = double.NaN,
    double Antonyms = double.NaN,
    double RandomAnswering = double.NaN);

/// <summary>How many respondents carry one reason code.</summary>
public sealed record ScreeningReasonCount(string Code, string Meaning, int Count);

/// <summary>Details of the robust fit (the <see cref="ErAlgorithm"/> estimate; field names kept from the earlier
/// FAST-MCD fit, with the meanings below).</summary>
/// <param name="Available">False when the robust fit could not be made (see <paramref name="Note"/>); flags then use the classical distance.</param>
/// <param name="CompleteRows">Respondents who answered every item.</param>
/// <param name="Subsampled">True when a systematic subsample was used (more than <see cref="ScreeningOptions.RobustMaxRows"/> respondents).</param>
/// <param name="RowsUsed">Rows the estimate was fitted to (respondents who answered at least one item, or the subsample).</param>
/// <param name="SupportSize">Rows kept (weight 1) in the final step; the N of the finite-sample cutoff.</param>
/// <param name="ConsistencyFactor">Ordinal-answer calibration factor every robust cutoff is multiplied by
/// (<see cref="DiscretenessCalibration"/>; 1 when not applied).</param>
/// <param name="ReweightingFactor">Truncation factor applied to the covariance of the kept rows.</param>
/// <param name="ReweightedCount">Rows kept in the final step (same as <paramref name="SupportSize"/>).</param>
/// <param name="NestedExtension">Always false (no nested extension).</param>
/// <param name="SubsetCount">Always 1.</param>
/// <param name="MergedSetSize">Equal to <paramref name="RowsUsed"/>.</param>
/// <param name="InitialSubsets">Always 0: no random starts.</param>
/// <param name="Converged">False when an iteration cap was reached.</param>
/// <param name="Location">Robust location on the normal-score scale (length p), or null.</param>
/// <param name="Scatter">Robust scatter on the normal-score scale (p × p), or null.</param>
/// <param name="Note">Plain-English remark.</param>
/// <param name="Method">"er" (robust EM estimate on normal scores).</param>
/// <param name="StagedCollapsed">True when the staged fit collapsed onto tied answers and the direct fit was used.</param>
/// <param name="Iterations">Steps (passes over the rows, extrapolated ones included) of the EM start and the ER stages in all.</param>
public sealed record RobustEstimatorDetails(
    bool Available,
    int CompleteRows,
    bool Subsampled,
    int RowsUsed,
    int SupportSize,
    double ConsistencyFactor,
    double ReweightingFactor,
    int ReweightedCount,
    bool NestedExtension,
    int SubsetCount,
    int MergedSetSize,
    int InitialSubsets,
    bool Converged,
    double[]? Location,
    double[,]? Scatter,
    string Note,
    string Method = "er",
    bool StagedCollapsed = false,
    int Iterations = 0);

/// <summary>Result of <see cref="RespondentScreening.Run"/>.</summary>
/// <param name="Respondents">One row per respondent, in input order.</param>
/// <param name="ReasonCounts">Count per reason code, in the order of <see cref="ScreeningReasons.All"/>.</param>
/// <param name="TotalRespondents">n.</param>
/// <param name="FlaggedRespondents">Respondents with at least one reason.</param>
/// <param name="DistanceRule">"robust" or "classical": which distance produced the distance flags.</param>
/// <param name="RuleDescription">Plain-English description of the rules, with the caution that flags are for human review.</param>
/// <param name="Robust">The robust fit.</param>
/// <param name="CentreShareByItems">Figure data for k = 1 .. max(p, 20).</param>
/// <param name="Warnings">Recoverable problems, in plain English.</param>
/// <param name="Options">The options used.</param>
/// <param name="SmallSampleFallback">True when there were fewer than <see cref="RespondentScreening.SmallSampleRatio"/>
/// respondents per item, so the robust rejection was switched off (plain EM estimate on the normal scores, every
/// respondent in it).</param>
/// <param name="RepeatedRunLimit">Run length from which the repeated-answer rule flags (items + 1 = rule off); see
/// <see cref="RunLimitCalibration"/>.</param>
/// <param name="AlternatingRunLimit">Run length from which the alternating-run rule flags (items + 1 = rule off).</param>
/// <param name="RandomAnsweringCutoff">Value of the random-answering index (<see cref="RandomAnsweringIndex"/>) beyond which
/// a simulated attentive respondent lies with probability α / 2; NaN when the index was not computed.</param>
/// <param name="RandomAnsweringFlags">True when the index beyond <paramref name="RandomAnsweringCutoff"/> raises the flag
/// <see cref="ScreeningReasons.RandomLikeAnswers"/> (not with fewer than <see cref="RespondentScreening.SmallSampleRatio"/>
/// respondents per item).</param>
public sealed record ScreeningResult(
    IReadOnlyList<RespondentScreeningRow> Respondents,
    IReadOnlyList<ScreeningReasonCount> ReasonCounts,
    int TotalRespondents,
    int FlaggedRespondents,
    string DistanceRule,
    string RuleDescription,
    RobustEstimatorDetails Robust,
    IReadOnlyList<CentreShareRow> CentreShareByItems,
    IReadOnlyList<AnalysisWarning> Warnings,
    ScreeningOptions Options,
    bool SmallSampleFallback = false,
    int RepeatedRunLimit = 0,
    int AlternatingRunLimit = 0,
    double RandomAnsweringCutoff = double.NaN,
    bool RandomAnsweringFlags = false)
{
    /// <summary>Indices of the respondents who answered at least one item and, unless <paramref name="keepFlagged"/>,
    /// carry no flag: the respondents the later stages analyse.</summary>
    public List<int> RespondentsToAnalyse(bool keepFlagged)
    {
        if (Respondents is ScreeningRowStore store) return store.RespondentsToAnalyse(keepFlagged);
        var keep = new List<int>();
        for (int i = 0; i < Respondents.Count; i++)
        {
            var row = Respondents[i];
            if (row.ItemsAnswered > 0 && (keepFlagged || !row.Flagged)) keep.Add(i);
        }
        return keep;
    }

    /// <summary>Quantile at lower-tail probability <paramref name="probability"/> of the law the cutoff of the robust (or
    /// classical) distance is taken from, for respondents who answered <paramref name="items"/> items (for Q–Q plots):
    /// robust, the finite-sample law <see cref="BetaDistanceLaw"/> with N = <see cref="RobustEstimatorDetails.SupportSize"/>
    /// times the ordinal calibration factor; classical, χ² with <paramref name="items"/> degrees of freedom.</summary>
    public double ReferenceQuantile(bool robust, int items, double probability)
    {
        if (!(probability > 0 && probability < 1)) throw new ArgumentOutOfRangeException(nameof(probability), probability, "Allowed: (0, 1).");
        if (items < 1) throw new ArgumentOutOfRangeException(nameof(items), items, "Allowed: ≥ 1.");
        if (!robust || !Robust.Available) return ChiSquareTail.UpperQuantile(1 - probability, items);
        return Robust.ConsistencyFactor * BetaDistanceLaw.UpperQuantile(1 - probability, items, Robust.SupportSize);
    }

    /// <summary>The finite robust (or classical) squared distances of the respondents who answered all
    /// <paramref name="items"/> items, in ascending order (for Q–Q plots).</summary>
    public double[] SortedDistances(bool robust, int items)
    {
        double[] values = Respondents is ScreeningRowStore store
            ? store.DistancesOfRespondentsAnswering(robust, items)
            : Respondents.Where(x => x.ItemsAnswered == items).Select(x => robust ? x.RobustD2 : x.D2).Where(double.IsFinite).ToArray();
        Array.Sort(values);
        return values;
    }
}
