using MathNet.Numerics.LinearAlgebra;

namespace ItemReduce.Core.Factoring;

/// <summary>
/// Sign, order and label conventions for rotated factors (our own rules):
/// <list type="number">
/// <item>Sign: each factor column of the pattern is multiplied by −1 when its sum is negative; the
/// corresponding row and column of Φ are flipped with it.</item>
/// <item>Order: factors are sorted by variance explained Σⱼ Pⱼf Sⱼf, descending (ties keep extraction order).</item>
/// <item>Subscale home factor: for each declared subscale, the factor on which its items have the largest sum
/// of squared pattern loadings.</item>
/// <item>Label: a factor is labelled with the subscale whose home it is; when several subscales share a home
/// factor the one with the largest sum of squared loadings there wins; a factor that is nobody's home gets
/// "F" + its 1-based position.</item>
/// </list>
/// </summary>
internal static class FactorAlignment
{
    /// <summary>Flips and reorders the factors of (pattern, Φ) as described above.</summary>
    internal static (Matrix<double> Pattern, Matrix<double> Phi) AlignSignsAndOrder(Matrix<double> pattern, Matrix<double> phi)
    {
        int p = pattern.RowCount, k = pattern.ColumnCount;
        var signs = new double[k];
        for (int f = 0; f < k; f++) signs[f] = pattern.Column(f).Sum() < 0 ? -1.0 : 1.0;
        var s = Matrix<double>.Build.DenseOfDiagonalArray(signs);
        var pSigned = pattern * s;
        var phiSigned = s * phi * s;
        var structure = pSigned * phiSigned;
        var ve = new double[k];
        for (int f = 0; f < k; f++)
            for (int j = 0; j < p; j++) ve[f] += pSigned[j, f] * structure[j, f];
        var order = Enumerable.Range(0, k).OrderByDescending(f => ve[f]).ThenBy(f => f).ToArray();
        var perm = Matrix<double>.Build.Dense(k, k);
        for (int c = 0; c < k; c++) perm[order[c], c] = 1.0;
        return (pSigned * perm, perm.TransposeThisAndMultiply(phiSigned) * perm);
    }

    /// <summary>Home factor of each declared subscale (see the type remarks).</summary>
    public static IReadOnlyDictionary<string, int> SubscaleHomeFactors(double[,] pattern, IReadOnlyList<string?>? itemSubscales)
    {
        var home = new Dictionary<string, int>(StringComparer.Ordinal);
        if (itemSubscales is null) return home;
        foreach (var (name, sums) in SubscaleSums(pattern, itemSubscales))
            home[name] = ArgMax(sums);
        return home;
    }

    /// <summary>Factor labels (see the type remarks).</summary>
    public static IReadOnlyList<string> Labels(double[,] pattern, IReadOnlyList<string?>? itemSubscales)
    {
        int k = pattern.GetLength(1);
        var labels = new string[k];
        var best = new double[k];
        Array.Fill(best, double.NegativeInfinity);
        if (itemSubscales is not null)
        {
            foreach (var (name, sums) in SubscaleSums(pattern, itemSubscales))
            {
                int f = ArgMax(sums);
                if (sums[f] > best[f]) { best[f] = sums[f]; labels[f] = name; }
            }
        }
        for (int f = 0; f < k; f++) labels[f] ??= $"F{f + 1}";
        return labels;
    }

    private static IEnumerable<(string Name, double[] Sums)> SubscaleSums(double[,] pattern, IReadOnlyList<string?> itemSubscales)
    {
        int p = pattern.GetLength(0), k = pattern.GetLength(1);
        if (itemSubscales.Count != p)
            throw new ArgumentException($"ItemSubscales has {itemSubscales.Count} entries; the pattern has {p} items.", nameof(itemSubscales));
        var sums = new Dictionary<string, double[]>(StringComparer.Ordinal);
        var order = new List<string>();
        for (int j = 0; j < p; j++)
        {
            string? s = itemSubscales[j];
            if (string.IsNullOrEmpty(s)) continue;
            if (!sums.TryGetValue(s, out var v)) { v = new double[k]; sums[s] = v; order.Add(s); }
            for (int f = 0; f < k; f++) v[f] += pattern[j, f] * pattern[j, f];
        }
        return order.Select(s => (s, sums[s]));
    }

    private static int ArgMax(double[] v)
    {
        int m = 0;
        for (int i = 1; i < v.Length; i++) if (v[i] > v[m]) m = i;
        return m;
    }
}
