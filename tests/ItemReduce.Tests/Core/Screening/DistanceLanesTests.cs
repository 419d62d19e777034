using ItemReduce.Core.Screening;
using ItemReduce.Tests.Support;

namespace ItemReduce.Tests.Core.Screening;

/// <summary>The row-batched distance path must give exactly the scalar path's bits (a property check: same
/// operations in the same order per lane), and the batched D² must still match numpy on iris.</summary>
public class DistanceLanesTests
{
    [Fact]
    public void Batched_quadratic_forms_equal_the_scalar_form_bit_for_bit()
    {
        // Property: each lane repeats the scalar forward substitution exactly, so results are equal as bits.
        // Matrix: iris covariance (Fisher 1936, public domain) from the committed numpy fixture's rows.
        var (_, rows) = ReferenceData.Table("Screening", "iris_mahalanobis.csv");
        int n = rows.Length, p = 4;
        var mean = new double[p];
        for (int j = 0; j < p; j++) mean[j] = rows.Average(r => r[j]);
        var cov = new double[p * p];
        foreach (var r in rows)
            for (int j = 0; j < p; j++)
                for (int k = 0; k < p; k++) cov[j * p + k] += (r[j] - mean[j]) * (r[k] - mean[k]) / (n - 1);
        var chol = ScreeningCholesky.TryFactor(cov, p)!;
        Assert.NotNull(chol);
        const int lanes = ScreeningCholesky.Lanes;
        var d = new double[p * lanes];
        var work = new double[p * lanes];
        var forms = new double[lanes];
        for (int i0 = 0; i0 + lanes <= n; i0 += lanes)
        {
            for (int k = 0; k < lanes; k++)
                for (int j = 0; j < p; j++) d[j * lanes + k] = rows[i0 + k][j] - mean[j];
            chol.QuadraticForms(d, work, forms);
            for (int k = 0; k < lanes; k++)
            {
                var diff = new double[p];
                for (int j = 0; j < p; j++) diff[j] = rows[i0 + k][j] - mean[j];
                double scalar = chol.QuadraticForm(diff, new double[p]);
                Assert.Equal(BitConverter.DoubleToInt64Bits(scalar), BitConverter.DoubleToInt64Bits(forms[k]));
                // Outside check: numpy's D² (mahalanobis_reference.py) for the same row.
                Assert.True(Math.Abs(forms[k] - rows[i0 + k][5]) <= 1e-9 * rows[i0 + k][5], $"row {i0 + k}");
            }
        }
    }

    [Fact]
    public void Distances_do_not_depend_on_row_grouping()
    {
        // Property: the D² of a complete row is the same whether it is batched with other rows or alone
        // (subsets of different sizes put each row into a different lane or into the scalar remainder).
        var (_, rows) = ReferenceData.Table("Screening", "iris_mahalanobis.csv");
        var full = MahalanobisDistanceTests.Matrix(rows, 4);
        var mean = Enumerable.Range(0, 4).Select(j => rows.Average(r => r[j])).ToArray();
        var cov = new double[4, 4];
        for (int j = 0; j < 4; j++)
            for (int k = 0; k < 4; k++) cov[j, k] = rows.Sum(r => (r[j] - mean[j]) * (r[k] - mean[k])) / (rows.Length - 1);
        var dist = new MahalanobisDistance(mean, cov);
        var (all, _) = dist.Compute(full);
        for (int skip = 1; skip <= 3; skip++)
        {
            var sub = rows.Skip(skip).ToArray();
            var (part, _) = dist.Compute(MahalanobisDistanceTests.Matrix(sub, 4));
            for (int i = 0; i < sub.Length; i++)
                Assert.Equal(BitConverter.DoubleToInt64Bits(all[i + skip]), BitConverter.DoubleToInt64Bits(part[i]));
        }
    }
}
