using System.Runtime.CompilerServices;
namespace ItemReduce.Core.Confirmatory;

/// <summary>
/// Expected information and casewise scores of the normal (casewise) likelihood with respect to the unrestricted
/// covariance entries σ = vech Σ (lower triangle by rows). Per respondent with answered items o and K = Σ_oo⁻¹ (zero
/// outside o): information entry for σ_ab, σ_cd is s_ab s_cd (K_ac K_bd + K_ad K_bc) with s = ½ on the diagonal and 1
/// off it (½ tr(K ∂Σ/∂σ_ab K ∂Σ/∂σ_cd), the standard normal-theory result, e.g. Browne 1974; our derivation of the
/// index form); score for σ_ab is M_ab (a = b) or 2 M_ab (a ≠ b) with M = ½ (K r rᵀ K − K), r = x_o − μ_o.
/// The mean–covariance cross information is zero for the normal, so only the σ block is kept.
/// </summary>
internal static class NormalInformation
{
    /// <summary>Σ over respondents of the expected information of σ (p* × p*, row-major), at <paramref name="sigma"/>.</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public static double[] ExpectedCovarianceBlock(MissingDataPatterns data, double[] sigma)
    {
        int p = data.Items, ps = p * (p + 1) / 2;
        var info = new double[ps * ps];
        var inverses = CasewiseLikelihood.PatternInverses(data, sigma)
            ?? throw new LinearAlgebra.MatrixNotPositiveDefiniteException("A covariance block is not positive definite.");
        var kf = new double[p * p];
        for (int gi = 0; gi < data.Patterns.Count; gi++)
        {
            var g = data.Patterns[gi];
            var o = g.Observed;
            int q = o.Length;
            Array.Clear(kf);
            for (int a = 0; a < q; a++)
                for (int b = 0; b < q; b++) kf[o[a] * p + o[b]] = inverses[gi][a * q + b];
            // vech positions whose two items are both answered.
            int count = q * (q + 1) / 2, t = 0;
            var pr = new int[count];
            var pa = new int[count];
            var pb = new int[count];
            var psc = new double[count];
            for (int a = 0; a < q; a++)
                for (int b = 0; b <= a; b++, t++)
                {
                    int ia = o[a], ib = o[b];
                    (pr[t], pa[t], pb[t], psc[t]) = (ia * (ia + 1) / 2 + ib, ia * p, ib * p, ia == ib ? 0.5 : 1.0);
                }
            double n = g.Count;
            for (int x = 0; x < count; x++)
            {
                int rowOffset = pr[x] * ps, a = pa[x], b = pb[x];
                double s1 = n * psc[x];
                for (int y = 0; y <= x; y++)
                {
                    int c = pa[y] / p, d = pb[y] / p;
                    double v = s1 * psc[y] * (kf[a + c] * kf[b + d] + kf[a + d] * kf[b + c]);
                    info[rowOffset + pr[y]] += v;
                    if (y != x) info[pr[y] * ps + pr[x]] += v;
                }
            }
        }
        return info;
    }

    /// <summary>Casewise scores of σ at (<paramref name="mu"/>, <paramref name="sigma"/>): row-major N × p*.</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public static double[] CovarianceScores(MissingDataPatterns data, double[] mu, double[] sigma)
    {
        int p = data.Items, ps = p * (p + 1) / 2, n = data.Respondents;
        var scores = new double[(long)n * ps];
        var inverses = CasewiseLikelihood.PatternInverses(data, sigma)
            ?? throw new LinearAlgebra.MatrixNotPositiveDefiniteException("A covariance block is not positive definite.");
        // Rows of each pattern: the pattern list is in order of first appearance; find each row's pattern by its answers.
        var patternOf = new Dictionary<string, int>(StringComparer.Ordinal);
        for (int gi = 0; gi < data.Patterns.Count; gi++) patternOf[Key(data.Patterns[gi].Observed, p)] = gi;
        var key = new char[p];
        for (int i = 0; i < n; i++)
        {
            for (int a = 0; a < p; a++) key[a] = double.IsNaN(data.Rows[i * p + a]) ? '0' : '1';
            int gi = patternOf[new string(key)];
            var o = data.Patterns[gi].Observed;
            var k = inverses[gi];
            int q = o.Length;
            var kr = new double[q];
            for (int a = 0; a < q; a++)
            {
                double s = 0;
                for (int b = 0; b < q; b++) s += k[a * q + b] * (data.Rows[i * p + o[b]] - mu[o[b]]);
                kr[a] = s;
            }
            long row = (long)i * ps;
            for (int a = 0; a < q; a++)
                for (int b = 0; b <= a; b++)
                {
                    double m = 0.5 * (kr[a] * kr[b] - k[a * q + b]);
                    int ia = o[a], ib = o[b];
                    scores[row + ia * (ia + 1) / 2 + ib] = ia == ib ? m : 2 * m;
                }
        }
        return scores;
    }

    private static string Key(int[] observed, int p)
    {
        var c = Enumerable.Repeat('0', p).ToArray();
        foreach (int a in observed) c[a] = '1';
        return new string(c);
    }
}
