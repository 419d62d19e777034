using ItemReduce.Core.Factoring;
using ItemReduce.Tests.Support;
using MathNet.Numerics.LinearAlgebra;

namespace ItemReduce.Tests.Core.Factoring;

public class RotationTests
{
    private const string Area = "Factoring";
    private static Matrix<double> A3 => Matrix<double>.Build.DenseOfArray(ReferenceData.Matrix(Area, "three_factor_loadings.csv"));

    [Fact]
    public void Varimax_with_Kaiser_normalisation_matches_numpy_pairwise_Kaiser_rotation()
    {
        // Expected: Kaiser's (1958) pairwise planar-rotation varimax in numpy (make_factoring_reference.py).
        var r = Varimax.Rotate(A3, normalize: true, 1000, 1e-12);
        LoadingAssert.Close(ReferenceData.Matrix(Area, "three_factor_varimax_kaiser_numpy.csv"), r.Pattern.ToArray(), 1e-6);
    }

    [Fact]
    public void Raw_varimax_matches_numpy_and_sklearn()
    {
        // Expected: numpy pairwise varimax without normalisation, and sklearn's _ortho_rotation (varimax, raw).
        var r = Varimax.Rotate(A3, normalize: false, 1000, 1e-12);
        LoadingAssert.Close(ReferenceData.Matrix(Area, "three_factor_varimax_raw_numpy.csv"), r.Pattern.ToArray(), 1e-6);
        LoadingAssert.Close(ReferenceData.Matrix(Area, "three_factor_varimax_raw_sklearn.csv"), r.Pattern.ToArray(), 1e-5);
    }

    [Fact]
    public void Varimax_of_ml_loadings_matches_numpy()
    {
        var a = Matrix<double>.Build.DenseOfArray(ReferenceData.Matrix(Area, "two_factor_unrotated_ml_loadings.csv"));
        var r = Varimax.Rotate(a, normalize: true, 1000, 1e-12);
        LoadingAssert.Close(ReferenceData.Matrix(Area, "two_factor_varimax_kaiser_numpy.csv"), r.Pattern.ToArray(), 1e-6);
    }

    [Fact]
    public void Varimax_is_orthogonal_keeps_communalities_and_does_not_lower_the_criterion()
    {
        // Identities of any orthogonal rotation (common practice, no source).
        var a = A3;
        var (t, converged, _) = Varimax.RotationMatrix(a, 1000, 1e-12);
        Assert.True(converged);
        AssertClose(Matrix<double>.Build.DenseIdentity(3), t.TransposeThisAndMultiply(t), 1e-10);
        var l = a * t;
        AssertClose(a * a.Transpose(), l * l.Transpose(), 1e-10);
        Assert.True(Varimax.Criterion(l) >= Varimax.Criterion(a) - 1e-12);
    }

    [Theory]
    [InlineData(0.0, true)]
    [InlineData(0.0, false)]
    [InlineData(-0.5, true)]
    public void Oblimin_reproduces_the_common_part_has_unit_diagonal_phi_and_lowers_the_criterion(double gamma, bool normalize)
    {
        // Identity of oblique rotation: P Φ Pᵀ = A Aᵀ (Jennrich 2002, Λ = A(T⁻¹)ᵀ, Φ = TᵀT).
        var a = A3;
        var r = Oblimin.Rotate(a, gamma, normalize, 2000, 1e-8);
        Assert.True(r.Converged);
        AssertClose(a * a.Transpose(), r.Pattern * r.Phi * r.Pattern.Transpose(), 1e-9);
        for (int f = 0; f < 3; f++) Assert.Equal(1.0, r.Phi[f, f], 12);
        if (!normalize) Assert.True(r.Criterion <= Oblimin.Criterion(a, gamma).Value + 1e-12);
    }

    [Fact]
    public void Oblimin_gradient_matches_finite_differences()
    {
        // Check of ∂Q/∂Λ = Λ ∘ (Λ² N) against central differences (calculus identity).
        var l = A3;
        var (_, g) = Oblimin.Criterion(l, 0.3);
        const double h = 1e-6;
        for (int j = 0; j < l.RowCount; j++)
            for (int f = 0; f < l.ColumnCount; f++)
            {
                var up = l.Clone(); up[j, f] += h;
                var dn = l.Clone(); dn[j, f] -= h;
                double fd = (Oblimin.Criterion(up, 0.3).Value - Oblimin.Criterion(dn, 0.3).Value) / (2 * h);
                Assert.Equal(fd, g[j, f], 6);
            }
    }

    [Fact]
    public void Promax_reproduces_the_common_part_and_has_unit_diagonal_phi()
    {
        var a = A3;
        var r = Promax.Rotate(a, 4, true, 1000, 1e-10);
        AssertClose(a * a.Transpose(), r.Pattern * r.Phi * r.Pattern.Transpose(), 1e-9);
        for (int f = 0; f < 3; f++) Assert.Equal(1.0, r.Phi[f, f], 12);
    }

    [Fact]
    public void Quartimin_matches_scipy_general_purpose_minimisation()
    {
        // Expected: quartimin criterion minimised by scipy BFGS over column-normalised T (not gradient
        // projection), Kaiser-normalised, from T = I (make_factoring_reference.py).
        var r = Oblimin.Rotate(A3, 0.0, true, 5000, 1e-9);
        LoadingAssert.Close(ReferenceData.Matrix(Area, "three_factor_quartimin_kaiser_scipy.csv"), r.Pattern.ToArray(), 1e-5);
        LoadingAssert.Close(OffDiagonalMagnitudes(ReferenceData.Matrix(Area, "three_factor_quartimin_kaiser_scipy_phi.csv")),
            OffDiagonalMagnitudes(r.Phi.ToArray()), 1e-5);
    }

    [Fact]
    public void Promax_matches_numpy_promax_from_pairwise_varimax()
    {
        // Expected: numpy promax (power 4, Hendrickson & White 1964) on numpy's Kaiser pairwise varimax.
        var r = Promax.Rotate(A3, 4, true, 1000, 1e-12);
        LoadingAssert.Close(ReferenceData.Matrix(Area, "three_factor_promax_numpy.csv"), r.Pattern.ToArray(), 1e-6);
        LoadingAssert.Close(OffDiagonalMagnitudes(ReferenceData.Matrix(Area, "three_factor_promax_numpy_phi.csv")),
            OffDiagonalMagnitudes(r.Phi.ToArray()), 1e-6);
    }

    private static double[] OffDiagonalMagnitudes(double[,] m)
    {
        var list = new List<double>();
        for (int a = 0; a < m.GetLength(0); a++)
            for (int b = a + 1; b < m.GetLength(1); b++) list.Add(Math.Abs(m[a, b]));
        return list.Order().ToArray();
    }

    private static void AssertClose(Matrix<double> expected, Matrix<double> actual, double tol)
    {
        for (int i = 0; i < expected.RowCount; i++)
            for (int j = 0; j < expected.ColumnCount; j++)
                Assert.True(Math.Abs(expected[i, j] - actual[i, j]) <= tol, $"[{i},{j}] {expected[i, j]} vs {actual[i, j]}");
    }
}
