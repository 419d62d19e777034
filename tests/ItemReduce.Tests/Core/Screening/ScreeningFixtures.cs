using System.Globalization;

namespace ItemReduce.Tests.Core.Screening;

/// <summary>Reads the CSV fixtures in ReferenceData/Screening (lines starting with '#' are comments; empty cell = NaN).</summary>
internal static class ScreeningFixtures
{
    public static (string[] Header, double[][] Rows) Read(string file)
    {
        string path = Path.Combine(AppContext.BaseDirectory, "ReferenceData", "Screening", file);
        var lines = File.ReadAllLines(path).Where(l => l.Length > 0 && !l.StartsWith('#')).ToArray();
        var header = lines[0].Split(',');
        var rows = lines.Skip(1).Select(l => l.Split(',').Select(c => c.Length == 0 ? double.NaN : double.Parse(c, CultureInfo.InvariantCulture)).ToArray()).ToArray();
        return (header, rows);
    }

    /// <summary>Spearman rank correlation (average ranks for ties), used to compare distance orderings.</summary>
    public static double Spearman(IReadOnlyList<double> a, IReadOnlyList<double> b)
    {
        var ra = Ranks(a);
        var rb = Ranks(b);
        double ma = ra.Average(), mb = rb.Average(), sab = 0, saa = 0, sbb = 0;
        for (int i = 0; i < ra.Length; i++)
        {
            sab += (ra[i] - ma) * (rb[i] - mb);
            saa += (ra[i] - ma) * (ra[i] - ma);
            sbb += (rb[i] - mb) * (rb[i] - mb);
        }
        return sab / Math.Sqrt(saa * sbb);
    }

    private static double[] Ranks(IReadOnlyList<double> v)
    {
        var order = Enumerable.Range(0, v.Count).OrderBy(i => v[i]).ToArray();
        var r = new double[v.Count];
        for (int s = 0; s < order.Length;)
        {
            int e = s;
            while (e + 1 < order.Length && v[order[e + 1]] == v[order[s]]) e++;
            for (int t = s; t <= e; t++) r[order[t]] = (s + e) / 2.0 + 1;
            s = e + 1;
        }
        return r;
    }
}
