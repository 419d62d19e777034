using System.Runtime.CompilerServices;
using System.Globalization;
using ItemReduce.Core.Data;
using ItemReduce.Core.Randomness;

namespace ItemReduce.Core.Screening;

/// <summary>
/// Respondent screening: classical and robust squared Mahalanobis distances on the items each respondent answered,
/// compared with χ² cutoffs whose degrees of freedom equal the items answered, plus careless-response indices
/// (long-string, IRV, even-odd consistency, share missing). The result is a list of respondents to look at;
/// flags are for human review, not for automatic deletion.
/// <para>Missing answers: the classical distance uses item means over the answered values and the pairwise-complete
/// covariance (see <see cref="PairwiseCovariance"/>; repaired to be positive definite when it is not, with a warning).
/// FAST-MCD is fitted to the respondents who answered every item (a seeded random subsample when there are more than
/// <see cref="ScreeningOptions.RobustMaxRows"/>); every respondent's robust distance then uses the sub-vector and
/// sub-matrix of the robust location and scatter for the items he or she answered. Both distances therefore have
/// df = items answered. With too few complete respondents (fewer than 2 (p + 1)) or an exact fit, robust distances
/// are NaN and the classical distance drives the distance flags, with a warning. A respondent who answered nothing
/// has NaN distances and is flagged as mostly unanswered.</para>
/// </summary>
public static class RespondentScreening
{
    private const ulong PurposeSubsample = 0x5343_5245_01;

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
        if (p < 1) throw new ArgumentException("Screening needs at least 1 item; got 0.", nameof(data));
        if (n < 2) throw new ArgumentException($"Screening needs at least 2 respondents; got {n}.", nameof(data));
        if (asAnswered is not null && (asAnswered.RespondentCount != n || asAnswered.ItemCount != p))
            throw new ArgumentException($"asAnswered is {asAnswered.RespondentCount}×{asAnswered.ItemCount} but data is {n}×{p}.", nameof(asAnswered));
        var warnings = new WarningList("screening");

        // 1. Robust location and scatter from FAST-MCD on complete rows, fitted on another thread while the classical
        //    moments are accumulated (the two do not depend on each other; FAST-MCD leaves cores idle between its steps).
        var robustWarnings = new WarningList("screening");
        var robustFit = Task.Run(() => RobustFit(data, options, robustWarnings, progress));

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

        var (robust, robustDistance) = robustFit.GetAwaiter().GetResult();
        warnings.AddRange(robustWarnings);

        // 3. Cutoffs, df = items answered.
        var cutoffByDf = new double[p + 1];
        cutoffByDf[0] = double.NaN;
        for (int k = 1; k <= p; k++) cutoffByDf[k] = ChiSquareTail.UpperQuantile(options.CutoffP, k);

        var subscales = data.Items.Select(i => i.Subscale).ToList();
        var evenOdd = new EvenOddConsistency(subscales, options.EvenOddMinSubscales);
        if (!evenOdd.Applicable)
            warnings.Add("even-odd-not-computed", $"Even-odd consistency was not computed: it needs at least {options.EvenOddMinSubscales} subscales with two or more items, " +
                         $"the codebook gives {evenOdd.SplittableSubscales}.");
        int runLimit = Math.Max(options.LongStringMinimum, (int)Math.Ceiling(options.LongStringShare * p));
        bool useRobust = options.UseRobust && robust.Available;
        if (options.UseRobust && !robust.Available)
            warnings.Add("robust-unavailable", "Robust distances were not available; distance flags use the classical distance instead.");

