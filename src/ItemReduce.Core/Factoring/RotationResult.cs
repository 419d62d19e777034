using MathNet.Numerics.LinearAlgebra;

namespace ItemReduce.Core.Factoring;

/// <summary>Output of a rotation: pattern loadings (p × k), factor correlations (k × k), diagnostics.</summary>
/// <param name="Pattern">Rotated pattern loadings.</param>
/// <param name="Phi">Factor correlation matrix (identity for orthogonal rotations).</param>
/// <param name="Converged">True when the rotation met its tolerance within the cap.</param>
/// <param name="Iterations">Iterations used.</param>
/// <param name="Criterion">Final rotation criterion value (varimax: maximised; oblimin: minimised).</param>
internal sealed record RotationResult(Matrix<double> Pattern, Matrix<double> Phi, bool Converged, int Iterations, double Criterion);

/// <summary>Kaiser row normalisation (Kaiser, 1958): divide each row by its length before rotating and
/// multiply back afterwards. Rows of length 0 are left unchanged.</summary>
internal static class KaiserNormalization
{
    public static (Matrix<double> Normalized, double[] RowLengths) Apply(Matrix<double> a)
    {
        var h = new double[a.RowCount];
        var x = a.Clone();
        for (int j = 0; j < a.RowCount; j++)
        {
            h[j] = Math.Sqrt(a.Row(j).DotProduct(a.Row(j)));
            if (h[j] > 0) for (int f = 0; f < a.ColumnCount; f++) x[j, f] /= h[j];
            else h[j] = 1.0;
        }
        return (x, h);
    }

    public static Matrix<double> Undo(Matrix<double> x, double[] h)
    {
        var a = x.Clone();
        for (int j = 0; j < a.RowCount; j++)
            for (int f = 0; f < a.ColumnCount; f++) a[j, f] *= h[j];
        return a;
    }
}
