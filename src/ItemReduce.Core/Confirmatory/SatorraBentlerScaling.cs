using System.Runtime.CompilerServices;
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
    /// <summary>N·Γ of the saturated model (p* × p*), ready for <see cref="Factor"/>: Γ = A⁻¹ B A⁻¹ with the per-respondent
    /// expected information A = A₁/N (A₁ summed over respondents) and B = SᵀS/N (S: casewise scores), so
    /// N·Γ = N²·A₁⁻¹ SᵀS A₁⁻¹ / N = N·RᵀR with R = S A₁⁻¹. Computed once and shared by the model and the independence model.</summary>
    public static Matrix<double> ScaledGamma(MissingDataPatterns data, double[] mu1, double[] sigma1)
    {
        int p = data.Items, ps = p * (p + 1) / 2, n = data.Respondents;
        var a1 = Matrix<double>.Build.DenseOfRowMajor(ps, ps, NormalInformation.ExpectedCovarianceBlock(data, sigma1));
        var s = Matrix<double>.Build.DenseOfRowMajor(n, ps, NormalInformation.CovarianceScores(data, mu1, sigma1));
        // Rᵀ = A₁⁻¹ Sᵀ by a Cholesky solve (A₁ symmetric positive definite).
        var rt = a1.Cholesky().Solve(s.Transpose());
        return rt.TransposeAndMultiply(rt);
    }

    /// <summary>c = tr(U Γ) / df for a model with Jacobian <paramref name="jacobian"/> (p* × q, row-major) whose
    /// information is taken at <paramref name="sigmaModel"/>; <paramref name="scaledGamma"/> = RᵀR from <see cref="ScaledGamma"/>.</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public static double Factor(MissingDataPatterns data, double[] sigmaModel, double[] jacobian, int parameters, Matrix<double> scaledGamma, double df)
    {
        if (!(df > 0)) return double.NaN;
        int p = data.Items, ps = p * (p + 1) / 2;
        var w = Matrix<double>.Build.DenseOfRowMajor(ps, ps, NormalInformation.ExpectedCovarianceBlock(data, sigmaModel));
        var delta = Matrix<double>.Build.DenseOfRowMajor(ps, parameters, jacobian);
        var wDelta = w * delta;
        var dwd = delta.TransposeThisAndMultiply(wDelta);
        // U is linear in W, so with the summed information W_tot = N·W and Γ = N·RᵀR: tr(U(W) Γ) = tr(U(W_tot) RᵀR).
        double first = 0;
        for (int i = 0; i < ps; i++)
            for (int j = 0; j < ps; j++) first += w[i, j] * scaledGamma[j, i];
        var m = wDelta.TransposeThisAndMultiply(scaledGamma * wDelta);
        var solved = dwd.Cholesky().Solve(m);
        return (first - solved.Trace()) / df;
    }
}
