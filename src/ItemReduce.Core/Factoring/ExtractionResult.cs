using MathNet.Numerics.LinearAlgebra;

namespace ItemReduce.Core.Factoring;

/// <summary>Output of one extraction method: unrotated p × k loadings and diagnostics.</summary>
/// <param name="Loadings">Unrotated loadings (p × k), principal-axes orientation.</param>
/// <param name="Uniquenesses">Estimated uniquenesses ψ (length p).</param>
/// <param name="Converged">True when the tolerance was met before the iteration cap.</param>
/// <param name="Iterations">Iterations used.</param>
/// <param name="AtLowerBound">Items whose uniqueness sits at the lower bound (Heywood candidates).</param>
/// <param name="Objective">Final value of the method's criterion (minres: ½ Σ residual eigenvalues²;
/// ML: F_min; principal axis: NaN).</param>
internal sealed record ExtractionResult(
    Matrix<double> Loadings, double[] Uniquenesses, bool Converged, int Iterations, IReadOnlyList<int> AtLowerBound, double Objective);
