using System.Runtime.CompilerServices;
namespace ItemReduce.Core.Screening;

/// <summary>
/// Intra-individual response variability (IRV): the standard deviation of one respondent's answers across the
/// items he or she answered (Dunn, A. M., Heggestad, E. D., Shanock, L. R., &amp; Theilgan, N., 2018,
/// "Intra-individual response variability as an indicator of insufficient effort responding: Comparison to
/// other indicators and relationships with individual differences", Journal of Business and Psychology 33(1),
/// 105–121). We use the n − 1 normaliser and two passes; fewer than 2 answers give NaN. Very low values
/// mean a nearly flat answer profile.
/// </summary>
internal static class IntraIndividualResponseVariability
{
    /// <summary>SD (n − 1) of the non-missing values of <paramref name="answers"/>; NaN when fewer than 2.</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public static double Compute(ReadOnlySpan<double> answers)
    {
        int m = 0;
        double sum = 0;
        foreach (double x in answers) if (!double.IsNaN(x)) { m++; sum += x; }
        if (m < 2) return double.NaN;
        double mean = sum / m, ss = 0;
        foreach (double x in answers) if (!double.IsNaN(x)) ss += (x - mean) * (x - mean);
        return Math.Sqrt(ss / (m - 1));
    }
}
