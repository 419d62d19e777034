using System.Globalization;

namespace ItemReduce.Tests.Core.Factoring;

/// <summary>Reads the numeric CSV fixtures under ReferenceData (written by the committed .py scripts).</summary>
internal static class ReferenceCsv
{
    public static string PathOf(string area, string file) => Path.Combine(AppContext.BaseDirectory, "ReferenceData", area, file);

    public static double[,] Matrix(string area, string file)
    {
        var rows = File.ReadAllLines(PathOf(area, file)).Where(l => l.Length > 0)
            .Select(l => l.Split(',').Select(s => double.Parse(s, CultureInfo.InvariantCulture)).ToArray()).ToArray();
        var m = new double[rows.Length, rows[0].Length];
        for (int i = 0; i < rows.Length; i++)
            for (int j = 0; j < rows[0].Length; j++) m[i, j] = rows[i][j];
        return m;
    }

    public static double[] Vector(string area, string file) =>
        File.ReadAllLines(PathOf(area, file)).Where(l => l.Length > 0).SelectMany(l => l.Split(','))
            .Select(s => double.Parse(s, CultureInfo.InvariantCulture)).ToArray();

    /// <summary>A CSV with a header row: column name → values.</summary>
    public static Dictionary<string, double[]> Table(string area, string file)
    {
        var lines = File.ReadAllLines(PathOf(area, file)).Where(l => l.Length > 0).ToArray();
        var head = lines[0].Split(',');
        var d = head.ToDictionary(h => h, _ => new double[lines.Length - 1]);
        for (int i = 1; i < lines.Length; i++)
        {
            var cells = lines[i].Split(',');
            for (int c = 0; c < head.Length; c++)
                d[head[c]][i - 1] = double.TryParse(cells[c], NumberStyles.Float, CultureInfo.InvariantCulture, out double v) ? v : double.NaN;
        }
        return d;
    }
}

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
