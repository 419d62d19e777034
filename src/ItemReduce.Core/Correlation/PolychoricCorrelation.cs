using ItemReduce.Core.Data;
using MathNet.Numerics.Distributions;

namespace ItemReduce.Core.Correlation;

/// <summary>
/// Polychoric correlation of ordinal items by the two-step maximum-likelihood method of Olsson (1979),
/// "Maximum likelihood estimation of the polychoric correlation coefficient", Psychometrika 44(4), 443–460
/// (Section 3, the "two-step" estimator). For each pair of items: (1) thresholds from the marginals of the
/// pair's contingency table, a_i = Φ⁻¹(P_{i·} cumulative), b_j = Φ⁻¹(P_{·j} cumulative) (Olsson eq. 7);
/// (2) ρ maximising the log-likelihood ln L = Σ n_ij ln π_ij(ρ) with
/// π_ij = Φ₂(a_i, b_j) − Φ₂(a_{i−1}, b_j) − Φ₂(a_i, b_{j−1}) + Φ₂(a_{i−1}, b_{j−1}) (Olsson eq. 2–4), found by
/// Brent's (1973) derivative-free one-dimensional minimiser on ρ ∈ [−0.9999, 0.9999]. Φ₂ is
/// <see cref="BivariateNormalDistribution"/> (Genz, 2004).
/// <para>
/// Categories are the distinct observed values of each item in ascending order (at most
/// <see cref="MaxCategories"/>); categories empty within a pair are dropped for that pair. A pair whose
/// table has fewer than two non-empty rows or columns gives NaN. The matrix need not be positive definite:
/// see <see cref="NearestCorrelationMatrix"/>.
/// </para>
/// </summary>
public static class PolychoricCorrelation
{
    /// <summary>Most distinct values an item may have to be treated as ordinal.</summary>
    public const int MaxCategories = 20;

    /// <summary>Bound on |ρ| during the search.</summary>
    internal const double RhoBound = 0.9999;

    /// <summary>Polychoric correlation matrix (p × p, unit diagonal) of the ordinal items in <paramref name="data"/>.</summary>
    /// <exception cref="ArgumentException">An item has more than <see cref="MaxCategories"/> distinct values.</exception>
    public static double[,] Compute(ResponseMatrix data, MissingDataHandling handling = MissingDataHandling.Pairwise)
        => Compute(data, handling, -1);

    internal static double[,] Compute(ResponseMatrix data, MissingDataHandling handling, int maxDegreeOfParallelism)
    {
        ArgumentNullException.ThrowIfNull(data);
        if (handling == MissingDataHandling.Listwise && data.HasMissing())
            data = data.SelectRespondents(PearsonCorrelation.CompleteRows(data));
        int n = data.RespondentCount, p = data.ItemCount;
        var codes = new int[p][];
        var levels = new int[p];
        for (int j = 0; j < p; j++) (codes[j], levels[j]) = CategoryCodes(data, j);
        var r = new double[p, p];
        var options = new ParallelOptions { MaxDegreeOfParallelism = maxDegreeOfParallelism };
        Parallel.For(0, p, options, j =>
        {
            r[j, j] = 1;
            for (int k = 0; k < j; k++)
            {
                var table = new int[levels[j], levels[k]];
                var cj = codes[j];
                var ck = codes[k];
                for (int i = 0; i < n; i++)
                    if (cj[i] >= 0 && ck[i] >= 0) table[cj[i], ck[i]]++;
                double rho = EstimateUnchecked(table);
                r[j, k] = rho;
                r[k, j] = rho;
            }
        });
        return r;
    }

    /// <summary>Codes 0..c−1 of the distinct observed values of item <paramref name="j"/> (−1 = missing).</summary>
    private static (int[] Codes, int Levels) CategoryCodes(ResponseMatrix data, int j)
    {
        var column = data.Column(j);
        var distinct = column.Where(x => !double.IsNaN(x)).Distinct().Order().ToArray();
        if (distinct.Length > MaxCategories)
            throw new DataConditionException(
                $"Item '{data.Items[j].Name}' has {distinct.Length} distinct values; polychoric correlations allow at most {MaxCategories} ordered categories. Use Pearson correlations for this item set.");
        var codes = new int[column.Length];
        for (int i = 0; i < column.Length; i++)
            codes[i] = double.IsNaN(column[i]) ? -1 : Array.BinarySearch(distinct, column[i]);
        return (codes, Math.Max(distinct.Length, 1));
    }

    /// <summary>Two-step ML polychoric correlation of one contingency table (rows: categories of the first
    /// item in order, columns: of the second). Counts must be non-negative.</summary>
    public static double FromTable(int[,] table)
    {
        ArgumentNullException.ThrowIfNull(table);
        foreach (int c in table)
            if (c < 0) throw new ArgumentException($"Contingency table counts must be ≥ 0, got {c}.", nameof(table));
        return EstimateUnchecked(table);
    }

    internal static double EstimateUnchecked(int[,] table)
    {
        var t = DropEmptyCategories(table);
        if (t.GetLength(0) < 2 || t.GetLength(1) < 2) return double.NaN;
        var a = Thresholds(RowTotals(t));
        var b = Thresholds(ColumnTotals(t));
        return MaximiseLikelihood(t, a, b);
    }

