using MathNet.Numerics.LinearAlgebra;

namespace ItemReduce.Core.Factoring;

/// <summary>
/// Minimum residual (minres) factor extraction: Harman, H. H., &amp; Jones, W. H. (1966). Factor analysis by
/// minimizing residuals (minres). Psychometrika, 31(3), 351–368. Equivalent to unweighted least squares:
/// minimise ½‖R − ΛΛᵀ − Ψ‖²_F. Following the usual concentration of the criterion, for fixed uniquenesses
/// ψ the best Λ is the leading k eigenpairs of R − Ψ, leaving
/// F(ψ) = ½ Σ_{i&gt;k} eᵢ(R − Ψ)² with ∂F/∂ψⱼ = −Σ_{i&gt;k} eᵢ vⱼᵢ² (first-order perturbation of eigenvalues).
/// F is minimised over ψ ∈ [lower bound, 1] (correlation metric) starting from 1 − SMC.
/// </summary>
internal static class MinimumResidual
{
    public static ExtractionResult Extract(Matrix<double> r, int k, FactoringOptions o)
        => UniquenessSearch.Run(r, k, o, Criterion, Gradient, LoadingsFor);

    internal static Matrix<double> Reduced(Matrix<double> r, double[] psi)
    {
        var a = r.Clone();
        for (int j = 0; j < psi.Length; j++) a[j, j] -= psi[j];
        return a;
    }

    internal static double Criterion(Matrix<double> r, double[] psi, int k)
    {
        var e = MatrixHelpers.SymmetricEigenvaluesDescending(Reduced(r, psi));
        double s = 0;
        for (int i = k; i < e.Length; i++) s += e[i] * e[i];
        return 0.5 * s;
    }

    internal static double[] Gradient(Matrix<double> r, double[] psi, int k)
    {
        var (e, v) = MatrixHelpers.SymmetricEigenDescending(Reduced(r, psi));
        int p = psi.Length;
        var g = new double[p];
        for (int i = k; i < p; i++)
            for (int j = 0; j < p; j++) g[j] -= e[i] * v[j, i] * v[j, i];
        return g;
    }

    internal static Matrix<double> LoadingsFor(Matrix<double> r, double[] psi, int k)
    {
        var (e, v) = MatrixHelpers.SymmetricEigenDescending(Reduced(r, psi));
        return MatrixHelpers.PrincipalLoadings(e, v, k);
    }
}
