using System.Runtime.CompilerServices;
namespace ItemReduce.Core.Confirmatory;

/// <summary>
/// Full-information (casewise) normal likelihood of incomplete data: each respondent contributes the normal density of
/// the items they answered, with the mean and covariance entries of those items (Arbuckle, J. L., 1996, "Full information
/// estimation in the presence of incomplete data", in G. A. Marcoulides &amp; R. E. Schumacker (Eds.), Advanced
/// Structural Equation Modeling, pp. 243–277, Erlbaum). Evaluated per missing-data pattern from its sufficient
/// statistics. With complete data this is the ordinary normal likelihood, so −2 ln L differences are N·F_ML.
/// Everything here is −2 ln L without the constant N·q·ln 2π (which cancels in every difference we take).
/// <para>Each pattern needs K = Σ_oo⁻¹ and ln|Σ_oo|. When few items are missing they come from the one inverse Σ⁻¹
/// of the whole matrix by the partitioned-inverse identity Σ_oo⁻¹ = (Σ⁻¹)_oo − (Σ⁻¹)_om ((Σ⁻¹)_mm)⁻¹ (Σ⁻¹)_mo and
/// |Σ_oo| = |Σ|·|(Σ⁻¹)_mm| (standard block-matrix algebra), O(q²m) per pattern instead of O(q³).</para>
/// </summary>
internal static class CasewiseLikelihood
{
    /// <summary>−2 ln L (without the constant) at mean <paramref name="mu"/> (p) and covariance <paramref name="sigma"/>
    /// (row-major p × p). NaN when a pattern's covariance block is not positive definite. When
    /// <paramref name="gradSigma"/> (p × p) / <paramref name="gradMu"/> (p) are given they receive the derivative of
    /// −2 ln L with respect to each entry of Σ (symmetric form: n K − K T K per pattern, K = Σ_oo⁻¹) and to μ.</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public static double Minus2LogLikelihood(MissingDataPatterns data, double[] mu, double[] sigma, double[]? gradSigma = null, double[]? gradMu = null)
    {
        int p = data.Items;
        if (gradSigma is not null) Array.Clear(gradSigma);
        if (gradMu is not null) Array.Clear(gradMu);
        var inverter = new PatternInverter(data, sigma);
        double total = 0;
        var d = new double[p];
        var kd = new double[p];
        for (int gi = 0; gi < data.Patterns.Count; gi++)
        {
            var g = data.Patterns[gi];
            var o = g.Observed;
            int q = o.Length;
            if (!inverter.TryInverse(gi, out var k, out double logDet)) return double.NaN;
            for (int a = 0; a < q; a++) d[a] = g.Mean[a] - mu[o[a]];
            // T = W + n d dᵀ; −2 ln L_g = n ln|Σ_oo| + tr(K W) + n dᵀ K d.
            double tr = 0, quad = 0;
            for (int a = 0; a < q; a++)
            {
                double s = 0;
                for (int b = 0; b < q; b++) s += k[a * q + b] * d[b];
                kd[a] = s;
                quad += s * d[a];
            }
            bool scatter = g.Count > 1;
            if (scatter)
                for (int e = 0; e < q * q; e++) tr += k[e] * g.Scatter[e];
            total += g.Count * logDet + tr + g.Count * quad;
            if (gradSigma is not null)
            {
                // n K − K W K − n (K d)(K d)ᵀ.
                double[]? kwk = scatter ? Multiply(Multiply(k, g.Scatter, q), k, q) : null;
                for (int a = 0; a < q; a++)
                {
                    int row = o[a] * p;
                    for (int b = 0; b < q; b++)
                        gradSigma[row + o[b]] += g.Count * (k[a * q + b] - kd[a] * kd[b]) - (kwk is null ? 0 : kwk[a * q + b]);
                }
            }
            if (gradMu is not null)
                for (int a = 0; a < q; a++) gradMu[o[a]] -= 2 * g.Count * kd[a];
        }
        return total;
    }

    /// <summary>Inverse of each pattern's covariance block at <paramref name="sigma"/> (for information matrices and
    /// scores); null when one is not positive definite.</summary>
    public static double[][]? PatternInverses(MissingDataPatterns data, double[] sigma) =>
        TryPatternInverses(data, sigma, out var inverses, out _) ? inverses : null;

