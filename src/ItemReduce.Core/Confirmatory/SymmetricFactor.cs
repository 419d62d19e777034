using System.Runtime.CompilerServices;
using ItemReduce.Core.LinearAlgebra;

namespace ItemReduce.Core.Confirmatory;

/// <summary>Inverse and log-determinant of a small symmetric matrix through <see cref="CholeskyDecomposition"/>;
/// reports failure instead of throwing so that an optimiser can reject a step.</summary>
internal static class SymmetricFactor
{
    /// <summary>Inverse (row-major q × q) and ln det of the row-major q × q matrix <paramref name="a"/> (left unchanged);
    /// false when it is not positive definite.</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public static bool TryInvert(double[] a, int q, out double[] inverse, out double logDet)
    {
        var l = (double[])a.Clone();
        inverse = [];
        logDet = double.NaN;
        try
        {
            CholeskyDecomposition.FactorInPlace(l, q);
        }
        catch (MatrixNotPositiveDefiniteException)
        {
            return false;
        }
        double s = 0;
        for (int i = 0; i < q; i++)
        {
            double d = l[i * q + i];
            if (!(d > 0) || !double.IsFinite(d)) return false;
            s += Math.Log(d);
        }
        logDet = 2 * s;
        inverse = CholeskyDecomposition.InverseFromFactor(l, q);
        return true;
    }
}
