using ItemReduce.Core.Data;
using MathNet.Numerics.LinearAlgebra;

namespace ItemReduce.Core.Screening;

/// <summary>
/// Location and covariance for the classical distances when answers may be missing.
/// <list type="bullet">
/// <item>Location: each item's mean over every respondent who answered it.</item>
/// <item>Covariance: pairwise-complete — the entry for items j, k uses the respondents who answered both,
/// centred at that pair's own means, with the <c>m_jk − 1</c> normaliser (two passes). With complete data this
/// is the ordinary sample covariance (n − 1 normaliser).</item>
/// <item>A pairwise matrix need not be positive definite. When its Cholesky factorisation fails, the matrix is
/// repaired by raising every eigenvalue below <see cref="EigenvalueFloorShare"/> × (trace / p) to that floor and
/// rebuilding <c>V Λ Vᵀ</c>; a warning is returned. Every principal sub-matrix of the repaired matrix is then
/// positive definite, so each missing-data pattern can be factorised.</item>
/// <item>A pair with fewer than 2 joint answers has no covariance; it is set to 0 with a warning.</item>
/// </list>
/// </summary>
internal static class PairwiseCovariance
{
    /// <summary>Eigenvalue floor, as a share of the mean eigenvalue, used by the repair.</summary>
    internal const double EigenvalueFloorShare = 1e-6;

    /// <summary>Item means (over answered values) and the pairwise-complete covariance (p × p).</summary>
    public static (double[] Mean, double[,] Covariance, int PairsWithoutOverlap) Compute(ResponseMatrix data)
    {
        var v = data.Storage;
        int n = data.RespondentCount, p = data.ItemCount;
        bool complete = true;
        foreach (double x in v) if (double.IsNaN(x)) { complete = false; break; }
        if (complete)
        {
            if (n < 2) return (new double[p].Select(_ => double.NaN).ToArray(), Nan(p), p * (p + 1) / 2);
            var (m, flat) = RowMoments.MeanCovariance(v, p, Enumerable.Range(0, n).ToArray(), n - 1);
            var full = new double[p, p];
            for (int j = 0; j < p; j++)
                for (int k = 0; k < p; k++) full[j, k] = flat[j * p + k];
            return (m, full, 0);
        }

        var mean = ItemMoments.Compute(data).Means;
        var cov = new double[p, p];
        int without = 0;
        // Rows of the lower triangle in parallel: each task writes its own cells only.
        Parallel.For(0, p, j =>
        {
            for (int k = 0; k <= j; k++)
            {
                int m = 0;
                double sj = 0, sk = 0;
                for (int i = 0; i < n; i++)
                {
                    double a = v[i * p + j], b = v[i * p + k];
                    if (double.IsNaN(a) || double.IsNaN(b)) continue;
                    m++; sj += a; sk += b;
                }
                if (m < 2) { cov[j, k] = cov[k, j] = 0; Interlocked.Increment(ref without); continue; }
                double mj = sj / m, mk = sk / m, c = 0;
                for (int i = 0; i < n; i++)
                {
                    double a = v[i * p + j], b = v[i * p + k];
                    if (double.IsNaN(a) || double.IsNaN(b)) continue;
                    c += (a - mj) * (b - mk);
                }
                cov[j, k] = cov[k, j] = c / (m - 1);
            }
        });
        return (mean, cov, without);
    }

    private static double[,] Nan(int p)
    {
        var m = new double[p, p];
        for (int j = 0; j < p; j++)
            for (int k = 0; k < p; k++) m[j, k] = double.NaN;
        return m;
    }

    /// <summary>
    /// Returns <paramref name="cov"/> unchanged when positive definite, otherwise the eigenvalue-floored
    /// repair described on the type; <c>Repaired</c> tells which, <c>SmallestEigenvalue</c> is the smallest
    /// eigenvalue before repair (NaN when no decomposition was needed).
    /// </summary>
    public static (double[,] Matrix, bool Repaired, double SmallestEigenvalue) EnsurePositiveDefinite(double[,] cov)
    {
        if (ScreeningCholesky.TryFactor(cov) is not null) return (cov, false, double.NaN);
        int p = cov.GetLength(0);
        var m = Matrix<double>.Build.DenseOfArray(cov);
        var evd = m.Evd(Symmetricity.Symmetric);
        var values = evd.EigenValues.Select(c => c.Real).ToArray();
        double trace = 0;
        for (int j = 0; j < p; j++) trace += Math.Max(cov[j, j], 0);
        double floor = Math.Max(EigenvalueFloorShare * trace / p, double.Epsilon);
        double smallest = values.Min();
        var clipped = Vector<double>.Build.Dense(values.Select(l => Math.Max(l, floor)).ToArray());
        var rebuilt = evd.EigenVectors * Matrix<double>.Build.DiagonalOfDiagonalVector(clipped) * evd.EigenVectors.Transpose();
        var r = new double[p, p];
        for (int j = 0; j < p; j++)
            for (int k = 0; k < p; k++) r[j, k] = 0.5 * (rebuilt[j, k] + rebuilt[k, j]);
        return (r, true, smallest);
    }
}
