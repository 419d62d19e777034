using System.Runtime.CompilerServices;
namespace ItemReduce.Core.Screening;

/// <summary>
/// Alternating-run index: the longest run of consecutive answers, in presentation order, that follow a period-two
/// pattern a, b, a, b, … with a ≠ b (1-5-1-5 or 3-5-3-5). Our own extension of the long-string index (Johnson, J. A.,
/// 2005, Journal of Research in Personality 39(1), 103–129) from period one to period two, aimed at seesaw answering
/// that neither the long-string index nor a low within-person spread catches when the two answers are close
/// together. Same convention for skipped items as <see cref="LongString"/>: a missing answer ends the run. Runs
/// shorter than 3 are reported as their length (0 with no answers, 1 or 2 otherwise).
/// </summary>
internal static class AlternatingRun
{
    /// <summary>Longest period-two run in <paramref name="answers"/>.</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public static int Compute(ReadOnlySpan<double> answers)
    {
        int longest = 0, run = 0;
        double back1 = double.NaN, back2 = double.NaN;
        foreach (double x in answers)
        {
            if (double.IsNaN(x)) { run = 0; back1 = back2 = double.NaN; continue; }
            if (run == 0) run = 1;
            else if (run == 1) run = x != back1 ? 2 : 1;
            else run = x == back2 && x != back1 ? run + 1 : (x != back1 ? 2 : 1);
            back2 = back1;
            back1 = x;
            if (run > longest) longest = run;
        }
        return longest;
    }
}
