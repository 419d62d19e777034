using System.Runtime.CompilerServices;
namespace ItemReduce.Core.Confirmatory;

/// <summary>
/// Full-information (casewise) normal likelihood of incomplete data: each respondent contributes the normal density of
/// the items they answered, with the mean and covariance entries of those items (Arbuckle, J. L., 1996, "Full information
/// estimation in the presence of incomplete data", in G. A. Marcoulides &amp; R. E. Schumacker (Eds.), Advanced
/// Structural Equation Modeling, pp. 243–277, Erlbaum). Evaluated per missing-data pattern from its sufficient
/// statistics. With complete data this is the ordinary normal likelihood, so −2 ln L differences are N·F_ML.
/// Everything here is −2 ln L without the constant N·q·ln 2π (which cancels in every difference we take).
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
        double total = 0;
        foreach (var g in data.Patterns)
        {
            var o = g.Observed;
            int q = o.Length;
            var block = new double[q * q];
            for (int a = 0; a < q; a++)
                for (int b = 0; b < q; b++) block[a * q + b] = sigma[o[a] * p + o[b]];
            if (!SymmetricFactor.TryInvert(block, q, out var k, out double logDet)) return double.NaN;
            var d = new double[q];
            for (int a = 0; a < q; a++) d[a] = g.Mean[a] - mu[o[a]];
            // T = W + n d dᵀ; −2 ln L_g = n ln|Σ_oo| + tr(K T).
            var t = new double[q * q];
            for (int a = 0; a < q; a++)
                for (int b = 0; b < q; b++) t[a * q + b] = g.Scatter[a * q + b] + g.Count * d[a] * d[b];
            double tr = 0;
            for (int a = 0; a < q; a++)
                for (int b = 0; b < q; b++) tr += k[a * q + b] * t[b * q + a];
            total += g.Count * logDet + tr;
            if (gradSigma is not null)
            {
                var kt = Multiply(k, t, q);
                var ktk = Multiply(kt, k, q);
                for (int a = 0; a < q; a++)
                    for (int b = 0; b < q; b++) gradSigma[o[a] * p + o[b]] += g.Count * k[a * q + b] - ktk[a * q + b];
            }
            if (gradMu is not null)
                for (int a = 0; a < q; a++)
                {
                    double s = 0;
                    for (int b = 0; b < q; b++) s += k[a * q + b] * d[b];
                    gradMu[o[a]] -= 2 * g.Count * s;
                }
        }
        return total;
    }

    /// <summary>Inverse of each pattern's covariance block at <paramref name="sigma"/> (for information matrices and
    /// scores); null when one is not positive definite.</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public static double[][]? PatternInverses(MissingDataPatterns data, double[] sigma)
    {
        int p = data.Items;
        var result = new double[data.Patterns.Count][];
        for (int i = 0; i < result.Length; i++)
        {
            var o = data.Patterns[i].Observed;
            int q = o.Length;
            var block = new double[q * q];
            for (int a = 0; a < q; a++)
                for (int b = 0; b < q; b++) block[a * q + b] = sigma[o[a] * p + o[b]];
            if (!SymmetricFactor.TryInvert(block, q, out var k, out _)) return null;
            result[i] = k;
        }
        return result;
    }

    /// <summary>Row-major q × q product.</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    internal static double[] Multiply(double[] a, double[] b, int q)
    {
        var c = new double[q * q];
        for (int i = 0; i < q; i++)
            for (int l = 0; l < q; l++)
            {
                double v = a[i * q + l];
                if (v == 0) continue;
                for (int j = 0; j < q; j++) c[i * q + j] += v * b[l * q + j];
            }
        return c;
    }
}
