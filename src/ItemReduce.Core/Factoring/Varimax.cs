using MathNet.Numerics.LinearAlgebra;

namespace ItemReduce.Core.Factoring;

/// <summary>
/// Varimax orthogonal rotation: Kaiser, H. F. (1958). The varimax criterion for analytic rotation in factor
/// analysis. Psychometrika, 23(3), 187–200. Maximises V = Σ_f [ Σⱼ λⱼf⁴ − (Σⱼ λⱼf²)² / p ] (raw criterion,
/// times p) on Kaiser-normalised rows. Instead of Kaiser's pairwise planar rotations we use the equivalent
/// simultaneous update T ← U Vᵀ from the SVD of B = Aᵀ (Z∘Z∘Z − Z diag(1ᵀ(Z∘Z))/p), Z = A T (a standard
/// formulation, common practice, no source), which never decreases V.
/// </summary>
internal static class Varimax
{
    public static RotationResult Rotate(Matrix<double> a, bool normalize, int maxIterations, double tolerance)
    {
        var (x, h) = normalize ? KaiserNormalization.Apply(a) : (a, Enumerable.Repeat(1.0, a.RowCount).ToArray());
        var (t, converged, iterations) = RotationMatrix(x, maxIterations, tolerance);
        var l = x * t;
        var pattern = normalize ? KaiserNormalization.Undo(l, h) : l;
        int k = a.ColumnCount;
        return new RotationResult(pattern, Matrix<double>.Build.DenseIdentity(k), converged, iterations, Criterion(l));
    }

    /// <summary>The orthogonal k × k matrix T maximising the criterion of A·T.</summary>
    internal static (Matrix<double> T, bool Converged, int Iterations) RotationMatrix(Matrix<double> a, int maxIterations, double tolerance)
    {
        int p = a.RowCount, k = a.ColumnCount;
        var t = Matrix<double>.Build.DenseIdentity(k);
        double d = 0;
        for (int it = 1; it <= maxIterations; it++)
        {
            var z = a * t;
            var z3 = z.PointwisePower(3);
            var colSq = z.PointwisePower(2).ColumnSums();
            var target = z3 - z * Matrix<double>.Build.DenseOfDiagonalVector(colSq / p);
            var b = a.TransposeThisAndMultiply(target);
            var svd = b.Svd(true);
            t = svd.U * svd.VT;
            double previous = d;
            d = svd.S.Sum();
            if (d < previous * (1 + tolerance)) return (t, true, it);
        }
        return (t, false, maxIterations);
    }

    /// <summary>Raw varimax criterion Σ_f [Σⱼ λ⁴ − (Σⱼ λ²)²/p].</summary>
    internal static double Criterion(Matrix<double> l)
    {
        int p = l.RowCount;
        double v = 0;
        for (int f = 0; f < l.ColumnCount; f++)
        {
            double s2 = 0, s4 = 0;
            for (int j = 0; j < p; j++) { double q = l[j, f] * l[j, f]; s2 += q; s4 += q * q; }
            v += s4 - s2 * s2 / p;
        }
        return v;
    }
}
