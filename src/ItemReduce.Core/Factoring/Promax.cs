using MathNet.Numerics.LinearAlgebra;

namespace ItemReduce.Core.Factoring;

/// <summary>
/// Promax oblique rotation: Hendrickson, A. E., &amp; White, P. O. (1964). Promax: a quick method for rotation
/// to oblique simple structure. British Journal of Statistical Psychology, 17(1), 65–70. Steps: varimax
/// (with Kaiser normalisation when requested) gives Λᵥ; target Q = Λᵥ ∘ |Λᵥ|^(m−1) (power m, default 4);
/// least-squares transformation U = (ΛᵥᵀΛᵥ)⁻¹ Λᵥᵀ Q; columns of U rescaled so that
/// diag((UᵀU)⁻¹) = 1; pattern P = Λᵥ U and factor correlations Φ = (UᵀU)⁻¹, so that P Φ Pᵀ = Λᵥ Λᵥᵀ.
/// </summary>
internal static class Promax
{
    public static RotationResult Rotate(Matrix<double> a, double power, bool normalize, int maxIterations, double tolerance)
    {
        var vm = Varimax.Rotate(a, normalize, maxIterations, tolerance);
        var lv = vm.Pattern;
        var q = lv.Map(v => v * Math.Pow(Math.Abs(v), power - 1));
        var u = (lv.TransposeThisAndMultiply(lv)).Solve(lv.TransposeThisAndMultiply(q));
        var d = (u.TransposeThisAndMultiply(u)).Inverse().Diagonal();
        var scaled = u * Matrix<double>.Build.DenseOfDiagonalVector(d.PointwiseSqrt());
        var phi = (scaled.TransposeThisAndMultiply(scaled)).Inverse();
        if (!phi.Enumerate().All(double.IsFinite))
            throw new FactorNonConvergenceException("Promax: the least-squares transformation is singular.");
        return new RotationResult(lv * scaled, phi, vm.Converged, vm.Iterations, double.NaN);
    }
}
