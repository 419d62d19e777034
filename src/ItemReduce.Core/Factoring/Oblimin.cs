using MathNet.Numerics.LinearAlgebra;

namespace ItemReduce.Core.Factoring;

/// <summary>
/// Direct oblimin rotation by gradient projection. Criterion (Jennrich, R. I., &amp; Sampson, P. F. (1966).
/// Rotation for simple loadings. Psychometrika, 31(3), 313–323; gamma = 0 is Carroll's quartimin):
/// Q(Λ) = ¼ ⟨Λ², (I − γC) Λ² N⟩ with N = 11ᵀ − I (k × k), C = 11ᵀ/p, gradient ∂Q/∂Λ = Λ ∘ ((I − γC) Λ² N).
/// Algorithm: Jennrich, R. I. (2002). A simple general method for oblique rotation. Psychometrika, 67(1),
/// 7–19; Bernaards, C. A., &amp; Jennrich, R. I. (2005). Gradient projection algorithms and software for
/// arbitrary rotation criteria in factor analysis. Educational and Psychological Measurement, 65(5),
/// 676–696. Steps: Λ = A (T⁻¹)ᵀ; G = −(Λᵀ ∂Q/∂Λ T⁻¹)ᵀ; project G onto the tangent space of matrices with
/// unit-length columns; step with halving until the Armijo condition Q decreases by ½ α ‖Gp‖²; stop when
/// ‖Gp‖_F &lt; tolerance, or when Q no longer changes in double precision while ‖Gp‖_F &lt; 1e-5. Factor correlations Φ = TᵀT.
/// </summary>
internal static class Oblimin
{
    /// <summary>Projected-gradient norm below which a stalled criterion counts as converged (numerical floor).</summary>
    private const double StallGradient = 1e-5;

    public static RotationResult Rotate(Matrix<double> a, double gamma, bool normalize, int maxIterations, double tolerance)
    {
        var (x, h) = normalize ? KaiserNormalization.Apply(a) : (a, Enumerable.Repeat(1.0, a.RowCount).ToArray());
        int k = a.ColumnCount;
        var t = Matrix<double>.Build.DenseIdentity(k);
        var l = LoadingsFor(x, t);
        var (f, gq) = Criterion(l, gamma);
        var g = Gradient(l, gq, t);
        double alpha = 1.0;
        bool converged = false;
        int it = 0;
        while (it < maxIterations)
        {
            var gp = Project(t, g);
            double s = gp.FrobeniusNorm();
            if (s < tolerance) { converged = true; break; }
            it++;
            alpha *= 2;
            Matrix<double> tt = t, lt = l, gqt = gq;
            double ft = f;
            for (int half = 0; half <= 10; half++)
            {
                tt = NormalizeColumns(t - alpha * gp);
                lt = LoadingsFor(x, tt);
                (ft, gqt) = Criterion(lt, gamma);
                if (f - ft > 0.5 * s * s * alpha) break;
                alpha /= 2;
            }
            bool stalled = f - ft <= 1e-15 * Math.Max(1.0, Math.Abs(f));
            t = tt; l = lt; f = ft; gq = gqt;
            g = Gradient(l, gq, t);
            // Near the optimum the Armijo decrease (½ α s²) falls below double resolution of Q; once Q stops
            // changing with a small projected gradient, the solution is as converged as double precision allows.
            if (stalled && Project(t, g).FrobeniusNorm() < StallGradient) { converged = true; break; }
        }
        if (!converged && Project(t, g).FrobeniusNorm() < tolerance) converged = true;
        var pattern = normalize ? KaiserNormalization.Undo(l, h) : l;
        return new RotationResult(pattern, t.TransposeThisAndMultiply(t), converged, it, f);
    }

    /// <summary>Λ = A (T⁻¹)ᵀ.</summary>
    private static Matrix<double> LoadingsFor(Matrix<double> a, Matrix<double> t)
    {
        var inv = t.Inverse();
        if (!inv.Enumerate().All(double.IsFinite))
            throw new FactorNonConvergenceException("Oblimin: the rotation matrix became singular.");
        return a * inv.Transpose();
    }

    /// <summary>Oblimin criterion value and its gradient with respect to Λ.</summary>
    internal static (double Value, Matrix<double> Gradient) Criterion(Matrix<double> l, double gamma)
    {
        int p = l.RowCount, k = l.ColumnCount;
        var l2 = l.PointwiseMultiply(l);
        var n = Matrix<double>.Build.Dense(k, k, 1.0) - Matrix<double>.Build.DenseIdentity(k);
        var m = l2 * n;
        if (gamma != 0)
        {
            var c = Matrix<double>.Build.Dense(p, p, 1.0 / p);
            m = m - gamma * (c * m);
        }
        double value = 0.25 * l2.PointwiseMultiply(m).Enumerate().Sum();
        return (value, l.PointwiseMultiply(m));
    }

    private static Matrix<double> Gradient(Matrix<double> l, Matrix<double> gq, Matrix<double> t)
        => -(l.TransposeThisAndMultiply(gq) * t.Inverse()).Transpose();

    /// <summary>Gp = G − T diag(1ᵀ(T ∘ G)).</summary>
    private static Matrix<double> Project(Matrix<double> t, Matrix<double> g)
    {
        var d = t.PointwiseMultiply(g).ColumnSums();
        return g - t * Matrix<double>.Build.DenseOfDiagonalVector(d);
    }

    private static Matrix<double> NormalizeColumns(Matrix<double> x)
    {
        var y = x.Clone();
        for (int f = 0; f < x.ColumnCount; f++)
        {
            double norm = x.Column(f).L2Norm();
            for (int i = 0; i < x.RowCount; i++) y[i, f] /= norm;
        }
        return y;
    }
}
