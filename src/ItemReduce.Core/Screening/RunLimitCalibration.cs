namespace ItemReduce.Core.Screening;

/// <summary>
/// Design-aware limits of the repeated-answer-run (<see cref="LongString"/>) and alternating-run
/// (<see cref="AlternatingRun"/>) rules (our own calibration; no published source is followed). On short
/// questionnaires with few categories, strongly related items and skewed answers, honest respondents often give the
/// same answer to many consecutive items, so a fixed limit (such as 8 of 12 four-point items) flags several per
/// thousand of them. Here the limits come from attentive respondents simulated from the survey's own fitted model —
/// the same draws as <see cref="DiscretenessCalibration"/>: latent N(0, R) rows with R the polychoric correlations of
/// the respondents kept by the robust fit, cut into each item's observed categories at its observed cumulative shares
/// — turned back into answers as given (reverse-keyed items mirrored, in questionnaire order). Each limit is the
/// smallest run length, not below the configured floor, that at most a share <see cref="ShareOfCutoff"/> × α of the
/// simulated respondents reach; when even a run over every item is reached more often, the rule is switched off for
/// the survey (<see cref="Never"/>). Simulated respondents answer every item. A skipped item ends a repeated-answer
/// run, so for that rule the limit errs towards fewer flags; an alternating stretch skips missing answers (see
/// <see cref="AlternatingRun"/>), so a respondent with skipped items can reach a longer stretch than with every item
/// answered, and the screening study measures the false-flag rate this leaves with 0–10 % of answers missing. Fixed
/// internal seed (<see cref="Seed"/>): the limits do not depend on
/// <c>--seed</c> or the thread count.
/// </summary>
internal static class RunLimitCalibration
{
    /// <summary>Fixed seed of the draws (not that of <see cref="DiscretenessCalibration"/>, so the two use independent rows).</summary>
    internal const ulong Seed = 0x5255_4E4C_494D;

    /// <summary>Share of the distance cutoff α each run rule may add at most (our choice: the two together add at most
    /// α / 2, so that with the distance rule at α and the random-answering rule at α / 2 all rules stay within 2 α).</summary>
    internal const double ShareOfCutoff = 0.25;

    /// <summary>Limit that no run reaches: the rule is off.</summary>
    internal static int Never(int p) => p + 1;

    /// <summary>Limits of the two run rules and the simulated share of attentive respondents reaching each.</summary>
    internal sealed record Limits(int RepeatedRun, int AlternatingRun, double RepeatedRate, double AlternatingRate, int Draws);

    /// <summary>Simulates attentive respondents and chooses the limits.</summary>
    /// <param name="latentCorrelation">R (p × p, row-major, positive definite).</param>
    /// <param name="scores">The items' categories and shares.</param>
    /// <param name="asAnswered">Per item, the answer as given for each of its categories (ascending analysed values).</param>
    /// <param name="alpha">Distance cutoff α.</param>
    /// <param name="repeatedFloor">Smallest repeated-answer limit allowed.</param>
    /// <param name="alternatingFloor">Smallest alternating limit allowed.</param>
    public static Limits Choose(double[] latentCorrelation, NormalScores scores, double[][] asAnswered, double alpha, int repeatedFloor, int alternatingFloor)
    {
        int p = scores.Items;
        var chol = DiscretenessCalibration.CholeskyLower(latentCorrelation, p);
        var cuts = DiscretenessCalibration.Cuts(scores);
        var dummy = cuts.Select(c => new double[c.Length + 1]).ToArray();
        int draws = DiscretenessCalibration.Draws(alpha);
        const int blockRows = DiscretenessCalibration.BlockRows;
        int blocks = (draws + blockRows - 1) / blockRows, n = blocks * blockRows;
        var repeated = new long[blocks][];
        var alternating = new long[blocks][];
        Parallel.For(0, blocks, () => (Rows: new double[blockRows * p], Cat: new int[blockRows * p], Answers: new double[p]), (b, _, s) =>
        {
            // Streams per block index from a seed of our own, so the draws are independent of the distance calibration's.
            DiscretenessCalibration.DrawBlock(b, chol, cuts, dummy, p, s.Rows, s.Cat, Seed);
            var rep = new long[p + 2];
            var alt = new long[p + 2];
            for (int r = 0; r < blockRows; r++)
            {
                for (int j = 0; j < p; j++) s.Answers[j] = asAnswered[j][s.Cat[r * p + j]];
                rep[LongString.Compute(s.Answers)]++;
                alt[AlternatingRun.Compute(s.Answers)]++;
            }
            repeated[b] = rep;
            alternating[b] = alt;
            return s;
        }, _ => { });
        var (repLimit, repRate) = Pick(repeated, p, n, alpha, repeatedFloor);
        var (altLimit, altRate) = Pick(alternating, p, n, alpha, alternatingFloor);
        return new Limits(repLimit, altLimit, repRate, altRate, n);
    }

    /// <summary>Smallest limit ≥ <paramref name="floor"/> reached by at most ShareOfCutoff × α of the draws, and that share.</summary>
    private static (int Limit, double Rate) Pick(long[][] histograms, int p, int n, double alpha, int floor)
    {
        var atLeast = new long[p + 3];
        for (int len = p + 1; len >= 0; len--)
        {
            long count = 0;
            foreach (var h in histograms) count += h[len];
            atLeast[len] = atLeast[len + 1] + count;
        }
        for (int limit = Math.Max(1, floor); limit <= p; limit++)
        {
            double rate = atLeast[limit] / (double)n;
            if (rate <= ShareOfCutoff * alpha) return (limit, rate);
        }
        return (Never(p), 0);
    }
}
