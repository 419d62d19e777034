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
    public static double[] Compute(double[,] correlation)
    {
        MatrixChecks.SymmetricFinite(correlation, nameof(correlation));
        int p = correlation.GetLength(0);
        return FromRowMajor(MatrixChecks.ToRowMajor(correlation), p);
    }

    /// <summary>Relative pivot tolerance of <see cref="StartingCommunalities"/>: R counts as singular when a Cholesky
    /// pivot is not above 1e-24 · R_jj (the factor's diagonal not above 1e-12 for a correlation matrix).</summary>
    internal const double SingularPivotTolerance = 1e-24;

    /// <summary>Starting communalities of the factor extractions: the SMCs clamped to [0, 1]; when R is singular
    /// (see <see cref="SingularPivotTolerance"/>), each item's largest absolute correlation with another item
    /// (common practice, no source).</summary>
    internal static double[] StartingCommunalities(double[,] r)
    {
        int p = r.GetLength(0);
        var scratch = MatrixChecks.ToRowMajor(r);
        try
        {
            CholeskyDecomposition.FactorInPlace(scratch, p, SingularPivotTolerance);
            var smc = CholeskyDecomposition.InverseDiagonalFromFactor(scratch, p);
            for (int j = 0; j < p; j++) smc[j] = Math.Clamp(1.0 - 1.0 / smc[j], 0.0, 1.0);
            return smc;
        }
        catch (MatrixNotPositiveDefiniteException)
        {
            var largest = new double[p];
            for (int j = 0; j < p; j++)
                for (int l = 0; l < p; l++) if (l != j) largest[j] = Math.Max(largest[j], Math.Abs(r[j, l]));
            return largest;
        }
    }

    /// <summary>The reduced matrix: R with SMC_j on the diagonal (copy).</summary>
    public static double[,] ReducedMatrix(double[,] correlation)
    {
        var smc = Compute(correlation);
        var reduced = (double[,])correlation.Clone();
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
