using MathNet.Numerics.Distributions;
using MathNet.Numerics.LinearAlgebra;

namespace ItemReduce.Core.Factoring;

/// <summary>
/// Maximum-likelihood factor extraction: Jöreskog, K. G. (1967). Some contributions to maximum likelihood
/// factor analysis. Psychometrika, 32(4), 443–482; Lawley, D. N., &amp; Maxwell, A. E. (1971). Factor Analysis
/// as a Statistical Method (2nd ed.). Butterworths. For fixed uniquenesses ψ let γ₁ ≥ … ≥ γ_p be the
/// eigenvalues (vectors ω) of S* = Ψ^{-1/2} R Ψ^{-1/2}; the concentrated criterion is
/// F(ψ) = Σ_{m&gt;k} (γ_m − ln γ_m − 1), with Λ = Ψ^{1/2} Ω_k diag(sqrt(max(γ_k − 1, 0))) and
/// ∂F/∂ψⱼ = (Σ̂ − R)ⱼⱼ / ψⱼ², Σ̂ = ΛΛᵀ + Ψ (Jöreskog 1967, sec. 3; the gradient here is our own restatement).
/// F is minimised over ψ ∈ [lower bound, 1]. Fit: Bartlett, M. S. (1950). Tests of significance in factor
/// analysis. British Journal of Psychology (Statistical Section), 3, 77–85 (multiplier
/// n − 1 − (2p + 5)/6 − 2k/3); RMSEA: Steiger, J. H., &amp; Lind, J. C. (1980), paper presented at the annual
/// meeting of the Psychometric Society, Iowa City; TLI: Tucker, L. R., &amp; Lewis, C. (1973). A reliability
/// coefficient for maximum likelihood factor analysis. Psychometrika, 38(1), 1–10. The fit formulas are
/// given from memory of these sources.
/// </summary>
internal static class MaximumLikelihoodFactoring
{
    public static ExtractionResult Extract(Matrix<double> r, int k, FactoringOptions o)
        => UniquenessSearch.Run(r, k, o, Criterion, Gradient, LoadingsFor);

    private static (double[] Values, Matrix<double> Vectors) ScaledEigen(Matrix<double> r, double[] psi)
    {
        int p = psi.Length;
        var s = Matrix<double>.Build.Dense(p, p);
        for (int i = 0; i < p; i++)
            for (int j = 0; j < p; j++) s[i, j] = r[i, j] / Math.Sqrt(psi[i] * psi[j]);
        return MatrixHelpers.SymmetricEigenDescending(s);
    }

    internal static double Criterion(Matrix<double> r, double[] psi, int k)
    {
        var (g, _) = ScaledEigen(r, psi);
        double f = 0;
        for (int m = k; m < g.Length; m++)
        {
            double gm = Math.Max(g[m], 1e-300);
            f += gm - Math.Log(gm) - 1.0;
        }
        return f;
    }

    internal static Matrix<double> LoadingsFor(Matrix<double> r, double[] psi, int k)
    {
        var (g, w) = ScaledEigen(r, psi);
        int p = psi.Length;
        var l = Matrix<double>.Build.Dense(p, k);
        for (int f = 0; f < k; f++)
        {
            double s = Math.Sqrt(Math.Max(g[f] - 1.0, 0.0));
            for (int j = 0; j < p; j++) l[j, f] = Math.Sqrt(psi[j]) * w[j, f] * s;
        }
        return l;
    }

    internal static double[] Gradient(Matrix<double> r, double[] psi, int k)
    {
        var l = LoadingsFor(r, psi, k);
        int p = psi.Length;
        var g = new double[p];
        for (int j = 0; j < p; j++)
        {
            double sigma = psi[j];
            for (int f = 0; f < k; f++) sigma += l[j, f] * l[j, f];
            g[j] = (sigma - r[j, j]) / (psi[j] * psi[j]);
        }
        return g;
    }

    /// <summary>Fit statistics for a solution with minimised discrepancy <paramref name="fMin"/>.</summary>
    public static FactorModelFit FitStatistics(Matrix<double> r, int n, int k, double fMin)
    {
        int p = r.RowCount;
        double chi = Math.Max(0.0, (n - 1 - (2.0 * p + 5.0) / 6.0 - 2.0 * k / 3.0) * fMin);
        double df = ((p - k) * (double)(p - k) - (p + k)) / 2.0;
        if (df <= 0) return new FactorModelFit(chi, df, double.NaN, double.NaN, double.NaN, fMin);
        double prob = 1.0 - ChiSquared.CDF(df, chi);
        double rmsea = Math.Sqrt(Math.Max(chi - df, 0.0) / (df * (n - 1)));

        // Independence model: Σ̂ = diag(R); F₀ = −ln|R| for a correlation matrix.
        double tli = double.NaN;
        if (MatrixHelpers.IsPositiveDefinite(r, out double logDet))
        {
            for (int i = 0; i < p; i++) logDet -= Math.Log(r[i, i]);
            double chi0 = (n - 1 - (2.0 * p + 5.0) / 6.0) * -logDet;
            double df0 = p * (p - 1) / 2.0;
            double ratio0 = chi0 / df0;
            if (ratio0 > 1.0) tli = (ratio0 - chi / df) / (ratio0 - 1.0);
        }
        return new FactorModelFit(chi, df, prob, rmsea, tli, fMin);
    }
}
