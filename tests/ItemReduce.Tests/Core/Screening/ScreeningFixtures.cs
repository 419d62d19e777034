namespace ItemReduce.Tests.Core.Screening;

/// <summary>Helpers of the screening tests (fixtures are read by <see cref="Support.ReferenceData"/>).</summary>
internal static class ScreeningFixtures
{
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
