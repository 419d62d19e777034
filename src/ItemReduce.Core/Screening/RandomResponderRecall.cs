using System.Globalization;

namespace ItemReduce.Core.Screening;

/// <summary>
/// How many uniform-random responders the screening (all rules, with the random-answering index) caught in the study
/// slices run for the index (benchmarks/results/screening-study-index-careless-2026-12-02.md and
/// screening-study-index-careless12-2026-12-02.md, section "Random responders: the screening against the best
/// possible test"; about 200 planted careless respondents per cell, so a recall has a standard error of 4–7 points), by number of items, next to the
/// most powerful test possible (the likelihood ratio with the true
/// model, Neyman–Pearson). Design of those cells: five-point items from a factor model (subscales of six, loadings
/// .5–.8, factor correlations .3), 5 % of answers missing at random, 20 respondents per item, 5 % or 10 % careless
/// respondents, cutoff p = 0.001. Used for the on-screen warning and the rule text: random answering is only partly
/// detectable from the answers themselves, and the tool says how partly for designs like the one at hand.
/// A test compares every figure with the committed study table.
/// </summary>
internal static class RandomResponderRecall
{
    /// <summary>Recall (%) figures of one studied number of items: the screening's range over the cells (any rule),
    /// and the likelihood-ratio test with the true model at the nominal rate, for symmetric and skewed answers.</summary>
    internal sealed record Band(int Items, double SymmetricLow, double SymmetricHigh, double SkewedLow, double SkewedHigh, double BestSymmetric, double BestSkewed);

    /// <summary>Studied bands, ascending in items.</summary>
    internal static IReadOnlyList<Band> Bands { get; } =
    [
        new(12, 31.4, 35.6, 13.3, 13.7, 36.3, 20.7),
        new(24, 53.3, 64.0, 40.0, 46.0, 70.3, 52.9),
        new(36, 83.3, 88.9, 53.3, 56.3, 88.7, 75.8),
        new(48, 91.7, 92.0, 70.0, 80.0, 96.3, 87.7),
    ];

    /// <summary>Recall target of the careless-response screening (%), from the requirements of the tool.</summary>
    internal const double Target = 90;

    /// <summary>The studied band nearest to <paramref name="items"/> items (ties to the smaller band).</summary>
    internal static Band Nearest(int items) => Bands.OrderBy(b => Math.Abs(b.Items - items)).ThenBy(b => b.Items).First();

    /// <summary>The sentence for a survey with <paramref name="items"/> items analysed at cutoff <paramref name="cutoffP"/>;
    /// null when both the symmetric and the skewed cells of the nearest band reached the target.</summary>
    internal static string? Statement(int items, double cutoffP)
    {
        var b = Nearest(items);
        if (b.SymmetricLow >= Target && b.SkewedLow >= Target) return null;
        var c = CultureInfo.InvariantCulture;
        string cutoff = cutoffP == 0.001 ? "" : string.Format(c, " (this run used cutoff p = {0}; the study used 0.001)", cutoffP);
        return string.Format(c,
            "Random answering is only partly detectable from the answers themselves. In our validation study with {0} five-point items " +
            "(20 respondents per item, 5 % of answers missing, cutoff p = 0.001) the screening flagged {1} % of planted uniform-random responders with symmetric " +
            "answer distributions and {2} % with skewed ones{5}; the most powerful test possible, which knows the true model, would flag about {3:0} % and {4:0} %. " +
            "An unflagged respondent is therefore not shown to have answered attentively: use attention-check items or other evidence (such as completion times) " +
            "to find random answering, and treat the flags as prompts for human review.",
            b.Items, Range(b.SymmetricLow, b.SymmetricHigh), Range(b.SkewedLow, b.SkewedHigh), b.BestSymmetric, b.BestSkewed, cutoff);
    }

    /// <summary>"92" when both ends round to the same whole percent, else "70–80".</summary>
    private static string Range(double low, double high)
    {
        var c = CultureInfo.InvariantCulture;
        string a = low.ToString("0", c), b = high.ToString("0", c);
        return a == b ? a : a + "–" + b;
    }
}
