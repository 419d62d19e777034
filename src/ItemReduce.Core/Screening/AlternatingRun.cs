using System.Runtime.CompilerServices;
namespace ItemReduce.Core.Screening;

/// <summary>
/// Alternating-run index: the largest number of answers in a stretch of consecutive items, in presentation order,
/// that follows a period-two pattern a, b, a, b, … with a ≠ b (1-5-1-5 or 3-5-3-5): every answered item in an even
/// position of the stretch has the same answer a and every answered item in an odd position the same answer b.
/// Our own extension of the long-string index (Johnson, J. A., 2005, Journal of Research in Personality 39(1),
/// 103–129) from period one to period two, aimed at seesaw answering that neither the long-string index nor a low
/// within-person spread catches when the two answers are close together. Skipped items: missing answers neither end
/// the stretch nor count, however many follow one another (unlike <see cref="LongString"/>, whose convention is kept
/// as it was), because the positions keep their parity and a seesaw pattern is still recognisable across a gap. (An
/// earlier version ended the stretch at two missing answers in a row; with 5 % of answers missing that split about
/// 1 % of planted alternators into two stretches both below the limit.) 0 with no answers.
/// </summary>
internal static class AlternatingRun
{
    /// <summary>Largest number of answers in a period-two stretch of <paramref name="answers"/>.</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public static int Compute(ReadOnlySpan<double> answers)
    {
        int longest = 0, count = 0;
        double even = double.NaN, odd = double.NaN;   // the stretch's answers at even and odd positions (NaN = none yet)
        int lastIndex = -1;
        double last = double.NaN;
        for (int j = 0; j < answers.Length; j++)
        {
            double x = answers[j];
            if (double.IsNaN(x)) continue;
            ref double own = ref (j % 2 == 0 ? ref even : ref odd);
            double other = j % 2 == 0 ? odd : even;
            if (count > 0 && (double.IsNaN(own) || own == x) && x != other)
            {
                own = x;
                count++;
            }
            else
            {
                // Start a new stretch at the previous answer (when it is adjacent and differs) and this one.
                even = odd = double.NaN;
                count = 0;
                if (lastIndex >= 0 && lastIndex == j - 1 && last != x)
                {
                    if (lastIndex % 2 == 0) even = last; else odd = last;
                    count = 1;
                }
                own = ref (j % 2 == 0 ? ref even : ref odd);
                own = x;
                count++;
            }
            lastIndex = j;
            last = x;
            if (count > longest) longest = count;
        }
        return longest;
    }
}
