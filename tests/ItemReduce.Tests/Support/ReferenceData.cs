using System.Globalization;

namespace ItemReduce.Tests.Support;

/// <summary>Reads committed reference fixtures (lines starting with '#' are provenance comments).</summary>
internal static class ReferenceData
{
    public static string PathOf(params string[] parts) =>
        Path.Combine([AppContext.BaseDirectory, "ReferenceData", .. parts]);

    /// <summary>Numeric CSV without header; empty cells are NaN.</summary>
    public static double[][] Numbers(params string[] parts) =>
        File.ReadAllLines(PathOf(parts))
            .Where(l => l.Length > 0 && !l.StartsWith('#'))
            .Select(l => l.Split(',').Select(c => c.Length == 0 ? double.NaN : double.Parse(c, CultureInfo.InvariantCulture)).ToArray())
            .ToArray();
}
