using System.Runtime.CompilerServices;
namespace ItemReduce.Core.Screening;

/// <summary>
/// Long-string index: the longest run of identical consecutive answers in presentation order (Johnson, J. A.,
/// 2005, "Ascertaining the validity of individual protocols from Web-based personality inventories", Journal of
/// Research in Personality 39(1), 103–129). Our convention for skipped items: a missing answer ends the current
/// run (runs are not joined across a gap). A respondent with no answers has index 0.
/// </summary>
internal static class LongString
{
    /// <summary>Longest run of equal, non-missing consecutive values in <paramref name="answers"/>.</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public static int Compute(ReadOnlySpan<double> answers)
    {
        int longest = 0, run = 0;
        double previous = double.NaN;
        foreach (double x in answers)
        {
            if (double.IsNaN(x)) { run = 0; previous = double.NaN; continue; }
            run = x == previous ? run + 1 : 1;
            previous = x;
            if (run > longest) longest = run;
        }
        return longest;
    }
}
