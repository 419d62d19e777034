using ItemReduce.Core.LinearAlgebra;

namespace ItemReduce.Core.Dimensions;

/// <summary>Result of <see cref="VelicerMap.Compute"/>.</summary>
/// <param name="Curve">Average squared partial correlation after removing the first m components,
/// index m = 0..M (m = 0 is the average squared off-diagonal correlation of R).</param>
/// <param name="RevisedCurve">Same with fourth powers (the 2000 revision), same indices.</param>
/// <param name="Count">argmin of <paramref name="Curve"/> (first minimum; 0 allowed).</param>
/// <param name="RevisedCount">argmin of <paramref name="RevisedCurve"/>.</param>
internal sealed record VelicerMapResult(double[] Curve, double[] RevisedCurve, int Count, int RevisedCount);

/// <summary>
/// Minimum average partial (MAP) test: Velicer (1976), "Determining the number of components from the matrix
/// of partial correlations", Psychometrika 41(3), 321–327, eq. 5–9: for m = 0, 1, …, remove the first m
/// principal components, C*_m = R − A_m A_mᵀ with A_m = V_m Λ_m^{1/2}, form partial correlations
/// r*_ij = c*_ij / sqrt(c*_ii c*_jj) and f_m = Σ_{i≠j} (r*_ij)² / (p(p − 1)); the number of components is
/// the m that minimises f_m. Revised MAP with fourth powers: Velicer, Eaton &amp; Fava (2000), "Construct explication
/// through factor or component analysis: A review and evaluation of alternative procedures for determining
/// the number of factors or components", in Goffin &amp; Helmes (Eds.), Problems and Solutions in Human
/// Assessment, Kluwer, 41–71 (citation from memory).
/// <para>m runs from 0 to p − 1, stopping earlier if a residual variance c*_ii falls below 1e-12
/// (the partial correlations are then undefined).</para>
/// </summary>
internal static class VelicerMap
{
    /// <summary>MAP curves and counts for the correlation matrix <paramref name="correlation"/> (p ≥ 2).</summary>
    public static VelicerMapResult Compute(double[,] correlation)
    {
        MatrixChecks.SymmetricFinite(correlation, nameof(correlation));
        int p = correlation.GetLength(0);
        if (p < 2) throw new DataConditionException($"MAP needs at least 2 items, got {p}.", nameof(correlation));
        var (values, vectors) = SymmetricEigensolver.Decompose(correlation);
        var c = (double[,])correlation.Clone();
        var curve = new List<double>();
        var revised = new List<double>();
        for (int m = 0; m < p; m++)
        {
            if (m > 0) RemoveComponent(c, values[m - 1], vectors, m - 1);
            if (!AveragePartialPowers(c, out double f2, out double f4)) break;
            curve.Add(f2);
            revised.Add(f4);
        }
        return new VelicerMapResult(curve.ToArray(), revised.ToArray(), ArgMin(curve), ArgMin(revised));
    }

    /// <summary>C ← C − λ v vᵀ (one more principal component partialled out).</summary>
    private static void RemoveComponent(double[,] c, double lambda, double[,] vectors, int component)
    {
        int p = c.GetLength(0);
        double l = Math.Max(lambda, 0);
        for (int i = 0; i < p; i++)
            for (int j = 0; j < p; j++) c[i, j] -= l * vectors[i, component] * vectors[j, component];
    }

    /// <summary>Mean over i ≠ j of r*² and r*⁴; false when a residual variance is ≤ 1e-12.</summary>
    private static bool AveragePartialPowers(double[,] c, out double f2, out double f4)
    {
        int p = c.GetLength(0);
        f2 = f4 = 0;
        var s = new double[p];
        for (int i = 0; i < p; i++)
        {
            if (!(c[i, i] > 1e-12)) return false;
            s[i] = 1 / Math.Sqrt(c[i, i]);
        }
        for (int i = 0; i < p; i++)
            for (int j = 0; j < p; j++)
            {
                if (i == j) continue;
                double q = c[i, j] * s[i] * s[j];
                q *= q;
                f2 += q;
                f4 += q * q;
            }
        double pairs = p * (p - 1.0);
        f2 /= pairs;
        f4 /= pairs;
        return true;
    }

    private static int ArgMin(List<double> f)
    {
        int best = 0;
        for (int m = 1; m < f.Count; m++) if (f[m] < f[best]) best = m;
        return best;
    }
}
