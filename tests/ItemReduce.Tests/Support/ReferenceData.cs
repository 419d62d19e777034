using System.Globalization;

namespace ItemReduce.Tests.Support;

/// <summary>
/// The one reader of the committed reference fixtures under ReferenceData/AREA/ (written by the scripts beside them).
/// One convention for every fixture: empty lines and lines starting with '#' (provenance comments) are skipped; cells
/// are comma-separated; numbers are invariant-culture; an empty cell is NaN.
/// </summary>
internal static class ReferenceData
{
    /// <summary>Full path of a fixture file or folder.</summary>
    public static string PathOf(params string[] parts) =>
        Path.Combine([AppContext.BaseDirectory, "ReferenceData", .. parts]);

    /// <summary>The fixture's data lines (comments and empty lines skipped), header included when it has one.</summary>
    public static string[] Lines(string area, string file) =>
        File.ReadAllLines(PathOf(area, file)).Where(l => l.Length > 0 && !l.StartsWith('#')).ToArray();

    /// <summary>One cell as a number; empty = NaN.</summary>
    public static double Parse(string cell) =>
        cell.Length == 0 ? double.NaN : double.Parse(cell, NumberStyles.Float, CultureInfo.InvariantCulture);

    /// <summary>Numeric CSV without header, row by row.</summary>
    public static double[][] Numbers(string area, string file) =>
        Lines(area, file).Select(l => l.Split(',').Select(Parse).ToArray()).ToArray();

    /// <summary>Numeric CSV without header as a matrix (rows of equal length).</summary>
    public static double[,] Matrix(string area, string file)
    {
        var rows = Numbers(area, file);
        var m = new double[rows.Length, rows[0].Length];
        for (int i = 0; i < rows.Length; i++)
            for (int j = 0; j < rows[i].Length; j++) m[i, j] = rows[i][j];
        return m;
    }

    /// <summary>Every number of a headerless numeric CSV, row after row.</summary>
    public static double[] Vector(string area, string file) => Numbers(area, file).SelectMany(r => r).ToArray();

    /// <summary>Numeric CSV with a header row: the header and the rows.</summary>
    public static (string[] Header, double[][] Rows) Table(string area, string file)
    {
        var lines = Lines(area, file);
        return (lines[0].Split(','), lines.Skip(1).Select(l => l.Split(',').Select(Parse).ToArray()).ToArray());
    }

    /// <summary>Numeric CSV with a header row: column name → values.</summary>
    public static Dictionary<string, double[]> Columns(string area, string file)
    {
        var (header, rows) = Table(area, file);
        return header.Select((h, c) => (h, c)).ToDictionary(t => t.h, t => rows.Select(r => r[t.c]).ToArray());
    }

    /// <summary>CSV with a header row, cells as text (for fixtures that mix names and numbers).</summary>
    public static string[][] Fields(string area, string file) => Lines(area, file).Skip(1).Select(l => l.Split(',')).ToArray();
}
