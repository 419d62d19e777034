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
    /// <summary>Σ over respondents of the expected information of σ (p* × p*, row-major, full symmetric), at
    /// <paramref name="sigma"/>. Entry (ab),(cd) of one respondent is s_ab s_cd (K_ac K_bd + K_ad K_bc) =: 𝒲(K).
    /// Patterns with at most <see cref="ClosedFormMissing"/> unanswered items are summed in closed form from K = Σ⁻¹:
    /// their padded inverse is K − V_g V_gᵀ (V_g V_gᵀ = K_·m K_mm⁻¹ K_m·, the partitioned inverse), and 𝒲 is quadratic,
    /// so Σ n_g 𝒲(K − V_g V_gᵀ) = n·𝒲(K) − 𝒳(K, Q) + Σ n_g 𝒲(V_g V_gᵀ) with Q = Σ n_g V_g V_gᵀ, 𝒳 the bilinear cross term
    /// s_ab s_cd (K_ac Q_bd + Q_ac K_bd + K_ad Q_bc + Q_ad K_bc), and each 𝒲(V_g V_gᵀ) a sum of m(m+1)/2 rank-one terms
    /// (our derivation). Other patterns are added entry by entry.</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public static double[] ExpectedCovarianceBlock(MissingDataPatterns data, double[] sigma)
    {
        int p = data.Items, ps = p * (p + 1) / 2;
        var info = new double[ps * ps];
        var inverses = CasewiseLikelihood.PatternInverses(data, sigma)
            ?? throw new LinearAlgebra.MatrixNotPositiveDefiniteException("A covariance block is not positive definite.");
        var direct = new List<int>();
        var rankOne = new List<(double Weight, double[] V, int T, int U)>();
        double nClosed = 0;
        var q = new double[p * p];
        if (SymmetricFactor.TryInvert(sigma, p, out var k, out _))
        {
            for (int gi = 0; gi < data.Patterns.Count; gi++)
            {
                var g = data.Patterns[gi];
                int m = p - g.Observed.Length;
                if (m > ClosedFormMissing) { direct.Add(gi); continue; }
                nClosed += g.Count;
                if (m == 0) continue;
                var v = MissingRows(k, p, g.Observed);
                if (v is null) { direct.Add(gi); nClosed -= g.Count; continue; }
                for (int t = 0; t < m; t++)
                    for (int a = 0; a < p; a++)
                        for (int b = 0; b < p; b++) q[a * p + b] += g.Count * v[t * p + a] * v[t * p + b];
                // 𝒲(V Vᵀ) = Σ_{t<u} ω^{tu} ω^{tuᵀ} + ½ Σ_t ω^{tt} ω^{ttᵀ}, ω^{tu}_(ab) = s_ab (v_ta v_ub + v_ua v_tb).
                for (int t = 0; t < m; t++)
                    for (int u2 = t; u2 < m; u2++) rankOne.Add((g.Count * (t == u2 ? 0.5 : 1.0), v, t, u2));
            }
            // n 𝒲(K) − 𝒳(K, Q): with P = n K − Q, the row (ab) over (cd), fixed c, is
            // s_ab s_cd (K_ac P_b· + K_bc P_a· − Q_ac K_b· − Q_bc K_a·).
            var pm = new double[p * p];
            for (int e = 0; e < p * p; e++) pm[e] = nClosed * k[e] - q[e];
            for (int a = 0; a < p; a++)
                for (int b = 0; b <= a; b++)
                {
                    int row = (a * (a + 1) / 2 + b) * ps;
                    double sab = a == b ? 0.5 : 1.0;
                    for (int c = 0; c <= a; c++)
                    {
                        double kac = k[a * p + c], kbc = k[b * p + c], qac = q[a * p + c], qbc = q[b * p + c];
                        int len = c == a ? b + 1 : c + 1;
                        var y = info.AsSpan(row + c * (c + 1) / 2, len);
                        LinearAlgebra.VectorKernels.Rank2Row(-sab * kac, pm.AsSpan(b * p, len), -sab * kbc, pm.AsSpan(a * p, len), y);
                        LinearAlgebra.VectorKernels.Rank2Row(sab * qac, k.AsSpan(b * p, len), sab * qbc, k.AsSpan(a * p, len), y);
                        if (len == c + 1) y[c] -= 0.5 * sab * (kac * pm[b * p + c] + kbc * pm[a * p + c] - qac * kbc - qbc * kac);
                    }
                }
            AddRankOneTerms(info, p, rankOne);
        }
        else direct.AddRange(Enumerable.Range(0, data.Patterns.Count));
        var kf = new double[p * p];
        var answered = new bool[p];
        foreach (int gi in direct)
        {
            var g = data.Patterns[gi];
            var o = g.Observed;
            int qn = o.Length;
            Array.Clear(kf);
            Array.Clear(answered);
            var kg = inverses[gi];
            for (int a = 0; a < qn; a++)
            {
                answered[o[a]] = true;
                for (int b = 0; b < qn; b++) kf[o[a] * p + o[b]] = kg[a * qn + b];
            }
            double n = g.Count;
            for (int a = 0; a < p; a++)
            {
                if (!answered[a]) continue;
                for (int b = 0; b <= a; b++)
                {
                    if (!answered[b]) continue;
                    int row = (a * (a + 1) / 2 + b) * ps;
                    double scale = n * (a == b ? 0.5 : 1.0);
                    for (int c = 0; c <= a; c++)
                    {
                        if (!answered[c]) continue;
                        double kac = kf[a * p + c], kbc = kf[b * p + c];
                        int len = c == a ? b + 1 : c + 1;
                        var y = info.AsSpan(row + c * (c + 1) / 2, len);
                        LinearAlgebra.VectorKernels.Rank2Row(-scale * kac, kf.AsSpan(b * p, len), -scale * kbc, kf.AsSpan(a * p, len), y);
                        if (len == c + 1) y[c] -= scale * kac * kbc;
                    }
                }
            }
        }
        for (int r = 0; r < ps; r++)
            for (int c = 0; c < r; c++) info[c * ps + r] = info[r * ps + c];
        return info;
    }

    /// <summary>Adds Σ_t weight_t ω_t ω_tᵀ to the lower triangle of <paramref name="info"/> (p* × p*), ω_t the vech
    /// vector of pattern term (t, u), ω_(ab) = s_ab (v_ta v_ub + v_ua v_tb). The ω are the columns of a p* × T matrix Ω
    /// (stored by rows, T padded with zeros), and the update is Ω D Ωᵀ by 4 × 4 blocks of dot products over the terms
    /// (<see cref="BlockedDots.Dot4x4"/>) instead of one pass over the triangle per term.</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private static void AddRankOneTerms(double[] info, int p, List<(double Weight, double[] V, int T, int U)> terms)
    {
        int ps = p * (p + 1) / 2, count = terms.Count;
        if (count == 0) return;
        int width = (count + 7) & ~7, rowsPadded = (ps + 3) & ~3;
        var omega = new double[rowsPadded * width];
        var weighted = new double[rowsPadded * width];
        for (int c = 0; c < count; c++)
        {
            var (weight, v, t, u) = terms[c];
            for (int a = 0, r = 0; a < p; a++)
            {
                double vta = v[t * p + a], vua = v[u * p + a];
                for (int b = 0; b <= a; b++, r++)
                {
                    double o = (a == b ? 0.5 : 1.0) * (vta * v[u * p + b] + vua * v[t * p + b]);
                    omega[r * width + c] = o;
                    weighted[r * width + c] = weight * o;
                }
            }
        }
        var sums = new double[16];
        for (int r0 = 0; r0 < ps; r0 += 4)
        {
            var a0 = weighted.AsSpan(r0 * width, width);
            var a1 = weighted.AsSpan((r0 + 1) * width, width);
            var a2 = weighted.AsSpan((r0 + 2) * width, width);
            var a3 = weighted.AsSpan((r0 + 3) * width, width);
            for (int j0 = 0; j0 <= r0; j0 += 4)
            {
                BlockedDots.Dot4x4(a0, a1, a2, a3, omega.AsSpan(j0 * width, width), omega.AsSpan((j0 + 1) * width, width),
                    omega.AsSpan((j0 + 2) * width, width), omega.AsSpan((j0 + 3) * width, width), sums);
                for (int rr = 0; rr < 4 && r0 + rr < ps; rr++)
                {
                    int row = (r0 + rr) * ps;
                    for (int cc = 0; cc < 4 && j0 + cc <= r0 + rr; cc++) info[row + j0 + cc] += sums[rr * 4 + cc];
                }
            }
        }
    }

    /// <summary>Patterns with at most this many unanswered items use the closed form.</summary>
    private const int ClosedFormMissing = 4;

    /// <summary>V (m × p, row-major) with V Vᵀ = K_·m K_mm⁻¹ K_m· for the unanswered items m: V = L⁻¹ K_m· with
    /// K_mm = L Lᵀ; null when K_mm is not positive definite.</summary>
    private static double[]? MissingRows(double[] k, int p, int[] observed)
    {
        int q = observed.Length, m = p - q;
        var missing = MissingDataPatterns.Unanswered(observed, p);
        var l = new double[m * m];
        for (int i = 0; i < m; i++)
            for (int j = 0; j < m; j++) l[i * m + j] = k[missing[i] * p + missing[j]];
        try { LinearAlgebra.CholeskyDecomposition.FactorInPlace(l, m); }
        catch (LinearAlgebra.MatrixNotPositiveDefiniteException) { return null; }
        var v = new double[m * p];
        for (int t = 0; t < m; t++)
            for (int a = 0; a < p; a++)
            {
                double s = k[missing[t] * p + a];
                for (int u = 0; u < t; u++) s -= l[t * m + u] * v[u * p + a];
                v[t * p + a] = s / l[t * m + t];
            }
        return v;
    }

    /// <summary>Casewise score of σ of one respondent (answers <paramref name="row"/>, p values, NaN = missing) in the
    /// pattern with answered items <paramref name="observed"/> and K = Σ_oo⁻¹ <paramref name="k"/>, at mean
    /// <paramref name="mu"/>: written into <paramref name="score"/> (p*, zero outside the answered pairs);
    /// <paramref name="kr"/> is scratch (≥ q).</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public static void CovarianceScore(ReadOnlySpan<double> row, int[] observed, double[] k, double[] mu, Span<double> score, Span<double> kr)
    {
        int q = observed.Length;
        score.Clear();
        for (int a = 0; a < q; a++)
        {
            double s = 0;
            for (int b = 0; b < q; b++) s += k[a * q + b] * (row[observed[b]] - mu[observed[b]]);
            kr[a] = s;
        }
        for (int a = 0; a < q; a++)
        {
            int ia = observed[a], offset = ia * (ia + 1) / 2;
            for (int b = 0; b <= a; b++)
            {
                double m = 0.5 * (kr[a] * kr[b] - k[a * q + b]);
                score[offset + observed[b]] = a == b ? m : 2 * m;
            }
        }
    }
}
