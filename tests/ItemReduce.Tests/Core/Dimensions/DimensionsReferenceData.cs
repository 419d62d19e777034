using System.Globalization;
using ItemReduce.Core.Data;
using ItemReduce.Tests.Support;

namespace ItemReduce.Tests.Core.Dimensions;

/// <summary>The fixtures in ReferenceData/Dimensions (produced by the .py scripts there), read by the one fixture
/// reader <see cref="ReferenceData"/>; this class only binds the folder and builds a few test objects.</summary>
internal static class DimensionsReferenceData
{
    private const string Area = "Dimensions";

    public static string PathOf(string file) => ReferenceData.PathOf(Area, file);

    public static double Parse(string s) => ReferenceData.Parse(s);

    /// <summary>Data lines of a fixture (comments and empty lines skipped; header included).</summary>
    public static string[] Lines(string file) => ReferenceData.Lines(Area, file);

    /// <summary>Rows after the header, cells as text.</summary>
    public static string[][] Fields(string file) => ReferenceData.Fields(Area, file);

    public static double[] Vector(string file) => ReferenceData.Vector(Area, file);

    public static double[,] Matrix(string file) => ReferenceData.Matrix(Area, file);

    /// <summary>A CSV with a header row of item names as a complete ResponseMatrix.</summary>
    public static ResponseMatrix Responses(string file)
    {
        var lines = Lines(file);
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
        foreach (var line in Lines(file).Skip(1))
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
