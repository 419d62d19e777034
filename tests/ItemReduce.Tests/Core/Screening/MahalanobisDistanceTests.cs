using ItemReduce.Core.Data;
using ItemReduce.Core.Screening;
using ItemReduce.Tests.Support;

namespace ItemReduce.Tests.Core.Screening;

public class MahalanobisDistanceTests
{
    internal static ResponseMatrix Matrix(double[][] rows, int p)
    {
        var items = Enumerable.Range(1, p).Select(j => new ItemDefinition($"x{j}", null, false, -1e9, 1e9, null)).ToList();
        var ids = Enumerable.Range(1, rows.Length).Select(i => $"r{i}").ToList();
        return new ResponseMatrix(ids, items, rows.SelectMany(r => r.Take(p)).ToArray());
    }

    [Fact]
    public void Complete_data_distances_match_numpy_on_iris()
    {
        // Expected: numpy — sample mean, np.cov(ddof=1), np.linalg.solve (mahalanobis_reference.py; iris data,
        // Fisher 1936, public domain).
        var (_, rows) = ReferenceData.Table("Screening", "iris_mahalanobis.csv");
        var data = Matrix(rows, 4);
        var r = RespondentScreening.Run(data, new ScreeningOptions());
        for (int i = 0; i < rows.Length; i++)
        {
            Assert.Equal(4, r.Respondents[i].ItemsAnswered);
            Assert.True(Math.Abs(r.Respondents[i].D2 - rows[i][5]) <= 1e-9 * rows[i][5], $"row {i}: {r.Respondents[i].D2} vs {rows[i][5]}");
        }
    }

    [Fact]
    public void Sum_of_squared_distances_is_n_minus_1_times_p()
    {
        // Identity: Σ_i (x_i − x̄)ᵀ S⁻¹ (x_i − x̄) = tr(S⁻¹ (n − 1) S) = (n − 1) p for the n − 1 covariance.
        var (_, rows) = ReferenceData.Table("Screening", "iris_mahalanobis.csv");
        var r = RespondentScreening.Run(Matrix(rows, 4), new ScreeningOptions());
        Assert.Equal(149.0 * 4, r.Respondents.Sum(x => x.D2), 1e-8);
    }

    [Fact]
    public void Distances_with_missing_answers_match_numpy_sub_matrix_rule()
    {
        // Expected: numpy implementation of the same rule (item means over answered values, pairwise-complete
        // covariance with the pair's own means and m − 1, D² on the answered sub-vector / sub-matrix), in
        // mahalanobis_reference.py. Row 6 answered nothing.
        var (_, rows) = ReferenceData.Table("Screening", "iris_missing_mahalanobis.csv");
        var r = RespondentScreening.Run(Matrix(rows, 4), new ScreeningOptions());
        for (int i = 0; i < rows.Length; i++)
        {
            var row = r.Respondents[i];
            Assert.Equal((int)rows[i][4], row.ItemsAnswered);
            if (double.IsNaN(rows[i][5])) { Assert.True(double.IsNaN(row.D2)); continue; }
            Assert.True(Math.Abs(row.D2 - rows[i][5]) <= 1e-9 * rows[i][5], $"row {i}: {row.D2} vs {rows[i][5]}");
        }
        var empty = r.Respondents[5];
        Assert.Equal(0, empty.ItemsAnswered);
        Assert.True(double.IsNaN(empty.RobustD2) && double.IsNaN(empty.Cutoff) && double.IsNaN(empty.PValue));
        Assert.True(empty.Flagged);
        Assert.Equal([ScreeningReasons.MostlyUnanswered], empty.Reasons);
        Assert.Equal(1.0, empty.MissingShare);
    }

    [Fact]
    public void Each_missing_pattern_is_factorised_once()
    {
        // Iris (Fisher 1936, public domain) with one answer missing in some rows: those rows take the precision-matrix
        // route, so no pattern needs its own factor (their values are checked against numpy in the test above).
        var (_, rows) = ReferenceData.Table("Screening", "iris_missing_mahalanobis.csv");
        var data = Matrix(rows, 4);
        var (mean, cov, _) = PairwiseCovariance.Compute(data);
        var d = new MahalanobisDistance(mean, cov);
        d.Compute(data);
        Assert.Equal(0, d.CachedPatterns);
        Assert.Equal(0, d.FailedPatterns);
    }

