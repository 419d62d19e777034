using System.Globalization;
using System.Runtime.CompilerServices;
using ItemReduce.Core.Data;

namespace ItemReduce.Core.Screening;

/// <summary>
/// Respondent screening: classical and robust squared Mahalanobis distances on the items each respondent answered,
/// with cutoffs whose degrees of freedom equal the items answered, plus careless-response indices (long-string,
/// alternating run, IRV, even-odd consistency, share missing; person–total correlation and psychometric
/// synonyms/antonyms reported without a flag). The result is a list of respondents to look at; flags are for human
/// review, not for automatic deletion.
/// <para>Classical distance: item means over the answered values and the pairwise-complete covariance (see
/// <see cref="PairwiseCovariance"/>; repaired to be positive definite when it is not, with a warning), on the answers,
/// compared with the χ² quantile.</para>
/// <para>Robust distance: the <see cref="ErAlgorithm"/> estimate for incomplete data on the items' normal scores
/// (<see cref="NormalScores"/>), fitted to every respondent who answered an item (a systematic subsample above
/// <see cref="ScreeningOptions.RobustMaxRows"/>); each respondent's distance uses the sub-vector and sub-matrix for
/// the items he or she answered; respondents outside the final estimate get their leave-in distance
/// (<see cref="ErAlgorithm.LeaveIn"/>); the cutoff is the in-sample law <see cref="BetaDistanceLaw"/>. Nothing random:
/// the result does not depend on the seed. With fewer than 2 (p + 1) respondents the robust distances are NaN and
/// the classical distance drives the flags, with a warning; with fewer than <see cref="SmallSampleRatio"/>
/// respondents per item the classical distance drives the flags (the validation study found the robust rule above
/// twice its nominal rate there), with a warning. A respondent who answered nothing has NaN distances and is flagged
/// as mostly unanswered.</para>
/// </summary>
public static class RespondentScreening
{
    /// <summary>Screens every respondent.</summary>
    /// <param name="data">Analysed responses: reverse-scored, usable items only (the caller drops all-missing and
    /// zero-variance items); NaN = missing. Distances and even-odd consistency use these values.</param>
    /// <param name="options">Options; <see cref="ScreeningOptions"/> documents the defaults.</param>
    /// <param name="asAnswered">Optional responses as given (before reverse scoring), same respondents and items in the
    /// same order. When given, long-string and IRV use them (a respondent who ticks the same box throughout shows a
    /// flat profile only before reverse scoring); otherwise they use <paramref name="data"/>.</param>
    /// <param name="progress">Optional callback told when each step starts (for progress reports on large data).</param>
    public static ScreeningResult Run(ResponseMatrix data, ScreeningOptions options, ResponseMatrix? asAnswered = null, Action<string>? progress = null)
    {
        ArgumentNullException.ThrowIfNull(data);
        ArgumentNullException.ThrowIfNull(options);
        options.Validate();
        int n = data.RespondentCount, p = data.ItemCount;
        if (p < 1) throw new DataConditionException("Screening needs at least 1 item; got 0.", nameof(data));
        if (n < 2) throw new DataConditionException($"Screening needs at least 2 respondents; got {n}.", nameof(data));
        if (asAnswered is not null && (asAnswered.RespondentCount != n || asAnswered.ItemCount != p))
            throw new ArgumentException($"asAnswered is {asAnswered.RespondentCount}×{asAnswered.ItemCount} but data is {n}×{p}.", nameof(asAnswered));
        var warnings = new WarningList("screening");

        // 1. Robust location and scatter (ER estimate on normal scores), fitted on another thread while the classical
        //    moments are accumulated (the two do not depend on each other).
        var robustWarnings = new WarningList("screening");
        int runFloor = Math.Max(options.LongStringMinimum, (int)Math.Ceiling(options.RunShare * p));
        var robustFit = Task.Run(() => RobustFit(data, options, robustWarnings, progress, asAnswered is not null, runFloor));

        // 2. Classical distances: item means, pairwise-complete covariance (n − 1), repaired if not PD.
        progress?.Invoke("screening: item means and covariances");
        var (mean, rawCov, noOverlap) = PairwiseCovariance.Compute(data);
        if (noOverlap > 0)
            warnings.Add("pairs-without-overlap", $"{noOverlap} item pair(s) had fewer than 2 respondents answering both; their covariance was set to 0.");
        var (cov, repaired, smallest) = PairwiseCovariance.EnsurePositiveDefinite(rawCov);
        if (repaired)
            warnings.Add("covariance-repaired", "The item covariance matrix was not positive definite (smallest eigenvalue " +
                         smallest.ToString("G4", CultureInfo.InvariantCulture) +
                         "), typically because of pairwise-complete estimation, collinear items or fewer respondents than items; " +
                         "eigenvalues were raised to a small floor, so classical distances are approximate.");
        var classical = new MahalanobisDistance(mean, cov);
        var synonyms = new PsychometricSynonyms(AsAnsweredCorrelation(cov, data), p);

        var (robust, robustDistance, scores, inEstimate, runLimits, randomIndex) = robustFit.GetAwaiter().GetResult();
        double randomCutoff = randomIndex?.Cutoff ?? double.NaN;
        // The index raises a flag only with at least SmallSampleRatio respondents per item (below that the polychoric
        // correlations are too noisy for the fitted model to stand in for attentive answering; the index is still reported).
        bool randomFlags = randomIndex is not null && robust.RowsUsed >= SmallSampleRatio * p;
        warnings.AddRange(robustWarnings);

        // 3. Cutoffs, df = items answered.
        var cutoffByDf = new double[p + 1];
        cutoffByDf[0] = double.NaN;
        for (int k = 1; k <= p; k++) cutoffByDf[k] = ChiSquareTail.UpperQuantile(options.CutoffP, k);
        int lawRows = robust.SupportSize;
        var robustCutoffByDf = new double[p + 1];
        robustCutoffByDf[0] = double.NaN;
        double calibration = robust.Available ? robust.ConsistencyFactor : 1;
        for (int k = 1; k <= p; k++) robustCutoffByDf[k] = calibration * BetaDistanceLaw.UpperQuantile(options.CutoffP, k, lawRows);

        var subscales = data.Items.Select(i => i.Subscale).ToList();
        var evenOdd = new EvenOddConsistency(subscales, options.EvenOddMinSubscales);
        if (!evenOdd.Applicable)
            warnings.Add("even-odd-not-computed", $"Even-odd consistency was not computed: it needs at least {options.EvenOddMinSubscales} subscales with two or more items, " +
                         $"the codebook gives {evenOdd.SplittableSubscales}.");
        int runLimit = runLimits?.RepeatedRun ?? runFloor;
        int alternatingLimit = runLimits?.AlternatingRun ?? Math.Max(runFloor, AlternatingMinimum);
        bool useRobust = options.UseRobust && robust.Available;
        if (options.UseRobust && !robust.Available)
            warnings.Add("robust-unavailable", "Robust distances were not available; distance flags use the classical distance instead.");
        bool smallSample = robust.Available && robust.RowsUsed < SmallSampleRatio * p;
        if (smallSample)
            warnings.Add("small-sample-plain-em", string.Create(CultureInfo.InvariantCulture,
                $"Only {robust.RowsUsed} respondents for {p} items (fewer than {SmallSampleRatio} per item): no respondent was set aside when estimating location and scatter ") +
                "(plain EM on the normal scores instead of the robust ER estimate), because in our validation study the robust rejection flagged up to 1.4 % of attentive respondents at such sample sizes " +
                "while the plain estimate with the in-sample cutoff stayed near the nominal rate. Atypical respondents can hide one another more easily in this estimate.");

        // 4. One pass over the respondents: each block of rows is decoded once and gets both distances, their
        //    p-values and the careless-response indices.
        progress?.Invoke("screening: distances, p-values and careless-response indices");
        var d2 = new double[n];
        var robustD2 = new double[n];
        var answered = new int[n];
        if (robustDistance is null) Array.Fill(robustD2, double.NaN);
        var rows = new ScreeningRowStore(data.RespondentIds, p, answered, d2, robustD2, useRobust ? robustCutoffByDf : cutoffByDf);
        var raw = asAnswered ?? data;
        const int blockRows = MahalanobisDistance.BlockRows;
        Parallel.For(0, (n + blockRows - 1) / blockRows,
            () => (Scratch: new MahalanobisDistance.Scratch(p), Rows: new double[blockRows * p], Raw: new double[blockRows * p], Answered: new int[blockRows],
                Scores: new double[blockRows * p], Index: randomIndex is null ? null : new RandomAnsweringIndex.Scratch(p)),
            [MethodImpl(MethodImplOptions.AggressiveOptimization)] (b, _, local) =>
            {
                int first = b * blockRows, count = Math.Min(blockRows, n - first);
                var block = data.Rows(first, count, local.Rows);
                var rawBlock = ReferenceEquals(raw, data) ? block : raw.Rows(first, count, local.Raw);
                classical.ComputeBlock(block, count, d2.AsSpan(first, count), answered.AsSpan(first, count), local.Scratch);
                if (robustDistance is not null)
                {
                    scores.Apply(block, count, local.Scores);
                    robustDistance.ComputeBlock(local.Scores.AsSpan(0, count * p), count, robustD2.AsSpan(first, count), local.Answered, local.Scratch);
                    // Respondents outside the final estimate are judged as if they were in it (ErAlgorithm.LeaveIn).
                    for (int r = 0; r < count; r++)
                        if (!inEstimate![first + r]) robustD2[first + r] = ErAlgorithm.LeaveIn(robustD2[first + r], lawRows);
                }
                for (int r = 0; r < count; r++)
                {
                    int i = first + r;
                    rows.RandomAnswering[i] = randomIndex is null ? double.NaN : randomIndex.Index.Compute(block.Slice(r * p, p), local.Index!);
                    ScreenOne(i, rows, block.Slice(r * p, p), rawBlock.Slice(r * p, p), d2[i], robustD2[i], answered[i], cutoffByDf, robustCutoffByDf,
                        lawRows, calibration, evenOdd, runLimit, alternatingLimit, useRobust, options, mean, synonyms, randomFlags ? randomCutoff : double.NaN);
                }
                return local;
            }, _ => { });

        int nanDistance = 0;
        for (int i = 0; i < n; i++) if (answered[i] > 0 && double.IsNaN(d2[i])) nanDistance++;
        if (nanDistance > 0)
            warnings.Add("no-classical-distance", $"{nanDistance} respondent(s) got no classical distance because the covariance sub-matrix of their answered items could not be factorised.");
        int nanRobust = 0;
        for (int i = 0; i < n; i++) if (robust.Available && answered[i] > 0 && double.IsNaN(robustD2[i])) nanRobust++;
        if (nanRobust > 0)
            warnings.Add("no-robust-distance", $"{nanRobust} respondent(s) got no robust distance because the robust scatter sub-matrix of their answered items could not be factorised.");
        int noAnswers = answered.Count(a => a == 0);
        if (noAnswers > 0) warnings.Add("no-answers", $"{noAnswers} respondent(s) answered no item; they have no distance and are flagged as mostly unanswered.");

        var counts = ScreeningReasons.All.Select(code => new ScreeningReasonCount(code, Meaning(code),
            rows.CountWith(ScreeningRowStore.Bit(code)))).ToList();
        int flagged = rows.Flagged();
        string? randomRecall = RandomResponderRecall.Statement(p, options.CutoffP);
        if (randomRecall is not null && !useRobust) randomRecall += " These figures are for the default robust distance; this run used the classical one.";
        else if (randomRecall is not null && !randomFlags) randomRecall += " " + RandomIndexAbsent(p, randomIndex is not null);
        if (randomRecall is not null) warnings.Add("random-answering-partly-detectable", randomRecall);
        if (randomIndex is null && robust.Available && DiscretenessCalibration.Applies(scores) && p > RandomAnsweringIndex.MaxItems)
            warnings.Add("random-index-not-computed", string.Create(CultureInfo.InvariantCulture,
                $"The random-answering index was not computed: it is limited to {RandomAnsweringIndex.MaxItems} items (its cost grows with the cube of the items answered); this survey has {p}."));
        string rule = Describe(options, useRobust, runLimit, alternatingLimit, runLimits, robust.RowsUsed, p, evenOdd, calibration, randomIndex, randomFlags);
        if (randomRecall is not null) rule += " " + randomRecall;
        var halfPeak = CentreShareByItems.Compute(Math.Max(p, 20), options.CutoffP);
        return new ScreeningResult(rows, counts, n, flagged, useRobust ? "robust" : "classical", rule, robust, halfPeak, warnings, options, smallSample,
            runLimit, alternatingLimit, randomCutoff, randomFlags);
    }