        // 4. One pass over the respondents: each block of rows is decoded once and gets both distances, their
        //    p-values and the careless-response indices.
        progress?.Invoke("screening: distances, p-values and careless-response indices");
        var d2 = new double[n];
        var robustD2 = new double[n];
        var answered = new int[n];
        if (robustDistance is null) Array.Fill(robustD2, double.NaN);
        var rows = new ScreeningRowStore(data.RespondentIds, p, answered, d2, robustD2, cutoffByDf);
        var raw = asAnswered ?? data;
        const int blockRows = MahalanobisDistance.BlockRows;
        Parallel.For(0, (n + blockRows - 1) / blockRows,
            () => (Scratch: new MahalanobisDistance.Scratch(p), Rows: new double[blockRows * p], Raw: new double[blockRows * p], Answered: new int[blockRows]),
            [MethodImpl(MethodImplOptions.AggressiveOptimization)] (b, _, local) =>
            {
                int first = b * blockRows, count = Math.Min(blockRows, n - first);
                var block = data.Rows(first, count, local.Rows);
                var rawBlock = ReferenceEquals(raw, data) ? block : raw.Rows(first, count, local.Raw);
                classical.ComputeBlock(block, count, d2.AsSpan(first, count), answered.AsSpan(first, count), local.Scratch);
                robustDistance?.ComputeBlock(block, count, robustD2.AsSpan(first, count), local.Answered, local.Scratch);
                for (int r = 0; r < count; r++)
                {
                    int i = first + r;
                    ScreenOne(i, rows, block.Slice(r * p, p), rawBlock.Slice(r * p, p), d2[i], robustD2[i], answered[i], cutoffByDf,
                        evenOdd, runLimit, useRobust, options);
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
        string rule = Describe(options, useRobust, runLimit, p, evenOdd);
        var halfPeak = HalfPeakRegion.Compute(Math.Max(p, 20), options.CutoffP);
        return new ScreeningResult(rows, counts, n, flagged, useRobust ? "robust" : "classical", rule, robust, halfPeak, warnings, options);
    }

    /// <summary>Careless-response indices, p-values and reasons of respondent <paramref name="i"/>, written into <paramref name="rows"/>.</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private static void ScreenOne(int i, ScreeningRowStore rows, ReadOnlySpan<double> x, ReadOnlySpan<double> rawRow,
        double d2, double robustD2, int answered, double[] cutoffByDf, EvenOddConsistency evenOdd, int runLimit, bool useRobust, ScreeningOptions o)
    {
        int p = x.Length;
        double cutoff = cutoffByDf[answered];
        double pValue = answered > 0 ? ChiSquareTail.UpperTail(d2, answered) : double.NaN;
        double robustP = answered > 0 ? ChiSquareTail.UpperTail(robustD2, answered) : double.NaN;
        int longString = LongString.Compute(rawRow);
        double irv = IntraIndividualResponseVariability.Compute(rawRow);
        double eo = evenOdd.Compute(x, out int eoSubscales);
        double missing = (p - answered) / (double)p;

        int reasons = 0;
        if (useRobust && robustD2 > cutoff) reasons |= RobustBit;
        if (!useRobust && d2 > cutoff) reasons |= ClassicalBit;
        if (longString >= runLimit) reasons |= RunBit;
        if (irv < o.FlatVariabilityLimit) reasons |= FlatBit;
        if (eo < o.EvenOddMinimum && eoSubscales >= o.EvenOddFlagSubscales) reasons |= HalvesBit;
        if (missing > o.MissingShareLimit) reasons |= UnansweredBit;
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

    /// <summary>FAST-MCD on the complete rows (subsampled above the cap); the distance object is null when robust distances are unavailable.</summary>
    private static (RobustEstimatorDetails Details, MahalanobisDistance? Distance) RobustFit(ResponseMatrix data, ScreeningOptions o, WarningList warnings,
        Action<string>? progress)
    {
        int n = data.RespondentCount, p = data.ItemCount;
        var complete = new List<int>();
        for (int i = 0; i < n; i++)
            if (data.IsComplete(i)) complete.Add(i);
        RobustEstimatorDetails Unavailable(string note, int used = 0, bool sub = false)
        {
            warnings.Add("robust-fit-note", note);
            return new RobustEstimatorDetails(false, complete.Count, sub, used, 0, double.NaN, double.NaN, 0, false, 0, 0, 0, false, null, null, note);
        }
        int minimum = Math.Max(2 * (p + 1), p + 2);
        if (complete.Count < minimum)
            return (Unavailable($"Robust distances need at least {minimum} respondents who answered every item (2 × (items + 1)); only {complete.Count} did."), null);

        var rowsUsed = complete;
        bool subsampled = false;
        if (complete.Count > o.RobustMaxRows)
        {
            var shuffled = complete.ToArray();
            RandomStream.ForTask(o.Seed, 0, PurposeSubsample).Shuffle(shuffled.AsSpan());
            rowsUsed = shuffled[..o.RobustMaxRows].OrderBy(i => i).ToList();
            subsampled = true;
        }
        int m = rowsUsed.Count;
        var x = new double[(long)m * p];
        for (int r = 0; r < m; r++) data.CopyRow(rowsUsed[r], x.AsSpan(r * p, p));
        int? h = o.RobustSupportFraction is double f ? Math.Clamp((int)Math.Ceiling(f * m), p + 1, m) : null;
        progress?.Invoke(string.Create(CultureInfo.InvariantCulture, $"screening: FAST-MCD on {m} complete respondents"));
        FastMcdEstimate fit;
        try
        {
            fit = FastMcd.Fit(x, m, p, new FastMcdSettings(SupportSize: h, InitialSubsets: o.RobustInitialSubsets, Seed: o.Seed));
        }
        catch (FastMcdExactFitException e)
        {
            return (Unavailable("Robust fit failed: " + e.Message + " This happens when more than half the respondents give identical answers on some items.", m, subsampled), null);
        }
        if (!fit.Converged) warnings.Add("mcd-not-converged", "FAST-MCD reached its C-step cap before the determinant stopped decreasing; robust distances may be slightly off.");
        var dist = new MahalanobisDistance(fit.Location, fit.Scatter);
        if (!dist.FullFactorAvailable)
            return (Unavailable("The reweighted robust scatter matrix is singular; robust distances are not available.", m, subsampled), null);
        string note = subsampled
            ? $"FAST-MCD fitted to a seeded random subsample of {m} of the {complete.Count} complete respondents; robust distances computed for everyone."
            : $"FAST-MCD fitted to the {m} complete respondents; robust distances of respondents with missing answers use the matching parts of the robust location and scatter.";
        return (new RobustEstimatorDetails(true, complete.Count, subsampled, m, fit.SupportSize, fit.ConsistencyFactor, fit.ReweightingFactor,
            fit.ReweightedCount, fit.Nested, fit.SubsetCount, fit.MergedSize, fit.Trials, fit.Converged, fit.Location, fit.Scatter, note), dist);
    }

    private static string Meaning(string code) => code switch
    {
        ScreeningReasons.RobustDistance => "robust distance beyond the chi-square cutoff for the items answered",
        ScreeningReasons.ClassicalDistance => "classical distance beyond the chi-square cutoff for the items answered",
        ScreeningReasons.RepeatedAnswerRun => "long run of the same answer on consecutive items",
        ScreeningReasons.FlatProfile => "answers barely vary across items",
        ScreeningReasons.HalvesDisagree => "odd- and even-numbered items of the same scales disagree",
        ScreeningReasons.MostlyUnanswered => "most items unanswered",
        _ => code,
    };

    private static string Describe(ScreeningOptions o, bool robust, int runLimit, int p, EvenOddConsistency evenOdd)
    {
        var c = CultureInfo.InvariantCulture;
        int rule = 0;
        string Next() => "(" + (++rule).ToString(c) + ")"; // rules that do not apply are left out, so numbers stay consecutive
        var parts = new List<string>
        {
            string.Format(c, "A respondent is marked for review when any of these holds. {2} The {0} squared Mahalanobis distance, computed on the items the respondent answered, " +
                "exceeds the chi-square value with as many degrees of freedom as items answered that an attentive respondent from a multivariate normal population would exceed with probability {1}; " +
                "the cutoff therefore grows with the number of items answered instead of using one fixed radius.",
                robust ? "robust (reweighted FAST-MCD)" : "classical", o.CutoffP, Next()),
            string.Format(c, "{2} The same answer is given to at least {0} consecutive items (of {1}).", runLimit, p, Next()),
        };
        if (o.FlatVariabilityLimit > 0)
            parts.Add(string.Format(c, "{1} The standard deviation of the respondent's own answers is below {0}.", o.FlatVariabilityLimit, Next()));
        if (evenOdd.SplittableSubscales >= o.EvenOddFlagSubscales)
            parts.Add(string.Format(c, "{2} The Spearman–Brown corrected correlation between the odd- and even-numbered halves of the subscales is below {0}, " +
                "judged only when it rests on at least {1} subscales.", o.EvenOddMinimum, o.EvenOddFlagSubscales, Next()));
        else if (evenOdd.Applicable)
            parts.Add(string.Format(c, "Even-odd consistency is reported but raises no flag: with {0} subscales it is too noisy (at least {1} are required).",
                evenOdd.SplittableSubscales, o.EvenOddFlagSubscales));
        parts.Add(string.Format(c, "{1} More than {0:0.#%} of the items are unanswered.", o.MissingShareLimit, Next()));
        parts.Add("Even with no careless respondents, about " + (100 * o.CutoffP).ToString("0.###", c) + " % of attentive respondents exceed the distance cutoff by chance, and unusual but honest answer patterns are possible. " +
                  "Flags are for human review, not automatic deletion: inspect each flagged respondent, report how many were set aside and why, " +
                  "and follow your ethics board and professional standards.");
        return string.Join(" ", parts);
    }
}
