using ItemReduce.Core.Correlation;
using ItemReduce.Core.LinearAlgebra;
using static ItemReduce.Tests.Core.Dimensions.DimensionsReferenceData;

namespace ItemReduce.Tests.Core.Correlation;

public class NearestCorrelationMatrixTests
{
    [Fact]
    public void Positive_definite_input_is_returned_unchanged()
    {
        var r = Matrix("iris_correlation.csv");
        var res = NearestCorrelationMatrix.Find(r);
        Assert.False(res.Adjusted);
        Assert.Same(r, res.Matrix);
        Assert.Equal(0, res.MaxAbsoluteChange);
    }

    [Fact]
    public void Higham_example_converges_to_the_published_nearest_correlation_matrix()
    {
        // Higham (2002), IMA J. Numer. Anal. 22, 329–343, Section 4 example: A = [1 1 0; 1 1 1; 0 1 1] has nearest
        // correlation matrix with off-diagonals 0.7607, 0.1573, 0.7607 (4 decimals; values quoted from memory of the
        // paper). Our floor δ = 1e-6 moves the answer by O(δ).
        var a = new double[,] { { 1, 1, 0 }, { 1, 1, 1 }, { 0, 1, 1 } };
        var res = NearestCorrelationMatrix.Find(a);
        Assert.True(res.Adjusted);
        Assert.Equal(0.7607, res.Matrix[0, 1], 1e-4);
        Assert.Equal(0.1573, res.Matrix[0, 2], 1e-4);
        Assert.Equal(0.7607, res.Matrix[1, 2], 1e-4);
        Assert.True(res.MinEigenvalueBefore < 0);
        Assert.True(res.MaxAbsoluteChange > 0.2);
    }

    [Fact]
    public void Output_is_a_positive_definite_correlation_matrix_near_the_input()
    {
        // Properties: unit diagonal, symmetric, smallest eigenvalue at least about the floor; and the output is
        // no farther from the input than the simple "clip eigenvalues and rescale" matrix (Higham's matrix is
        // the nearest in Frobenius norm).
        var a = new double[,]
        {
            { 1, 0.9, 0.7, -0.5 },
            { 0.9, 1, 0.95, 0.3 },
            { 0.7, 0.95, 1, 0.6 },
            { -0.5, 0.3, 0.6, 1 },
        };
        var res = NearestCorrelationMatrix.Find(a);
        Assert.True(res.Adjusted);
        var x = res.Matrix;
        for (int i = 0; i < 4; i++)
        {
            Assert.Equal(1.0, x[i, i]);
            for (int j = 0; j < 4; j++) Assert.Equal(x[i, j], x[j, i]);
        }
        Assert.True(SymmetricEigensolver.Eigenvalues(x)[^1] > 0.5e-6);
        var clip = NearestCorrelationMatrix.ProjectOntoEigenvalueFloor(a, 1e-6);
        double frobClip = 0;
        for (int i = 0; i < 4; i++)
            for (int j = 0; j < 4; j++)
            {
                double c = i == j ? 1 : clip[i, j] / Math.Sqrt(clip[i, i] * clip[j, j]);
                frobClip += (c - a[i, j]) * (c - a[i, j]);
            }
        Assert.True(res.FrobeniusChange <= Math.Sqrt(frobClip) + 1e-9);
    }

    [Fact]
    public void Invalid_input_is_rejected()
    {
        Assert.Throws<ArgumentException>(() => NearestCorrelationMatrix.Find(new double[,] { { 2, 0 }, { 0, 1 } }));
        Assert.Throws<ArgumentException>(() => NearestCorrelationMatrix.Find(new double[,] { { 1, 0 }, { 0, 1 } }, 0));
    }
}
