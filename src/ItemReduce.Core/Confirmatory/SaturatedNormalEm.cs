using System.Runtime.CompilerServices;
namespace ItemReduce.Core.Confirmatory;

/// <summary>
/// Maximum-likelihood mean and covariance of incomplete multivariate normal data by the EM algorithm (Dempster, A. P.,
/// Laird, N. M., &amp; Rubin, D. B., 1977, "Maximum likelihood from incomplete data via the EM algorithm", Journal of the
/// Royal Statistical Society B 39, 1–38; the normal-data steps as in Little, R. J. A., &amp; Rubin, D. B., 2002,
/// Statistical Analysis with Missing Data, 2nd ed., Section 11.2). The unrestricted ("saturated") model against which
/// the casewise χ² is taken. With complete data it is the sample mean and the divide-by-N covariance, in one step.
/// </summary>
internal static class SaturatedNormalEm
{
    /// <summary>Iteration cap.</summary>
    public const int MaxIterations = 5000;

    /// <summary>Stop when no mean or covariance entry moves by more than this times the largest variance.</summary>
    public const double Tolerance = 1e-11;

    /// <summary>Mean (p), covariance (row-major p × p, divide-by-N), iterations used and whether it converged.</summary>
    public static (double[] Mean, double[] Covariance, int Iterations, bool Converged) Fit(MissingDataPatterns data)
    {
        int p = data.Items, n = data.Respondents;
        var (mu, sigma) = AvailableCaseStart(data);
        for (int it = 1; it <= MaxIterations; it++)
        {
            var (t1, t2) = ExpectedSums(data, mu, sigma);
            var newMu = new double[p];
            var newSigma = new double[p * p];
            for (int a = 0; a < p; a++) newMu[a] = t1[a] / n;
            for (int a = 0; a < p; a++)
                for (int b = 0; b < p; b++) newSigma[a * p + b] = t2[a * p + b] / n - newMu[a] * newMu[b];
            double change = 0, scale = 0;
            for (int a = 0; a < p; a++) { change = Math.Max(change, Math.Abs(newMu[a] - mu[a])); scale = Math.Max(scale, newSigma[a * p + a]); }
            for (int e = 0; e < p * p; e++) change = Math.Max(change, Math.Abs(newSigma[e] - sigma[e]));
            mu = newMu;
            sigma = newSigma;
            if (data.Complete || change <= Tolerance * Math.Max(scale, 1e-300)) return (mu, sigma, it, true);
        }
        return (mu, sigma, MaxIterations, false);
    }

    /// <summary>Available-case means and variances, zero covariances: the start of EM, and the ML estimates of the
    /// independence (diagonal) model, whose casewise likelihood factorises over items.</summary>
    public static (double[] Mean, double[] Covariance) AvailableCaseStart(MissingDataPatterns data)
    {
        int p = data.Items;
        var sum = new double[p];
        var count = new double[p];
        foreach (var g in data.Patterns)
            for (int a = 0; a < g.Observed.Length; a++) { sum[g.Observed[a]] += g.Count * g.Mean[a]; count[g.Observed[a]] += g.Count; }
        var mu = new double[p];
        for (int a = 0; a < p; a++) mu[a] = sum[a] / count[a];
        var ss = new double[p];
        foreach (var g in data.Patterns)
        {
            int q = g.Observed.Length;
            for (int a = 0; a < q; a++)
            {
                double d = g.Mean[a] - mu[g.Observed[a]];
                ss[g.Observed[a]] += (g.Count > 1 ? g.Scatter[a * q + a] : 0) + g.Count * d * d;
            }
        }
        var sigma = new double[p * p];
        for (int a = 0; a < p; a++) sigma[a * p + a] = ss[a] / count[a];
        return (mu, sigma);
    }

    /// <summary>E-step: expected Σ x and Σ x xᵀ over all respondents given the observed answers.</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private static (double[] T1, double[] T2) ExpectedSums(MissingDataPatterns data, double[] mu, double[] sigma)
    {
        int p = data.Items;
        var t1 = new double[p];
        var t2 = new double[p * p];
        // The regression of the unanswered on the answered items and its residual covariance come from Σ⁻¹ = K by the
        // partitioned inverse: B = Σ_mo Σ_oo⁻¹ = −K_mm⁻¹ K_mo, C = Σ_mm − B Σ_om = K_mm⁻¹.
        if (!SymmetricFactor.TryInvert(sigma, p, out var kFull, out _))
            throw new LinearAlgebra.MatrixNotPositiveDefiniteException("The covariance matrix of the saturated model is not positive definite.");
        for (int gi = 0; gi < data.Patterns.Count; gi++)
        {
            var g = data.Patterns[gi];
            var o = g.Observed;
            int q = o.Length, n = g.Count, m = p - q;
            var missing = MissingDataPatterns.Unanswered(o, p);
            var kmm = new double[m * m];
            for (int i = 0; i < m; i++)
                for (int j = 0; j < m; j++) kmm[i * m + j] = kFull[missing[i] * p + missing[j]];
            double[] condCov = [];
            if (m > 0 && !SymmetricFactor.TryInvert(kmm, m, out condCov, out _))
                throw new LinearAlgebra.MatrixNotPositiveDefiniteException("The covariance matrix of the saturated model is not positive definite.");
            var bmat = new double[m * q];
            for (int i = 0; i < m; i++)
                for (int a = 0; a < q; a++)
                {
                    double s = 0;
                    for (int j = 0; j < m; j++) s -= condCov[i * m + j] * kFull[missing[j] * p + o[a]];
                    bmat[i * q + a] = s;
                }
            // Filled-in mean of the pattern and the deviations' scatter [[W, W Bᵀ], [B W, B W Bᵀ]].
            var full = new double[p];
            for (int a = 0; a < q; a++) full[o[a]] = g.Mean[a];
            for (int i = 0; i < m; i++)
            {
                double s = mu[missing[i]];
                for (int a = 0; a < q; a++) s += bmat[i * q + a] * (g.Mean[a] - mu[o[a]]);
                full[missing[i]] = s;
            }
            // W Bᵀ (zero for a pattern of one respondent, whose scatter is zero).
            var wbt = new double[q * m];
            if (n > 1)
                for (int a = 0; a < q; a++)
                    for (int i = 0; i < m; i++)
                    {
                        double s = 0;
                        for (int c = 0; c < q; c++) s += g.Scatter[a * q + c] * bmat[i * q + c];
                        wbt[a * m + i] = s;
                    }
            for (int a = 0; a < p; a++) t1[a] += n * full[a];
            for (int a = 0; a < p; a++)
                LinearAlgebra.VectorKernels.Axpy(n * full[a], full, t2.AsSpan(a * p, p));
            if (n > 1)
                for (int a = 0; a < q; a++)
                    for (int c = 0; c < q; c++) t2[o[a] * p + o[c]] += g.Scatter[a * q + c];
            for (int a = 0; a < q; a++)
                for (int i = 0; i < m; i++)
                {
                    t2[o[a] * p + missing[i]] += wbt[a * m + i];
                    t2[missing[i] * p + o[a]] += wbt[a * m + i];
                }
            for (int i = 0; i < m; i++)
                for (int j = 0; j < m; j++)
                {
                    double bwb = 0;
                    for (int a = 0; a < q; a++) bwb += bmat[i * q + a] * wbt[a * m + j];
                    t2[missing[i] * p + missing[j]] += bwb + n * condCov[i * m + j];
                }
        }
        return (t1, t2);
    }
}
