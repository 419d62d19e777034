using MathNet.Numerics.LinearAlgebra;

namespace ItemReduce.Core.Confirmatory;

/// <summary>
/// Scaling factor c of the robust (mean-adjusted) χ², T_scaled = T_ML / c, c = tr(U Γ) / df with
/// U = W − W Δ (Δᵀ W Δ)⁻¹ Δᵀ W (Satorra, A., &amp; Bentler, P. M., 1994, "Corrections to test statistics and standard
/// errors in covariance structure analysis", in A. von Eye &amp; C. C. Clogg (Eds.), Latent Variables Analysis,
/// pp. 399–419, Sage). W is the normal-theory expected information of vech Σ at the fitted model, Δ = ∂ vech Σ/∂θ.
/// Complete data: Γ is the fourth-moment estimate Γ_N = (1/N) Σ (d_i − s)(d_i − s)ᵀ, d_i = vech((x_i − x̄)(x_i − x̄)ᵀ),
/// computed here as the sandwich A⁻¹ B A⁻¹ of the saturated model's normal information A and casewise score
/// cross-products B, which equals Γ_N exactly. Incomplete data (casewise likelihood): the same sandwich with the
/// saturated model's casewise scores and its expected information under the observed patterns, the Yuan–Bentler
/// approach (Yuan, K.-H., &amp; Bentler, P. M., 2000, "Three likelihood-based methods for mean and covariance structure
/// analysis with nonnormal missing data", Sociological Methodology 30, 165–200). Using the expected rather than the
/// observed information of the saturated model is our choice; it is exact under MCAR and an approximation under MAR
/// (Savalei, V., 2010, Structural Equation Modeling 17, 241–264, from memory).
/// </summary>
internal static class SatorraBentlerScaling
{
    /// <summary>A root of the saturated model's asymptotic covariance Γ of vech S, ready for <see cref="Factor"/>:
    /// R = S A₁⁻¹ (N × p*) with S the casewise scores and A₁ the summed expected information, so that
    /// Γ = A⁻¹ B A⁻¹ (per-respondent A = A₁/N, B = SᵀS/N) equals N · Rᵀ R.</summary>
    public static Matrix<double> GammaRoot(MissingDataPatterns data, double[] mu1, double[] sigma1)
    {
        int p = data.Items, ps = p * (p + 1) / 2, n = data.Respondents;
        var a1 = Matrix<double>.Build.DenseOfRowMajor(ps, ps, NormalInformation.ExpectedCovarianceBlock(data, sigma1));
        var s = Matrix<double>.Build.DenseOfRowMajor(n, ps, NormalInformation.CovarianceScores(data, mu1, sigma1));
        var a1Inverse = a1.Cholesky().Solve(Matrix<double>.Build.DenseIdentity(ps));
        return s * a1Inverse;
    }

    /// <summary>c = tr(U Γ) / df for a model with Jacobian <paramref name="jacobian"/> (p* × q, row-major) whose
    /// information is taken at <paramref name="sigmaModel"/>; <paramref name="gammaRoot"/> from <see cref="GammaRoot"/>.</summary>
    public static double Factor(MissingDataPatterns data, double[] sigmaModel, double[] jacobian, int parameters, Matrix<double> gammaRoot, double df)
    {
        if (!(df > 0)) return double.NaN;
        int p = data.Items, ps = p * (p + 1) / 2;
        var w = Matrix<double>.Build.DenseOfRowMajor(ps, ps, NormalInformation.ExpectedCovarianceBlock(data, sigmaModel));
        var delta = Matrix<double>.Build.DenseOfRowMajor(ps, parameters, jacobian);
        var wDelta = w * delta;
        var dwd = delta.TransposeThisAndMultiply(wDelta);
        // U is linear in W, so with the summed information W_tot = N·W and Γ = N·RᵀR: tr(U(W) Γ) = tr(U(W_tot) RᵀR).
        var rw = gammaRoot * w;
        double first = 0;
        for (int i = 0; i < rw.RowCount; i++)
            for (int j = 0; j < ps; j++) first += rw[i, j] * gammaRoot[i, j];
        var rwd = gammaRoot * wDelta;
        var m = rwd.TransposeThisAndMultiply(rwd);
        var solved = dwd.Cholesky().Solve(m);
        return (first - solved.Trace()) / df;
    }
}
