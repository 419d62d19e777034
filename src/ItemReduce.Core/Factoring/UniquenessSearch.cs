using MathNet.Numerics.LinearAlgebra;

namespace ItemReduce.Core.Factoring;

/// <summary>
/// The shared outer step of minres and ML: minimise a concentrated criterion F(ψ) over the uniquenesses
/// ψ ∈ [lower bound, 1], starting from 1 − SMC, then form the loadings for the optimal ψ.
/// </summary>
internal static class UniquenessSearch
{
    public static ExtractionResult Run(
        Matrix<double> r, int k, FactoringOptions o,
        Func<Matrix<double>, double[], int, double> criterion,
        Func<Matrix<double>, double[], int, double[]> gradient,
        Func<Matrix<double>, double[], int, Matrix<double>> loadings)
    {
        int p = r.RowCount;
        var smc = MatrixHelpers.SquaredMultipleCorrelations(r);
        var start = new double[p];
        for (int j = 0; j < p; j++) start[j] = Math.Clamp(1.0 - smc[j], o.UniquenessLowerBound, 1.0);
        var outcome = BoundedMinimizer.Minimize(
            psi => criterion(r, psi, k), psi => gradient(r, psi, k),
            start, o.UniquenessLowerBound, 1.0, o.Tolerance, o.MaxIterations);
        var atBound = new List<int>();
        for (int j = 0; j < p; j++) if (outcome.Point[j] <= o.UniquenessLowerBound * (1 + 1e-6)) atBound.Add(j);
        return new ExtractionResult(loadings(r, outcome.Point, k), outcome.Point, outcome.Converged, outcome.Iterations, atBound, outcome.Value);
    }
}
