using System.Runtime.CompilerServices;
namespace ItemReduce.Core.Screening;

/// <summary>
/// Even-odd consistency (Meade, A. W., &amp; Craig, S. B., 2012, "Identifying careless responses in survey data",
/// Psychological Methods 17(3), 437–455; the index goes back to Johnson, 2005). Within each subscale the items are
/// taken in column order and split into odd positions (1st, 3rd, …) and even positions (2nd, 4th, …); for one
/// respondent each half gets the mean of its answered items. Across the subscales where both halves have an
/// answer, the odd-half means are correlated (Pearson) with the even-half means, and the correlation is
/// stepped up with the Spearman–Brown formula <c>2r / (1 + r)</c>. Our conventions: at least
/// <c>minSubscales</c> usable subscales are required, otherwise NaN; NaN also when either half-score vector has no
/// spread (e.g. a straight-liner); stepped-up values below −1 are reported as −1. Low or negative values mean
/// the two halves of the same scales disagree. Use the analysed (reverse-scored) answers.
/// </summary>
internal sealed class EvenOddConsistency
{
    private readonly int[][] _odd;
    private readonly int[][] _even;
    private readonly int _minSubscales;

    /// <param name="subscaleOfItem">Subscale name per column (null = not part of any subscale).</param>
    /// <param name="minSubscales">Usable subscales needed for a coefficient (≥ 3).</param>
    public EvenOddConsistency(IReadOnlyList<string?> subscaleOfItem, int minSubscales)
    {
        if (minSubscales < 3) throw new ArgumentOutOfRangeException(nameof(minSubscales), minSubscales, "at least 3 subscales are needed for a correlation");
        _minSubscales = minSubscales;
        var groups = new List<(string Name, List<int> Items)>();
        for (int j = 0; j < subscaleOfItem.Count; j++)
        {
            string? s = subscaleOfItem[j];
            if (string.IsNullOrEmpty(s)) continue;
            int g = groups.FindIndex(t => t.Name == s);
            if (g < 0) { groups.Add((s, [])); g = groups.Count - 1; }
            groups[g].Items.Add(j);
        }
        var two = groups.Where(g => g.Items.Count >= 2).ToList();
        _odd = two.Select(g => g.Items.Where((_, i) => i % 2 == 0).ToArray()).ToArray();
        _even = two.Select(g => g.Items.Where((_, i) => i % 2 == 1).ToArray()).ToArray();
    }

    /// <summary>Subscales with at least two items (each can give an odd and an even half).</summary>
    public int SplittableSubscales => _odd.Length;

    /// <summary>True when enough subscales exist for the index to be computed at all.</summary>
    public bool Applicable => SplittableSubscales >= _minSubscales;

    /// <summary>The Spearman–Brown corrected even-odd coefficient of one respondent, or NaN.</summary>
    public double Compute(ReadOnlySpan<double> answers) => Compute(answers, out _);

    /// <summary>The coefficient and the number of subscales it rests on (both halves answered).</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public double Compute(ReadOnlySpan<double> answers, out int usedSubscales)
    {
        usedSubscales = 0;
        if (!Applicable) return double.NaN;
        Span<double> odd = _odd.Length <= 128 ? stackalloc double[_odd.Length] : new double[_odd.Length];
        Span<double> even = _odd.Length <= 128 ? stackalloc double[_odd.Length] : new double[_odd.Length];
        int m = 0;
        for (int g = 0; g < _odd.Length; g++)
        {
            double a = HalfMean(answers, _odd[g]), b = HalfMean(answers, _even[g]);
            if (double.IsNaN(a) || double.IsNaN(b)) continue;
            odd[m] = a; even[m] = b; m++;
        }
        usedSubscales = m;
        if (m < _minSubscales) return double.NaN;
        double r = Pearson(odd[..m], even[..m]);
        if (double.IsNaN(r)) return double.NaN;
        double stepped = 2 * r / (1 + r);
        return r <= -1 || stepped < -1 ? -1 : stepped;
    }

    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private static double HalfMean(ReadOnlySpan<double> answers, int[] items)
    {
        int m = 0;
        double s = 0;
        foreach (int j in items) if (!double.IsNaN(answers[j])) { m++; s += answers[j]; }
        return m == 0 ? double.NaN : s / m;
    }

    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private static double Pearson(ReadOnlySpan<double> a, ReadOnlySpan<double> b)
    {
        int m = a.Length;
        double ma = 0, mb = 0;
        for (int i = 0; i < m; i++) { ma += a[i]; mb += b[i]; }
        ma /= m; mb /= m;
        double saa = 0, sbb = 0, sab = 0;
        for (int i = 0; i < m; i++)
        {
            double da = a[i] - ma, db = b[i] - mb;
            saa += da * da; sbb += db * db; sab += da * db;
        }
        // Relative zero-spread check: equal half means (up to rounding) carry no information.
        if (saa <= 1e-24 * Math.Max(1, ma * ma) || sbb <= 1e-24 * Math.Max(1, mb * mb)) return double.NaN;
        return Math.Clamp(sab / Math.Sqrt(saa * sbb), -1, 1);
    }
}
