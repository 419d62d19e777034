using ItemReduce.Core.LinearAlgebra;

namespace ItemReduce.Core.Dimensions;

/// <summary>
/// Squared multiple correlation of each item with all the others, SMC_j = 1 − 1 / (R⁻¹)_jj, the classical
/// lower bound to the communality used on the diagonal of the "reduced" correlation matrix: Guttman (1956),
/// "'Best possible' systematic estimates of communalities", Psychometrika 21(3), 273–285; Dwyer (1939),
/// Psychometrika 4, 163–171 for the identity with the inverse. R⁻¹ comes from a Cholesky factorisation,
/// so R must be positive definite (smooth it first with <see cref="Correlation.NearestCorrelationMatrix"/>).
/// </summary>
internal static class SquaredMultipleCorrelation
{
    /// <summary>SMC of every item (length p, each in [0, 1)).</summary>
    /// <exception cref="MatrixNotPositiveDefiniteException">R is not positive definite.</exception>
    public static double[] Compute(double[,] r)
    {
        MatrixChecks.SymmetricFinite(r, nameof(r));
        int p = r.GetLength(0);
        return FromRowMajor(MatrixChecks.ToRowMajor(r), p);
    }

    /// <summary>The reduced matrix: R with SMC_j on the diagonal (copy).</summary>
    public static double[,] ReducedMatrix(double[,] r)
    {
        var smc = Compute(r);
        var reduced = (double[,])r.Clone();
        for (int j = 0; j < smc.Length; j++) reduced[j, j] = smc[j];
        return reduced;
    }

    /// <summary>Unchecked kernel: <paramref name="scratch"/> (row-major p × p) is destroyed.</summary>
    internal static double[] FromRowMajor(double[] scratch, int p) => FromRowMajor(scratch, p, new double[p * p], new double[p]);

    /// <summary>Allocation-free kernel: <paramref name="scratch"/> and <paramref name="work"/> (p × p) are destroyed;
    /// the SMCs are written to and returned in <paramref name="result"/> (length p).</summary>
    internal static double[] FromRowMajor(double[] scratch, int p, double[] work, double[] result)
    {
        CholeskyDecomposition.FactorInPlace(scratch, p);
        var diag = CholeskyDecomposition.InverseDiagonalFromFactor(scratch, p, work, result);
        for (int j = 0; j < p; j++) diag[j] = 1 - 1 / diag[j];
        return diag;
    }
}
