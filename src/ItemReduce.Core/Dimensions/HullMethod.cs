using ItemReduce.Core.LinearAlgebra;

namespace ItemReduce.Core.Dimensions;

/// <summary>Outcome of <see cref="HullMethod"/>.</summary>
/// <param name="Count">Number of factors chosen (0 when no solution stands out).</param>
/// <param name="Fit">Common part accounted for, CAF_m, for m = 0 .. <c>Fit.Length − 1</c> factors (NaN where the
/// residual matrix could not be inverted).</param>
/// <param name="FreeParameters">Free parameters of the m-factor model, p·m − m(m − 1)/2, same indexing.</param>
/// <param name="OnHull">True where solution m lies on the upper convex boundary of the fit/parameters plot.</param>
/// <param name="ScreeTest">Scree-test value st_m of the interior hull points (NaN elsewhere).</param>
public sealed record HullResult(int Count, double[] Fit, int[] FreeParameters, bool[] OnHull, double[] ScreeTest);

/// <summary>
/// The Hull method: Lorenzo-Seva, U., Timmerman, M. E., &amp; Kiers, H. A. L. (2011). The Hull method for selecting the
/// number of common factors. Multivariate Behavioral Research, 46(2), 340–364. Solutions with m = 0 .. J factors
/// are placed in the plane of model complexity (free parameters, p·m − m(m − 1)/2) and fit; the solutions on the
/// upper convex boundary ("hull") are kept, and the one where the boundary bends most — the largest
/// st_m = [(f_m − f_prev)/(d_m − d_prev)] / [(f_next − f_m)/(d_next − d_m)] — is chosen. Fit is the common part
/// accounted for, CAF_m = 1 − KMO(E_m), with E_m the residual matrix of the m-factor minimum-residual solution
/// (<see cref="Factoring.MinimumResidual"/>; E_0 = R), the KMO formula applied to E_m as it is (our reading; rescaling
/// E_m to unit diagonal made the fit fall after the first factor in a check on planted two-factor data). The upper bound J is the parallel-analysis count plus one, as the authors
/// propose, so the highest solution tried can never be chosen (it is an end of the hull).
/// These details were implemented from memory of the paper and should be checked against it: in the project's
/// simulation study this implementation found the planted number of factors in only 58.7 % of 2,808 surveys, mostly
/// by keeping too few (<see cref="RetentionStudyAccuracy.HullOverall"/>), far below what the authors report, so it is
/// reported for comparison and not offered as a command-line rule.
/// </summary>
internal static class HullMethod
{
    /// <summary>Runs the method on the correlation matrix <paramref name="correlation"/> (p × p, positive definite) with
    /// upper bound <paramref name="maxFactors"/> (J ≥ 1, capped where the model has no degrees of freedom left).</summary>
    /// <exception cref="ArgumentException">p &lt; 3 or J &lt; 1.</exception>
    public static HullResult Run(double[,] correlation, int maxFactors) => Run(correlation, maxFactors, null);

    /// <summary>As the public overload; <paramref name="loadings"/> supplies the m-factor minimum-residual loadings
    /// (shared with other rules), or null to fit them here.</summary>
    internal static HullResult Run(double[,] correlation, int maxFactors, Func<int, MathNet.Numerics.LinearAlgebra.Matrix<double>>? loadings)
    {
        ArgumentNullException.ThrowIfNull(correlation);
        int p = correlation.GetLength(0);
        if (p < 3) throw new DataConditionException($"The Hull method needs at least 3 items, got {p}.", nameof(correlation));
        if (maxFactors < 1) throw new ArgumentException($"maxFactors must be ≥ 1, got {maxFactors}.", nameof(maxFactors));
        int j = Math.Min(maxFactors, ComparisonData.MaxFactors(p));
        loadings ??= new MinimumResidualFits(correlation).Loadings;
        var fit = new double[j + 1];
        var parameters = new int[j + 1];
        for (int m = 0; m <= j; m++)
        {
            parameters[m] = p * m - m * (m - 1) / 2;
            fit[m] = CommonPartAccountedFor(correlation, m == 0 ? null : loadings(m));
        }
        var hull = Hull(fit, parameters);
        int best = Select(fit, parameters, hull, out var st);
        var onHull = new bool[j + 1];
        foreach (int m in hull) onHull[m] = true;
        return new HullResult(best, fit, parameters, onHull, st);
    }

    /// <summary>Scree-test values of the interior hull points (NaN elsewhere; +∞ when the next segment is flat) and the
    /// solution with the largest one (0 when the hull has no interior point).</summary>
    internal static int Select(double[] fit, int[] parameters, List<int> hull, out double[] st)
    {
        st = new double[fit.Length];
        Array.Fill(st, double.NaN);
        int best = 0;
        double bestSt = double.NegativeInfinity;
        for (int h = 1; h + 1 < hull.Count; h++)
        {
            int a = hull[h - 1], m = hull[h], b = hull[h + 1];
            double before = (fit[m] - fit[a]) / (parameters[m] - parameters[a]);
            double after = (fit[b] - fit[m]) / (parameters[b] - parameters[m]);
            st[m] = after > 0 ? before / after : double.PositiveInfinity;
            if (st[m] > bestSt) { bestSt = st[m]; best = m; }
        }
        return best;
    }

    /// <summary>CAF = 1 − KMO of the residual matrix R − ΛΛᵀ as it is; NaN when it cannot be inverted.</summary>
    internal static double CommonPartAccountedFor(double[,] r, MathNet.Numerics.LinearAlgebra.Matrix<double>? loadings)
    {
        int p = r.GetLength(0);
        var e = (double[,])r.Clone();
        if (loadings is not null)
            for (int a = 0; a < p; a++)
                for (int b = 0; b < p; b++)
                {
                    double s = 0;
                    for (int f = 0; f < loadings.ColumnCount; f++) s += loadings[a, f] * loadings[b, f];
                    e[a, b] -= s;
                }
        try
        {
            return 1 - KaiserMeyerOlkin.Compute(e).Overall;
        }
        catch (MatrixNotPositiveDefiniteException)
        {
            return double.NaN;
        }
    }

    /// <summary>Indices of the solutions on the upper convex boundary, in order of complexity: first drop solutions
    /// that fit no better than a simpler one (or whose fit is undefined), then repeatedly drop interior points on or
    /// below the line through their neighbours.</summary>
    internal static List<int> Hull(double[] fit, int[] parameters)
    {
        var kept = new List<int>();
        double bestFit = double.NegativeInfinity;
        for (int m = 0; m < fit.Length; m++)
            if (!double.IsNaN(fit[m]) && fit[m] > bestFit) { kept.Add(m); bestFit = fit[m]; }
        bool removed = true;
        while (removed && kept.Count > 2)
        {
            removed = false;
            for (int h = 1; h + 1 < kept.Count; h++)
            {
                int a = kept[h - 1], m = kept[h], b = kept[h + 1];
                double onLine = fit[a] + (fit[b] - fit[a]) * (parameters[m] - parameters[a]) / (double)(parameters[b] - parameters[a]);
                if (fit[m] <= onLine) { kept.RemoveAt(h); removed = true; break; }
            }
        }
        return kept;
    }
}