    /// <summary>Inverse (row-major q × q) and ln det of each pattern's covariance block; false when one is not
    /// positive definite.</summary>
    public static bool TryPatternInverses(MissingDataPatterns data, double[] sigma, out double[][] inverses, out double[] logDets)
    {
        int count = data.Patterns.Count;
        inverses = new double[count][];
        logDets = new double[count];
        var inverter = new PatternInverter(data, sigma);
        for (int gi = 0; gi < count; gi++)
            if (!inverter.TryInverse(gi, out inverses[gi], out logDets[gi])) return false;
        return true;
    }

    /// <summary>One pattern's K = Σ_oo⁻¹ and ln|Σ_oo| at a time (so that the inverses of many patterns need not be held
    /// at once), sharing the one inverse of the whole matrix.</summary>
    internal sealed class PatternInverter(MissingDataPatterns data, double[] sigma)
    {
        private double[]? _full;
        private double _fullLogDet = double.NaN;
        private bool _fullTried;

        [MethodImpl(MethodImplOptions.AggressiveOptimization)]
        public bool TryInverse(int gi, out double[] inverse, out double logDet)
        {
            int p = data.Items;
            var o = data.Patterns[gi].Observed;
            int q = o.Length, m = p - q;
            if (m <= q && !_fullTried)
            {
                _fullTried = true;
                if (SymmetricFactor.TryInvert(sigma, p, out var inv, out double ld)) (_full, _fullLogDet) = (inv, ld);
            }
            if (m <= q && _full is not null)
            {
                if (m == 0) { (inverse, logDet) = (_full, _fullLogDet); return true; }
                if (FromFullInverse(_full, p, o, out inverse, out double ldmm)) { logDet = _fullLogDet + ldmm; return true; }
            }
            var block = new double[q * q];
            for (int a = 0; a < q; a++)
                for (int b = 0; b < q; b++) block[a * q + b] = sigma[o[a] * p + o[b]];
            return SymmetricFactor.TryInvert(block, q, out inverse, out logDet);
        }
    }

    /// <summary>Σ_oo⁻¹ = K_oo − K_om K_mm⁻¹ K_mo from K = Σ⁻¹ (p × p); also ln|K_mm|.</summary>
    private static bool FromFullInverse(double[] k, int p, int[] o, out double[] result, out double logDetMm)
    {
        int q = o.Length, m = p - q;
        var missing = MissingDataPatterns.Unanswered(o, p);
        var kmm = new double[m * m];
        for (int i = 0; i < m; i++)
            for (int j = 0; j < m; j++) kmm[i * m + j] = k[missing[i] * p + missing[j]];
        result = [];
        if (!SymmetricFactor.TryInvert(kmm, m, out var kmmInv, out logDetMm)) return false;
        // T = K_om K_mm⁻¹ (q × m), then K_oo − T K_mo.
        var t2 = new double[q * m];
        for (int a = 0; a < q; a++)
            for (int j = 0; j < m; j++)
            {
                double s = 0;
                for (int i = 0; i < m; i++) s += k[o[a] * p + missing[i]] * kmmInv[i * m + j];
                t2[a * m + j] = s;
            }
        result = new double[q * q];
        for (int a = 0; a < q; a++)
            for (int b = 0; b <= a; b++)
            {
                double s = k[o[a] * p + o[b]];
                for (int j = 0; j < m; j++) s -= t2[a * m + j] * k[missing[j] * p + o[b]];
                result[a * q + b] = s;
                result[b * q + a] = s;
            }
        return true;
    }

    /// <summary>Row-major q × q product.</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    internal static double[] Multiply(double[] a, double[] b, int q)
    {
        var c = new double[q * q];
        for (int i = 0; i < q; i++)
        {
            var ci = c.AsSpan(i * q, q);
            for (int l = 0; l < q; l++)
            {
                double v = a[i * q + l];
                if (v != 0) LinearAlgebra.VectorKernels.Axpy(v, b.AsSpan(l * q, q), ci);
            }
        }
        return c;
    }
}
