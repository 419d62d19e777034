namespace ItemReduce.Core.Dimensions;

/// <summary>
/// Empirical Kaiser criterion: Braeken, J., &amp; van Assen, M. A. L. M. (2017). An empirical Kaiser criterion.
/// Psychological Methods, 22(3), 450–466. The j-th observed eigenvalue of the correlation matrix is compared with the
/// reference
/// <c>l_j = max{ (1 + √(p/n))² · (p − Σ_{i&lt;j} λ_i) / (p − j + 1), 1 }</c>:
/// the upper edge of the Marčenko–Pastur distribution of null eigenvalues, (1 + √(p/n))², scaled by the average
/// variance left after the first j − 1 observed eigenvalues, and never below Kaiser's 1. Components are retained
/// while their eigenvalue exceeds its reference (sequentially, stopping at the first that does not).
/// Deterministic and needs no simulation.
/// </summary>
internal static class EmpiricalKaiserCriterion
{
    /// <summary>Reference eigenvalues l_1..l_p for descending <paramref name="eigenvalues"/> of a p × p correlation
    /// matrix from <paramref name="respondents"/> respondents.</summary>
    /// <exception cref="ArgumentException">No eigenvalues or respondents &lt; 1.</exception>
    public static double[] References(IReadOnlyList<double> eigenvalues, int respondents)
    {
        ArgumentNullException.ThrowIfNull(eigenvalues);
        if (eigenvalues.Count < 1) throw new ArgumentException("At least one eigenvalue is needed.", nameof(eigenvalues));
        if (respondents < 1) throw new ArgumentException($"respondents must be ≥ 1, got {respondents}.", nameof(respondents));
        int p = eigenvalues.Count;
        double edge = 1 + Math.Sqrt((double)p / respondents);
        edge *= edge;
        var l = new double[p];
        double before = 0; // Σ_{i<j} λ_i
        for (int j = 0; j < p; j++)
        {
            l[j] = Math.Max(edge * (p - before) / (p - j), 1.0);
            before += eigenvalues[j];
        }
        return l;
    }

    /// <summary>Number of leading eigenvalues above their reference (see <see cref="References"/>).</summary>
    public static int Count(IReadOnlyList<double> eigenvalues, int respondents) =>
        ParallelAnalysis.RetainedCount(eigenvalues, References(eigenvalues, respondents));
}
