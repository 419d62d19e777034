using System.Runtime.CompilerServices;
namespace ItemReduce.Core.Screening;

/// <summary>
/// Psychometric synonyms and antonyms (Meade, A. W., &amp; Craig, S. B., 2012, "Identifying careless responses in
/// survey data", Psychological Methods 17(3), 437–455): item pairs that are highly correlated in the sample
/// (synonyms, r ≥ <see cref="Critical"/>; antonyms, r ≤ −<see cref="Critical"/>, the paper's critical value .60)
/// are listed once for the sample; for each respondent the index is the Pearson correlation, across the listed
/// pairs he or she answered, between the answers to the first and to the second item of each pair. Attentive
/// respondents give positive synonym values (and negative antonym values); careless ones values near 0.
/// Our conventions: inter-item correlations are computed on the answers as given (before reverse scoring), so
/// antonyms are usually a reverse-keyed and a forward-keyed item; NaN when fewer than <see cref="MinimumPairs"/>
/// pairs were answered or either side has no spread.
/// </summary>
internal sealed class PsychometricSynonyms
{
    /// <summary>Critical inter-item correlation (Meade &amp; Craig, 2012: .60).</summary>
    public const double Critical = 0.60;

    /// <summary>Fewest answered pairs for a value (our choice: a correlation over fewer points is too noisy).</summary>
    public const int MinimumPairs = 3;

    private readonly (int A, int B)[] _synonyms;
    private readonly (int A, int B)[] _antonyms;

    /// <param name="correlation">Inter-item correlations, p × p row-major.</param>
    /// <param name="p">Items.</param>
    public PsychometricSynonyms(double[] correlation, int p)
    {
        var syn = new List<(int, int)>();
        var ant = new List<(int, int)>();
        for (int j = 0; j < p; j++)
            for (int k = j + 1; k < p; k++)
            {
                double r = correlation[j * p + k];
                if (r >= Critical) syn.Add((j, k));
                else if (r <= -Critical) ant.Add((j, k));
            }
        _synonyms = syn.ToArray();
        _antonyms = ant.ToArray();
    }

    /// <summary>Synonym pairs found.</summary>
    public int SynonymPairs => _synonyms.Length;

    /// <summary>Antonym pairs found.</summary>
    public int AntonymPairs => _antonyms.Length;

    /// <summary>The respondent's synonym and antonym coefficients (NaN when not computable).</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public (double Synonyms, double Antonyms) Compute(ReadOnlySpan<double> answers) => (Within(answers, _synonyms), Within(answers, _antonyms));

    private static double Within(ReadOnlySpan<double> x, (int A, int B)[] pairs)
    {
        int m = 0;
        double sa = 0, sb = 0;
        foreach (var (a, b) in pairs)
        {
            if (double.IsNaN(x[a]) || double.IsNaN(x[b])) continue;
            m++;
            sa += x[a];
            sb += x[b];
        }
        if (m < MinimumPairs) return double.NaN;
        double ma = sa / m, mb = sb / m, sab = 0, saa = 0, sbb = 0;
        foreach (var (a, b) in pairs)
        {
            if (double.IsNaN(x[a]) || double.IsNaN(x[b])) continue;
            double da = x[a] - ma, db = x[b] - mb;
            sab += da * db;
            saa += da * da;
            sbb += db * db;
        }
        return saa > 0 && sbb > 0 ? sab / Math.Sqrt(saa * sbb) : double.NaN;
    }
}