    /// <summary>Why the study's recall figures (which include the random-answering index) overstate this run's rules, when the
    /// index raised no flags here.</summary>
    private static string RandomIndexAbsent(int items, bool computed)
    {
        string why = computed ? $"it flags only from {SmallSampleRatio} respondents per item"
            : items > RandomAnsweringIndex.MaxItems ? $"it is computed up to {RandomAnsweringIndex.MaxItems} items"
            : "it needs the ordinal-answer calibration";
        return $"The study's figures include the random-answering index, which raised no flags in this run ({why}); "
            + "they describe the studied design with that index, not this run's rules.";
    }

    /// <summary>Careless-response indices, p-values and reasons of respondent <paramref name="i"/>, written into <paramref name="rows"/>.</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private static void ScreenOne(int i, ScreeningRowStore rows, ReadOnlySpan<double> x, ReadOnlySpan<double> rawRow,
        double d2, double robustD2, int answered, double[] cutoffByDf, double[] robustCutoffByDf, int lawRows, double calibration, EvenOddConsistency evenOdd, int runLimit, int alternatingLimit,
        bool useRobust, ScreeningOptions o, double[] itemMeans, PsychometricSynonyms synonyms, double randomCutoff)
    {
        int p = x.Length;
        double cutoff = cutoffByDf[answered];
        double pValue = answered > 0 ? ChiSquareTail.UpperTail(d2, answered) : double.NaN;
        double robustP = answered > 0 ? BetaDistanceLaw.UpperTail(robustD2 / calibration, answered, lawRows) : double.NaN;
        int longString = LongString.Compute(rawRow);
        double irv = IntraIndividualResponseVariability.Compute(rawRow);
        double eo = evenOdd.Compute(x, out int eoSubscales);
        double missing = (p - answered) / (double)p;
        int alternating = AlternatingRun.Compute(rawRow);
        var (syn, ant) = synonyms.Compute(rawRow);

        int reasons = 0;
        if (useRobust && robustD2 > robustCutoffByDf[answered]) reasons |= RobustBit;
        if (!useRobust && d2 > cutoff) reasons |= ClassicalBit;
        if (longString >= runLimit) reasons |= RunBit;
        if (irv < o.FlatSd) reasons |= FlatBit;
        if (eo < o.EvenOddMinimum && eoSubscales >= o.EvenOddFlagSubscales) reasons |= HalvesBit;
        if (missing > o.MissingLimit) reasons |= UnansweredBit;
        if (alternating >= alternatingLimit) reasons |= AlternatingBit;
        if (rows.RandomAnswering[i] > randomCutoff) reasons |= RandomLikeBit;
        rows.AlternatingRun[i] = alternating;
        rows.PersonTotal[i] = PersonTotalCorrelation.Compute(x, itemMeans);
        rows.Synonyms[i] = syn;
        rows.Antonyms[i] = ant;
        rows.PValue[i] = pValue;
        rows.RobustPValue[i] = robustP;
        rows.LongString[i] = longString;
        rows.Irv[i] = irv;
        rows.EvenOdd[i] = eo;
        rows.ReasonMask[i] = (byte)reasons;
    }

    private static readonly int RobustBit = ScreeningRowStore.Bit(ScreeningReasons.RobustDistance);
    private static readonly int ClassicalBit = ScreeningRowStore.Bit(ScreeningReasons.ClassicalDistance);
    private static readonly int RunBit = ScreeningRowStore.Bit(ScreeningReasons.RepeatedAnswerRun);
    private static readonly int FlatBit = ScreeningRowStore.Bit(ScreeningReasons.FlatProfile);
    private static readonly int HalvesBit = ScreeningRowStore.Bit(ScreeningReasons.HalvesDisagree);
    private static readonly int UnansweredBit = ScreeningRowStore.Bit(ScreeningReasons.MostlyUnanswered);
    /// <summary>Respondents per item below which the classical distance drives the distance flags (see the warning).</summary>
    internal const int SmallSampleRatio = 10;

    /// <summary>Shortest alternating run flagged when the limits are not calibrated (<see cref="RunLimitCalibration"/>
    /// needs ordinal items): with 8 of 12 four-point items an earlier validation study flagged 0.1–0.2 % of attentive
    /// respondents as alternating; otherwise the long-string limit applies.</summary>
    internal const int AlternatingMinimum = 10;

    /// <summary>Most kept respondents whose polychoric correlations feed the ordinal calibration (a systematic subsample above).</summary>
    internal const int CalibrationRows = 5_000;

    /// <summary>The false-flag rate the validation study measured for this kind of design (default cutoff only).</summary>
    private static string MeasuredRate(ScreeningOptions o, bool robust, int n, int p)
    {
        if (o.CutoffP != 0.001)
            return "The validation study measured false-flag rates at the default cutoff (0.001) only.";
        return robust
            ? n < SmallSampleRatio * p
                ? MeasuredSmall
                : MeasuredLarge
            : MeasuredClassical;
    }

    /// <summary>What the validation study measured for the random-answering rule (default cutoff only).</summary>
    private static string MeasuredRandomIndex(ScreeningOptions o) => o.CutoffP != 0.001 ? "" : MeasuredRandom;

    // Filled in from benchmarks/results/screening-study-index-*-2026-12-02.md (default options).
    private const string MeasuredRandom = "In our validation slices (24 and 36 five-point items, symmetric or skewed, 0 or 10 % of answers missing, and 48 skewed items with 5 % missing; 20 respondents per item, attentive respondents only) this rule flagged between 0 % and 0.07 % of attentive respondents per design (target 0.05 %) and all rules together between 0 % and 0.19 % (nominal limit 0.2 %); with 5 respondents per item it would have flagged 0.02–0.12 %, which is why it raises no flag there.";

    // Filled in from benchmarks/results/screening-study-2026-12-02.md (default options).
    private const string MeasuredLarge = "In our validation study (ordinal 4- to 7-point items from a factor model, symmetric or skewed, 0–10 % of answers missing, 20 to 100 respondents per item) the distance flagged between 0.02 % and 0.28 % of attentive respondents per design (median 0.12 %; nominal 0.1 %), and all rules together between 0 % and 0.29 % (median 0.12 %).";
    private const string MeasuredSmall = "In our validation study with 5 respondents per item (same kinds of items) the distance flagged between 0.04 % and 0.33 % of attentive respondents per design (median 0.12 %; nominal 0.1 %), and all rules together between 0.04 % and 0.33 % (median 0.13 %).";
    private const string MeasuredClassical = "In our validation study the classical distance with its chi-square cutoff flagged up to 6.3 % of attentive respondents per design on skewed items (median over all designs 0.8 %; nominal 0.1 %); the robust rule is the default.";

    private static readonly int AlternatingBit = ScreeningRowStore.Bit(ScreeningReasons.AlternatingAnswers);
    private static readonly int RandomLikeBit = ScreeningRowStore.Bit(ScreeningReasons.RandomLikeAnswers);

    /// <summary>Inter-item correlations of the answers as given: those of the analysed covariance, with the sign
    /// flipped for pairs in which exactly one item was reverse-scored.</summary>
    private static double[] AsAnsweredCorrelation(double[,] cov, ResponseMatrix data)
    {
        int p = data.ItemCount;
        var r = new double[p * p];
        for (int j = 0; j < p; j++)
            for (int k = 0; k < p; k++)
            {
                double v = cov[j, k] / Math.Sqrt(cov[j, j] * cov[k, k]);
                r[j * p + k] = data.Items[j].Reverse != data.Items[k].Reverse ? -v : v;
            }
        return r;
    }

    /// <summary>
    /// ER estimate (<see cref="ErAlgorithm"/>) on the items' normal scores (<see cref="NormalScores"/>), fitted to every
    /// respondent who answered at least one item, or above <see cref="ScreeningOptions.RobustMaxRows"/> to a systematic
    /// subsample (every (n / cap)-th respondent: no random choice, so the result does not depend on the seed).
    /// The distance object is null when robust distances are unavailable.
    /// </summary>
    private static (RobustEstimatorDetails Details, MahalanobisDistance? Distance, NormalScores Scores, bool[]? InEstimate, RunLimitCalibration.Limits? RunLimits,
        RandomAnsweringIndex.Fitted? RandomIndex) RobustFit(
        ResponseMatrix data, ScreeningOptions o, WarningList warnings, Action<string>? progress, bool runsOnAnswersAsGiven, int runFloor)
    {
        int n = data.RespondentCount, p = data.ItemCount;
        var scores = NormalScores.FromData(data);
        int complete = 0;
        var answering = new List<int>(n);
        var buffer = new double[p];
        for (int i = 0; i < n; i++)
        {
            if (data.IsComplete(i)) { complete++; answering.Add(i); continue; }
            data.CopyRow(i, buffer);
            if (buffer.Any(v => !double.IsNaN(v))) answering.Add(i);
        }
        RobustEstimatorDetails Unavailable(string note, int used = 0, bool sub = false)
        {
            warnings.Add("robust-fit-note", note);
            return new RobustEstimatorDetails(false, complete, sub, used, 0, double.NaN, double.NaN, 0, false, 0, 0, 0, false, null, null, note);
        }
        int minimum = 2 * (p + 1);
        if (answering.Count < minimum)
            return (Unavailable($"Robust distances need at least {minimum} respondents (2 × (items + 1)); only {answering.Count} answered any item."), null, scores, null, null, null);

        var rowsUsed = answering;
        bool subsampled = false;
        if (answering.Count > o.RobustMaxRows)
        {
            int m0 = o.RobustMaxRows;
            rowsUsed = Enumerable.Range(0, m0).Select(t => answering[(int)((long)t * answering.Count / m0)]).ToList();
            subsampled = true;
        }
        int m = rowsUsed.Count;
        var x = new double[(long)m * p];
        for (int r = 0; r < m; r++)
        {
            data.CopyRow(rowsUsed[r], buffer);
            scores.Apply(buffer, 1, x.AsSpan(r * p, p));
        }
        progress?.Invoke(string.Create(CultureInfo.InvariantCulture, $"screening: robust EM (ER) estimate on {m} respondents"));
        ErEstimate fit;
        try
        {
            fit = ErAlgorithm.Fit(x, m, p, o.CutoffP, reject: m >= SmallSampleRatio * p, accelerate: o.AccelerateRobustFit);
        }
        catch (InvalidOperationException e)
        {
            return (Unavailable("Robust fit failed: " + e.Message, m, subsampled), null, scores, null, null, null);
        }
        if (!fit.Converged) warnings.Add("er-not-converged", "The robust EM (ER) estimate did not settle (its iteration cap was reached, " +
            "or its kept set alternated between two sets); robust distances may be slightly off.");
        var dist = new MahalanobisDistance(fit.Location, fit.Scatter);
        var inEstimate = new bool[n];
        for (int r = 0; r < m; r++) inEstimate[rowsUsed[r]] = fit.KeptRows[r];
        if (!dist.FullFactorAvailable)
            return (Unavailable("The robust scatter matrix is singular; robust distances are not available.", m, subsampled), null, scores, null, null, null);
        // Cutoff factor for ordinal answers, from the polychoric correlations of (at most CalibrationRows of) the
        // respondents kept by the fit.
        double calibration = 1;
        RunLimitCalibration.Limits? runLimits = null;
        RandomAnsweringIndex.Fitted? randomIndex = null;
        string calibrationNote = " No ordinal calibration (some item has more than " + DiscretenessCalibration.MaxCategories + " distinct answers).";
        if (DiscretenessCalibration.Applies(scores))
        {
            progress?.Invoke("screening: cutoff calibration for ordinal answers");
            var keptRows = Enumerable.Range(0, m).Where(r => fit.KeptRows[r]).Select(r => rowsUsed[r]).ToList();
            if (keptRows.Count > CalibrationRows)
                keptRows = Enumerable.Range(0, CalibrationRows).Select(t => keptRows[(int)((long)t * keptRows.Count / CalibrationRows)]).ToList();
            var latent = DiscretenessCalibration.LatentCorrelation(data, keptRows);
            if (latent is not null)
            {
                calibration = DiscretenessCalibration.Factor(latent, scores, o.CutoffP);
                // Run-rule limits from the same fitted model, on the answers as given (reverse-keyed items mirrored back).
                var asGiven = new double[p][];
                for (int j = 0; j < p; j++)
                {
                    var item = data.Items[j];
                    asGiven[j] = scores.Categories(j).Values.Select(v => runsOnAnswersAsGiven && item.Reverse ? item.Min + item.Max - v : v).ToArray();
                }
                // The random-answering index is calibrated on the same simulated respondents, given the survey's missing-answer patterns.
                runLimits = RunLimitCalibration.Choose(latent, scores, asGiven, o.CutoffP, runFloor, runFloor);
                if (p <= RandomAnsweringIndex.MaxItems)
                {
                    progress?.Invoke("screening: random-answering index");
                    randomIndex = RandomAnsweringIndex.Fit(data, answering, Enumerable.Range(0, p).Select(j => ScaleCategories(data.Items[j])).ToArray(), o.CutoffP);
                }
                calibrationNote = string.Create(CultureInfo.InvariantCulture, $" Cutoffs multiplied by {calibration:0.###}, the ordinal-answer calibration factor.");
            }
            else
            {
                calibrationNote = " No ordinal calibration (the polychoric correlation matrix could not be made positive definite).";
                warnings.Add("calibration-skipped", "The cutoff calibration for ordinal answers was skipped: the polychoric correlation matrix could not be made positive definite; robust cutoffs are uncalibrated.");
            }
        }
        if (fit.StagedCollapsed)
            warnings.Add("staged-fit-collapsed", "The staged robust fit collapsed onto a cluster of identical answers; the direct fit at the cutoff was used instead.");
        bool plain = m < SmallSampleRatio * p;
        string note = plain
            ? $"Plain EM estimate (no respondent set aside) on the items' normal scores, fitted to all {m} respondents who answered any item: fewer than {SmallSampleRatio} respondents per item."
            : subsampled
            ? $"Robust EM (ER) estimate on the items' normal scores, fitted to a systematic subsample of {m} of the {answering.Count} respondents (every {(double)answering.Count / m:0.#}-th); robust distances computed for everyone."
            : $"Robust EM (ER) estimate on the items' normal scores, fitted to all {m} respondents who answered any item; {fit.Kept} kept in the final step.";
        note += calibrationNote;
        return (new RobustEstimatorDetails(true, complete, subsampled, m, fit.Kept, calibration, fit.TruncationFactor,
            fit.Kept, false, 1, m, 0, fit.Converged, fit.Location, fit.Scatter, note, "er", fit.StagedCollapsed, fit.StartIterations + fit.Iterations), dist, scores, inEstimate, runLimits, randomIndex);
    }

    /// <summary>Answer categories of an item's scale (Max − Min + 1) when its ends are whole numbers, otherwise 0 (the
    /// categories observed are used).</summary>
    private static int ScaleCategories(ItemDefinition item) =>
        item.Min == Math.Floor(item.Min) && item.Max == Math.Floor(item.Max) && item.Max - item.Min < 1000 ? (int)(item.Max - item.Min) + 1 : 0;


    /// <summary>How the two run limits were chosen, and which run rule is off.</summary>
    private static string RunLimitText(RunLimitCalibration.Limits? limits, int runLimit, int alternatingLimit, int p, double cutoffP)
    {
        var c = CultureInfo.InvariantCulture;
        if (limits is null)
            return string.Format(c, "The run limits are the configured ones ({0} for repeated answers, {1} for alternation); they were not checked against simulated attentive respondents (no ordinal calibration).",
                runLimit <= p ? runLimit.ToString(c) : "not reachable", alternatingLimit <= p ? alternatingLimit.ToString(c) : "not reachable");
        string off = (runLimit > p, alternatingLimit > p) switch
        {
            (true, true) => " Neither run rule is applied: even a run over every item was reached more often than that.",
            (true, false) => " The repeated-answer rule is not applied: even a run over every item was reached more often than that.",
            (false, true) => " The alternation rule is not applied: even alternation over every item was reached more often than that.",
            _ => "",
        };
        return string.Format(c, "The run limits are the shortest (not below the configured minimum) that at most {0} of {1:N0} attentive respondents simulated from this survey's fitted model " +
            "(polychoric correlations and answer shares; every item answered) reached ({2} and {3} of them did).{4}",
            (RunLimitCalibration.ShareOfCutoff * cutoffP).ToString("0.#####%", c), limits.Draws,
            limits.RepeatedRate.ToString("0.####%", c), limits.AlternatingRate.ToString("0.####%", c), off);
    }

    private static string Meaning(string code) => code switch
    {
        ScreeningReasons.RandomLikeAnswers => "answers more likely under uniform random answering than attentive respondents of the fitted model allow",
        ScreeningReasons.RobustDistance => "robust distance beyond the chi-square cutoff for the items answered",
        ScreeningReasons.ClassicalDistance => "classical distance beyond the chi-square cutoff for the items answered",
        ScreeningReasons.RepeatedAnswerRun => "long run of the same answer on consecutive items",
        ScreeningReasons.FlatProfile => "answers barely vary across items",
        ScreeningReasons.HalvesDisagree => "odd- and even-numbered items of the same scales disagree",
        ScreeningReasons.MostlyUnanswered => "most items unanswered",
        ScreeningReasons.AlternatingAnswers => "long run of answers alternating between two values",
        _ => code,
    };

    private static string Describe(ScreeningOptions o, bool robust, int runLimit, int alternatingLimit, RunLimitCalibration.Limits? runLimits, int n, int p,
        EvenOddConsistency evenOdd, double calibration, RandomAnsweringIndex.Fitted? randomIndex, bool randomFlags)
    {
        var c = CultureInfo.InvariantCulture;
        int rule = 0;
        string Next() => "(" + (++rule).ToString(c) + ")"; // rules that do not apply are left out, so numbers stay consecutive
        var parts = new List<string>
        {
            robust
                ? string.Format(c, "A respondent is marked for review when any of these holds. {3} The robust squared Mahalanobis distance, computed on the items the respondent answered, " +
                    "exceeds the cutoff that an attentive respondent would exceed with probability {0}. Location and scatter come from a robust EM estimate for incomplete data " +
                    "(ER: EM with rows weighted 0 or 1 by their distance on the items they answered, fitted to every respondent, with no random subsets{4}) on each item's rank-based normal scores; " +
                    "the cutoff is the finite-sample (Beta) law of in-sample distances with as many degrees of freedom as items answered, multiplied by a factor calibrated by simulation for ordinal answers with this survey's answer distributions and correlations ({1}), and respondents outside the final estimate are judged by the distance they would have inside it.{2}",
                    o.CutoffP, double.IsFinite(calibration) ? calibration.ToString("0.###", c) : "not applied",
                    n < SmallSampleRatio * p ? string.Format(c, " With fewer than {0} respondents per item no respondent is set aside (plain EM estimate).", SmallSampleRatio) : "",
                    Next(), o.AccelerateRobustFit
                        ? "; its iterations accelerated by squared extrapolation (SQUAREM), " +
                          "which changes the estimate only within the convergence tolerance"
                        : "")
                : string.Format(c, "A respondent is marked for review when any of these holds. {1} The classical squared Mahalanobis distance, computed on the items the respondent answered, " +
                    "exceeds the chi-square value with as many degrees of freedom as items answered that an attentive respondent from a multivariate normal population would exceed with probability {0}; " +
                    "the cutoff therefore grows with the number of items answered instead of using one fixed radius.", o.CutoffP, Next()),
        };
        if (runLimit <= p)
            parts.Add(string.Format(c, "{2} The same answer is given to at least {0} consecutive items (of {1}).", runLimit, p, Next()));
        if (o.FlatSd > 0)
            parts.Add(string.Format(c, "{1} The standard deviation of the respondent's own answers is below {0}.", o.FlatSd, Next()));
        if (evenOdd.SplittableSubscales >= o.EvenOddFlagSubscales)
            parts.Add(string.Format(c, "{2} The Spearman–Brown corrected correlation between the odd- and even-numbered halves of the subscales is below {0}, " +
                "judged only when it rests on at least {1} subscales.", o.EvenOddMinimum, o.EvenOddFlagSubscales, Next()));
        else if (evenOdd.Applicable)
            parts.Add(string.Format(c, "Even-odd consistency is reported but raises no flag: with {0} subscales it is too noisy (at least {1} are required).",
                evenOdd.SplittableSubscales, o.EvenOddFlagSubscales));
        parts.Add(string.Format(c, "{1} More than {0:0.#%} of the items are unanswered.", o.MissingLimit, Next()));
        if (alternatingLimit <= p)
            parts.Add(string.Format(c, "{1} At least {0} answers in a row alternate between two values (such as 1-5-1-5 or 3-5-3-5; skipped items neither end the row nor count).", alternatingLimit, Next()));
        if (randomIndex is not null)
        {
            string index = string.Format(c, "the random-answering index (the log likelihood ratio of uniform random answering over each item's answer categories against this survey's fitted model: " +
                "each item's answers taken as a latent normal variable cut at the normal quantiles of its answer shares, the latent variables correlated by their polychoric correlations, " +
                "and the probability of a respondent's answers approximated by the Mendell–Elston method; unanswered items are left out of both likelihoods; the model is fitted {0} times, " +
                "each time without the respondents beyond the previous cutoff) exceeds {1:0.##}, the value exceeded by {2} of {3:N0} attentive respondents simulated from the fitted model " +
                "with this survey's missing-answer patterns (the cutoff aims at half the distance rule's probability, {4}).",
                RandomAnsweringIndex.Rounds, randomIndex.Cutoff, randomIndex.SimulatedRate.ToString("0.###%", c), randomIndex.Draws, RandomAnsweringIndex.ShareOfCutoff * o.CutoffP);
            parts.Add(randomFlags
                ? string.Format(c, "{0} The answers look like uniform random answering: {1}", Next(), index) + " " + MeasuredRandomIndex(o)
                : string.Format(c, "The random-answering index is reported but raises no flag with fewer than {0} respondents per item (the fitted model is then too uncertain); " +
                    "it would flag a respondent when {1}", SmallSampleRatio, index));
        }
        parts.Add(RunLimitText(runLimits, runLimit, alternatingLimit, p, o.CutoffP));
        parts.Add(MeasuredRate(o, robust, n, p));
        parts.Add("Even with no careless respondents, about " + (100 * o.CutoffP).ToString("0.###", c) + " % of attentive respondents exceed the distance cutoff by chance, and unusual but honest answer patterns are possible. " +
                  "Flags are for human review, not automatic deletion: inspect each flagged respondent, report how many were set aside and why, " +
                  "and follow your ethics board and professional standards.");
        return string.Join(" ", parts);
    }
}
