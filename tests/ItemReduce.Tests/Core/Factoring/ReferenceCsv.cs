namespace ItemReduce.Tests.Core.Factoring;

/// <summary>Comparisons of loading matrices that are only defined up to column order and sign.</summary>
internal static class LoadingAssert
{
    /// <summary>Column permutation and signs of <paramref name="actual"/> that best match <paramref name="expected"/>.</summary>
    public static double[,] Matched(double[,] actual, double[,] expected)
    {
        int p = actual.GetLength(0), k = actual.GetLength(1);
        int[]? bestPerm = null;
        double bestErr = double.PositiveInfinity;
        foreach (var perm in Permutations(Enumerable.Range(0, k).ToArray()))
        {
            double err = 0;
            for (int f = 0; f < k; f++)
            {
                double plus = 0, minus = 0;
                for (int j = 0; j < p; j++)
                {
                    plus += Math.Pow(actual[j, perm[f]] - expected[j, f], 2);
                    minus += Math.Pow(-actual[j, perm[f]] - expected[j, f], 2);
                }
                err += Math.Min(plus, minus);
            }
            if (err < bestErr) { bestErr = err; bestPerm = perm; }
        }
        var m = new double[p, k];
        for (int f = 0; f < k; f++)
        {
            double dot = 0;
            for (int j = 0; j < p; j++) dot += actual[j, bestPerm![f]] * expected[j, f];
            double s = dot < 0 ? -1 : 1;
            for (int j = 0; j < p; j++) m[j, f] = s * actual[j, bestPerm![f]];
        }
        return m;
    }

    public static void Close(double[,] expected, double[,] actual, double tolerance, bool upToOrderAndSign = true)
    {
        var a = upToOrderAndSign ? Matched(actual, expected) : actual;
        Assert.Equal(expected.GetLength(0), a.GetLength(0));
        Assert.Equal(expected.GetLength(1), a.GetLength(1));
        for (int i = 0; i < expected.GetLength(0); i++)
            for (int j = 0; j < expected.GetLength(1); j++)
                Assert.True(Math.Abs(expected[i, j] - a[i, j]) <= tolerance,
                    $"[{i},{j}]: expected {expected[i, j]:R}, got {a[i, j]:R} (tolerance {tolerance})");
    }

    public static void Close(double[] expected, double[] actual, double tolerance)
    {
        Assert.Equal(expected.Length, actual.Length);
        for (int i = 0; i < expected.Length; i++)
            Assert.True(Math.Abs(expected[i] - actual[i]) <= tolerance,
                $"[{i}]: expected {expected[i]:R}, got {actual[i]:R} (tolerance {tolerance})");
    }

    private static IEnumerable<int[]> Permutations(int[] items)
    {
        if (items.Length <= 1) { yield return items; yield break; }
        for (int i = 0; i < items.Length; i++)
        {
            var rest = items.Where((_, j) => j != i).ToArray();
            foreach (var tail in Permutations(rest)) yield return [items[i], .. tail];
        }
    }
}