    [Fact]
    public void Precision_route_matches_each_rows_own_factor()
    {
        // Identity (Schur complement of a partitioned inverse, common practice, no source): the D² of a row with m
        // missing answers from the full precision matrix equals the D² from the answered block's own Cholesky factor.
        // Correlated data (p = 12) with 0..11 missing answers per row; rows with more than MaxRouteMissing missing
        // answers factorise their pattern, so exactly their patterns are cached.
        const int p = 12, n = 600;
        var rng = new ItemReduce.Core.Randomness.RandomStream(20261202);
        var values = new double[n * p];
        for (int i = 0; i < n; i++)
        {
            double g = rng.NextGaussian();
            for (int j = 0; j < p; j++) values[i * p + j] = 3 + 0.6 * g + (0.5 + 0.05 * j) * rng.NextGaussian();
            int missing = i % p;
            var order = Enumerable.Range(0, p).ToArray();
            rng.Shuffle(order.AsSpan());
            for (int t = 0; t < missing; t++) values[i * p + order[t]] = double.NaN;
        }
        var items = Enumerable.Range(1, p).Select(j => new ItemDefinition($"x{j}", null, false, -1e9, 1e9, null)).ToList();
        var data = new ResponseMatrix(Enumerable.Range(1, n).Select(i => $"r{i}").ToList(), items, values);
        var (mean, cov, _) = PairwiseCovariance.Compute(data);
        var dist = new MahalanobisDistance(mean, cov);
        var (d2, answered) = dist.Compute(data);
        int longPatterns = Enumerable.Range(0, n).Where(i => i % p > MahalanobisDistance.MaxRouteMissing)
            .Select(i => string.Concat(Enumerable.Range(0, p).Select(j => double.IsNaN(values[i * p + j]) ? '0' : '1'))).Distinct().Count();
        Assert.Equal(longPatterns, dist.CachedPatterns);
        var own = new MahalanobisDistance(mean, cov);
        double[] diff = new double[p], work = new double[p];
        for (int i = 0; i < n; i++)
        {
            double reference = own.Row(values, i * p, diff, work, out int k);
            Assert.Equal(p - i % p, answered[i]);
            Assert.Equal(k, answered[i]);
            Assert.True(Math.Abs(d2[i] - reference) <= 1e-11 * reference, $"row {i}: {d2[i]} vs {reference}");
        }
    }

    [Fact]
    public void Pairwise_covariance_of_replicated_data_follows_the_replication_identity()
    {
        // The iris-with-gaps data (validated against numpy above) stacked 200 times (30,000 rows, several row blocks):
        // each pair keeps its means and its cross-product sum grows 200-fold, so
        // cov'_jk = cov_jk · 200 (m_jk − 1) / (200 m_jk − 1), with m_jk the joint answer count of one copy.
        var (_, rows) = ReferenceData.Table("Screening", "iris_missing_mahalanobis.csv");
        var once = Matrix(rows, 4);
        var many = Matrix(Enumerable.Repeat(rows, 200).SelectMany(r => r).ToArray(), 4);
        var (m1, c1, _) = PairwiseCovariance.Compute(once);
        var (m2, c2, _) = PairwiseCovariance.Compute(many);
        for (int j = 0; j < 4; j++)
        {
            Assert.Equal(m1[j], m2[j], 1e-12);
            for (int k = 0; k < 4; k++)
            {
                int m = rows.Count(r => !double.IsNaN(r[j]) && !double.IsNaN(r[k]));
                Assert.Equal(c1[j, k] * 200.0 * (m - 1) / (200.0 * m - 1), c2[j, k], 1e-11);
            }
        }
    }

    [Fact]
    public void Non_positive_definite_pairwise_matrix_is_repaired_with_a_warning()
    {
        // Three items where x3 = x1 + x2 exactly: the covariance is singular (property, no outside value needed).
        var rows = Enumerable.Range(0, 30).Select(i => { double a = Math.Sin(i), b = Math.Cos(3 * i); return new[] { a, b, a + b }; }).ToArray();
        var r = RespondentScreening.Run(Matrix(rows, 3), new ScreeningOptions());
        Assert.Contains(r.Warnings, w => w.Message.Contains("not positive definite"));
        Assert.All(r.Respondents, x => Assert.False(double.IsNaN(x.D2)));
    }
}
