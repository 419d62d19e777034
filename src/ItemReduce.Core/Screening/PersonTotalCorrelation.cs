using System.Runtime.CompilerServices;
namespace ItemReduce.Core.Screening;

/// <summary>
/// Person–total correlation (Curran, P. G., 2016, "Methods for the detection of carelessly invalid responses in
/// survey data", Journal of Experimental Social Psychology 66, 4–19): the Pearson correlation, across the items a
/// respondent answered, between his or her answers and the items' mean answers in the whole sample. Attentive
/// respondents follow the sample's profile of item means (items most people endorse they endorse too); answers
/// unrelated to item content give values near 0. Our conventions: the item means include the respondent (with
/// hundreds of respondents the difference is negligible); NaN with fewer than 3 answers or when either profile has no
/// spread (a straight-liner, or items whose means are all equal). The index only carries information when the item
/// means differ; it is reported, not used for a flag (see the README's screening study).
/// </summary>
internal static class PersonTotalCorrelation
{
    /// <summary>Correlation of <paramref name="answers"/> with <paramref name="itemMeans"/> over the answered items.</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public static double Compute(ReadOnlySpan<double> answers, ReadOnlySpan<double> itemMeans)
    {
        int m = 0;
        double sx = 0, sy = 0;
        for (int j = 0; j < answers.Length; j++)
        {
            if (double.IsNaN(answers[j])) continue;
            m++;
            sx += answers[j];
            sy += itemMeans[j];
        }
        if (m < 3) return double.NaN;
        double mx = sx / m, my = sy / m, sxy = 0, sxx = 0, syy = 0;
        for (int j = 0; j < answers.Length; j++)
        {
            if (double.IsNaN(answers[j])) continue;
            double dx = answers[j] - mx, dy = itemMeans[j] - my;
            sxy += dx * dy;
            sxx += dx * dx;
            syy += dy * dy;
        }
        return sxx > 0 && syy > 1e-12 * Math.Max(1, my * my) ? sxy / Math.Sqrt(sxx * syy) : double.NaN;
    }
}