    /// <summary>Removes rows and columns whose total is zero.</summary>
    private static int[,] DropEmptyCategories(int[,] table)
    {
        var rows = Enumerable.Range(0, table.GetLength(0)).Where(i => Enumerable.Range(0, table.GetLength(1)).Any(j => table[i, j] > 0)).ToArray();
        var cols = Enumerable.Range(0, table.GetLength(1)).Where(j => Enumerable.Range(0, table.GetLength(0)).Any(i => table[i, j] > 0)).ToArray();
        var t = new int[rows.Length, cols.Length];
        for (int i = 0; i < rows.Length; i++)
            for (int j = 0; j < cols.Length; j++) t[i, j] = table[rows[i], cols[j]];
        return t;
    }

    private static long[] RowTotals(int[,] t)
    {
        var s = new long[t.GetLength(0)];
        for (int i = 0; i < s.Length; i++) for (int j = 0; j < t.GetLength(1); j++) s[i] += t[i, j];
        return s;
    }

    private static long[] ColumnTotals(int[,] t)
    {
        var s = new long[t.GetLength(1)];
        for (int j = 0; j < s.Length; j++) for (int i = 0; i < t.GetLength(0); i++) s[j] += t[i, j];
        return s;
    }

    /// <summary>Step 1 (Olsson eq. 7): thresholds −∞ = τ_0 &lt; τ_1 &lt; … &lt; τ_c = +∞ with
    /// τ_m = Φ⁻¹(Σ_{i ≤ m} n_i / N).</summary>
    internal static double[] Thresholds(long[] totals)
    {
        long all = totals.Sum(), acc = 0;
        var tau = new double[totals.Length + 1];
        tau[0] = double.NegativeInfinity;
        tau[^1] = double.PositiveInfinity;
        for (int m = 1; m < totals.Length; m++)
        {
            acc += totals[m - 1];
            tau[m] = Normal.InvCDF(0, 1, (double)acc / all);
        }
        return tau;
    }

    /// <summary>ln L(ρ) = Σ n_ij ln π_ij(ρ) (Olsson eq. 4 without the constant); π clamped at 1e-300.</summary>
    internal static double LogLikelihood(int[,] t, double[] a, double[] b, double rho)
    {
        var cdf = CornerGrid(a, b, rho, BivariateNormalDistribution.Cdf);
        double ll = 0;
        for (int i = 0; i < t.GetLength(0); i++)
            for (int j = 0; j < t.GetLength(1); j++)
                if (t[i, j] != 0) ll += t[i, j] * Math.Log(Math.Max(CellDifference(cdf, i, j), 1e-300));
        return ll;
    }

    /// <summary>Corner grid f(a_i, b_j, ρ), i = 0..r, j = 0..c (f = Φ₂ or φ₂).</summary>
    private static double[,] CornerGrid(double[] a, double[] b, double rho, Func<double, double, double, double> f)
    {
        var grid = new double[a.Length, b.Length];
        for (int i = 0; i < a.Length; i++)
            for (int j = 0; j < b.Length; j++)
                grid[i, j] = f(a[i], b[j], rho);
        return grid;
    }

    /// <summary>Rectangle difference over cell (i, j): g(i+1, j+1) − g(i, j+1) − g(i+1, j) + g(i, j); with g = Φ₂
    /// it is the cell probability π_ij, with g = φ₂ its derivative in ρ.</summary>
    private static double CellDifference(double[,] g, int i, int j) => g[i + 1, j + 1] - g[i, j + 1] - g[i + 1, j] + g[i, j];

    /// <summary>Step 2: ρ̂ = argmax ln L on [−<see cref="RhoBound"/>, <see cref="RhoBound"/>]: Brent's search on
    /// ln L, then up to three Newton steps on the score (Olsson eq. 8), because ln L is flat at its maximum and
    /// function values alone locate it only to about 1e-8.</summary>
    private static double MaximiseLikelihood(int[,] t, double[] a, double[] b)
    {
        double rho = BrentMinimizer.Minimise(r => -LogLikelihood(t, a, b, r), -RhoBound, RhoBound, 1e-10);
        for (int step = 0; step < 3; step++)
        {
            double s = Score(t, a, b, rho);
            const double h = 1e-6;
            if (Math.Abs(rho) > RhoBound - 2 * h) break;
            double ds = (Score(t, a, b, rho + h) - Score(t, a, b, rho - h)) / (2 * h);
            if (!(ds < 0)) break;
            double next = rho - s / ds;
            if (Math.Abs(next - rho) > 1e-6 || Math.Abs(next) > RhoBound) break;
            rho = next;
        }
        return rho;
    }

    /// <summary>d ln L / dρ = Σ n_ij / π_ij · dπ_ij/dρ, with dΦ₂/dρ = φ₂ (Olsson 1979, eq. 8).</summary>
    internal static double Score(int[,] t, double[] a, double[] b, double rho)
    {
        var cdf = CornerGrid(a, b, rho, BivariateNormalDistribution.Cdf);
        var pdf = CornerGrid(a, b, rho, BivariateNormalDistribution.Density);
        double score = 0;
        for (int i = 0; i < t.GetLength(0); i++)
            for (int j = 0; j < t.GetLength(1); j++)
                if (t[i, j] != 0) score += t[i, j] * CellDifference(pdf, i, j) / Math.Max(CellDifference(cdf, i, j), 1e-300);
        return score;
    }
}
