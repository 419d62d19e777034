using System.Globalization;
using ItemReduce.Core.Data;

namespace ItemReduce.Tests.Core.Dimensions;

/// <summary>Reads the fixtures in ReferenceData/Dimensions (produced by the .py scripts there).</summary>
internal static class DimensionsReferenceData
{
    public static string PathOf(string file) => Path.Combine(AppContext.BaseDirectory, "ReferenceData", "Dimensions", file);

    public static double Parse(string s) => double.Parse(s, NumberStyles.Float, CultureInfo.InvariantCulture);

    public static double[] Vector(string file) => File.ReadAllLines(PathOf(file)).Where(l => l.Length > 0).Select(Parse).ToArray();

    public static double[,] Matrix(string file)
    {
        var rows = File.ReadAllLines(PathOf(file)).Where(l => l.Length > 0).Select(l => l.Split(',').Select(Parse).ToArray()).ToArray();
        var m = new double[rows.Length, rows[0].Length];
        for (int i = 0; i < rows.Length; i++)
            for (int j = 0; j < rows[i].Length; j++) m[i, j] = rows[i][j];
        return m;
    }

    /// <summary>A CSV with a header row of item names as a complete ResponseMatrix.</summary>
    public static ResponseMatrix Responses(string file)
    {
        var lines = File.ReadAllLines(PathOf(file)).Where(l => l.Length > 0).ToArray();
        var names = lines[0].Split(',');
        var items = names.Select(n => new ItemDefinition(n, null, false, double.MinValue, double.MaxValue, null)).ToList();
        var values = lines.Skip(1).SelectMany(l => l.Split(',').Select(Parse)).ToArray();
        var ids = Enumerable.Range(1, lines.Length - 1).Select(i => $"r{i}").ToList();
        return new ResponseMatrix(ids, items, values);
    }

    /// <summary>quantity,index,value rows of a *_factorability.csv file.</summary>
    public static Dictionary<string, double[]> Quantities(string file)
    {
        var d = new Dictionary<string, List<(int, double)>>();
        foreach (var line in File.ReadAllLines(PathOf(file)).Skip(1).Where(l => l.Length > 0))
        {
            var f = line.Split(',');
            if (!d.TryGetValue(f[0], out var list)) d[f[0]] = list = [];
            list.Add((int.Parse(f[1], CultureInfo.InvariantCulture), Parse(f[2])));
        }
        return d.ToDictionary(kv => kv.Key, kv => kv.Value.OrderBy(t => t.Item1).Select(t => t.Item2).ToArray());
    }

    public static void AssertClose(IReadOnlyList<double> expected, IReadOnlyList<double> actual, double tolerance)
    {
        Assert.Equal(expected.Count, actual.Count);
        for (int i = 0; i < expected.Count; i++)
            Assert.True(Math.Abs(expected[i] - actual[i]) <= tolerance,
                $"index {i}: expected {expected[i]:R}, got {actual[i]:R} (tolerance {tolerance})");
    }
}
