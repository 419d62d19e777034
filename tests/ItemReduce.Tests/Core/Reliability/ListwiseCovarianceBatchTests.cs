using ItemReduce.Core.Correlation;
using ItemReduce.Core.Data;
using ItemReduce.Core.Reliability;
using ItemReduce.Core.ShortForm;
using ItemReduce.Simulation;
using ItemReduce.Tests.Support;

namespace ItemReduce.Tests.Core.Reliability;

/// <summary>
/// Listwise covariances of several column sets from one read of the data (<see cref="ListwiseCovarianceBatch"/>),
/// against numpy (fixtures from ReferenceData/Reliability/make_listwise_reference.py), plus property checks: the
/// batch equals the one-set computation bit for bit, and estimates from a precomputed covariance equal those from data.
/// </summary>
public class ListwiseCovarianceBatchTests
{
    private const string Area = "Reliability";

    private static IReadOnlyList<int>[] Sets() =>
        ReferenceData.Numbers(Area, "listwise_sets.csv").Select(r => (IReadOnlyList<int>)r.Select(c => (int)c).ToArray()).ToArray();

    private static ResponseMatrix Load(string file, bool compact)
    {
        var rows = ReferenceData.Numbers(Area, file);
        int p = rows[0].Length;
        var items = Enumerable.Range(0, p).Select(j => new ItemDefinition($"i{j + 1}", null, false, compact ? 1 : -100, compact ? 5 : 100, null)).ToList();
        if (compact)
        {
            var b = new ResponseMatrixBuilder(items);
            for (int i = 0; i < rows.Length; i++) b.Add($"r{i}", rows[i]);
            Assert.True(b.IsCompact);
            return b.Build();
        }
        return new ResponseMatrix(Enumerable.Range(0, rows.Length).Select(i => $"r{i}").ToList(), items, rows.SelectMany(r => r).ToArray());
    }

    private static void AssertMatchesNumpy(string expectedFile, ListwiseCovariance[] actual, double relativeTolerance)
    {
        foreach (var e in ReferenceData.Numbers(Area, expectedFile))
        {
            var r = actual[(int)e[0]];
            Assert.Equal((int)e[1], r.Respondents);
            double want = e[4], got = r.Covariance[(int)e[2], (int)e[3]];
            if (double.IsNaN(want)) Assert.True(double.IsNaN(got), $"set {e[0]} [{e[2]}, {e[3]}]: expected NaN, got {got:R}");
            else Assert.Equal(want, got, Math.Abs(want) * relativeTolerance + 1e-15);
        }
    }

    private static void AssertSameBits(ListwiseCovariance expected, ListwiseCovariance actual)
    {
        Assert.Equal(expected.Respondents, actual.Respondents);
        Assert.Equal(expected.Covariance.GetLength(0), actual.Covariance.GetLength(0));
        foreach (var (a, b) in expected.Covariance.Cast<double>().Zip(actual.Covariance.Cast<double>()))
            Assert.Equal(BitConverter.DoubleToInt64Bits(a), BitConverter.DoubleToInt64Bits(b));
    }

    [Fact]
    public void Integer_answers_match_numpy_listwise_covariance_per_set()
    {
        // Expected: numpy.cov(ddof=1) over the rows complete on each set (make_listwise_reference.py, 1,500 rows,
        // 6 % missing); set 4 has one complete row → NaN. The data are compact and integer, so the exact path runs.
        var data = Load("listwise_integer_items.csv", compact: true);
        Assert.True(PairwiseSums.Applies(data));
        AssertMatchesNumpy("listwise_integer_expected.csv", ListwiseCovarianceBatch.Compute(data, Sets()), 1e-13);
    }

    [Fact]
    public void Non_integer_answers_match_numpy_listwise_covariance_per_set()
    {
        // Expected: numpy.cov(ddof=1) per set as above (400 rows of non-integer answers, 5 % missing, dense storage →
        // two-pass path); set 4 has no complete row → NaN.
        var data = Load("listwise_real_items.csv", compact: false);
        Assert.False(PairwiseSums.Applies(data));
        AssertMatchesNumpy("listwise_real_expected.csv", ListwiseCovarianceBatch.Compute(data, Sets()), 1e-12);
    }

    [Theory]
    [InlineData("listwise_integer_items.csv", true)]
    [InlineData("listwise_real_items.csv", false)]
    public void Batch_equals_one_set_at_a_time_bit_for_bit_on_views_and_any_thread_count(string file, bool compact)
    {
        // Property (no outside values): grouping sets into one read must not change any bit, also on row/column views
        // and for 1 or all threads (exact integer sums; the two-pass sums run in row order either way).
        var full = Load(file, compact);
        var view = full.SelectRespondents(Enumerable.Range(0, full.RespondentCount).Where(i => i % 5 != 2).ToList())
            .SelectItems([6, 5, 4, 3, 2, 1, 0, 7]);
        var sets = Sets();
        foreach (var data in new[] { full, view })
        {
            var batch = ListwiseCovarianceBatch.Compute(data, sets);
            var sequential = ListwiseCovarianceBatch.Compute(data, sets, maxDegreeOfParallelism: 1);
            for (int s = 0; s < sets.Length; s++)
            {
                var single = ListwiseCovarianceBatch.Compute(data.SelectItems(sets[s]), [Enumerable.Range(0, sets[s].Count).ToArray()])[0];
                AssertSameBits(single, batch[s]);
                AssertSameBits(single, sequential[s]);
            }
        }
    }

    [Fact]
    public void Subtracting_incomplete_rows_from_cached_all_row_sums_gives_the_same_bits_and_matches_numpy()
    {
        // Property + outside reference: once the pairwise sums of a matrix are cached (as after its pairwise
        // correlations), the batch subtracts the incomplete rows from the all-rows sums instead of summing complete rows;
        // both are exact, so the bits must agree; numpy.cov per set (make_listwise_reference.py) as above.
        var data = Load("listwise_integer_items.csv", compact: true);
        var view = data.SelectRespondents(Enumerable.Range(0, data.RespondentCount).Where(i => i % 3 != 0).ToList());
        var sets = Sets();
        var plain = ListwiseCovarianceBatch.Compute(data, sets);
        var plainView = ListwiseCovarianceBatch.Compute(view, sets);
        Assert.Null(PairwiseSums.Cached(data));
        PairwiseSums.Compute(data, -1);
        PairwiseSums.Compute(view, 1);
        Assert.NotNull(PairwiseSums.Cached(data));
        var cached = ListwiseCovarianceBatch.Compute(data, sets);
        var cachedView = ListwiseCovarianceBatch.Compute(view, sets, maxDegreeOfParallelism: 1);
        for (int s = 0; s < sets.Length; s++)
        {
            AssertSameBits(plain[s], cached[s]);
            AssertSameBits(plainView[s], cachedView[s]);
        }
        AssertMatchesNumpy("listwise_integer_expected.csv", cached, 1e-13);
    }

    [Fact]
    public void Estimates_from_a_precomputed_covariance_equal_those_from_the_data()
    {
        // Property: FromCovariance / ShortFullCorrelation(covariance) are the data-based entry points minus the read.
        var data = Load("listwise_integer_items.csv", compact: true);
        IReadOnlyList<int> scale = [0, 1, 2, 3, 4, 5];
        var c = ListwiseCovarianceBatch.Compute(data, [scale])[0];
        var fromData = ScaleReliability.Compute(data.SelectItems(scale));
        var fromCov = ScaleReliability.FromCovariance(c.Covariance, c.Respondents);
        Assert.Equal(fromData.Respondents, fromCov.Respondents);
        Assert.Equal(BitConverter.DoubleToInt64Bits(fromData.Alpha), BitConverter.DoubleToInt64Bits(fromCov.Alpha));
        Assert.Equal(BitConverter.DoubleToInt64Bits(fromData.Omega), BitConverter.DoubleToInt64Bits(fromCov.Omega));
        Assert.Equal(fromData.AlphaIfDeleted, fromCov.AlphaIfDeleted);
        Assert.Equal(fromData.ItemTotalCorrelations, fromCov.ItemTotalCorrelations);
        Assert.Equal(ScaleReliability.ShortFullCorrelation(data.SelectItems(scale), [0, 2, 4]),
            ScaleReliability.ShortFullCorrelation(c.Covariance, c.Respondents, [0, 2, 4]));
    }

    [Fact]
    public void Short_form_reliability_rows_equal_scale_by_scale_estimates()
    {
        // Property: the builder's one-read-per-sample rows equal ScaleReliability on each scale's own view of the
        // selection and holdout samples, bit for bit (invented two-factor survey from the planted-model simulator).
        var spec = new FactorModelSpec
        {
            ItemFactor = [0, 0, 0, 0, 0, 1, 1, 1, 1, 1],
            Loadings = [.7, .65, .6, .55, .5, .7, .65, .6, .55, .5],
            ReverseKeyed = [false, false, true, false, false, false, true, false, false, false],
            Categories = 5,
        };
        var survey = FactorModelSimulator.Generate(spec, new FactorModelSimulator.Settings(Respondents: 3000, Seed: 11, MissingRate: 0.03,
            SubscaleNames: ["a", "b"]));
        var raw = survey.Responses;
        var b = new ResponseMatrixBuilder(raw.Items);
        var row = new double[raw.ItemCount];
        for (int i = 0; i < raw.RespondentCount; i++) { raw.CopyRow(i, row); b.Add(raw.RespondentIds[i], row); }
        var data = ReverseScoring.Apply(b.Build());
        var result = ShortFormBuilder.Build(data, 2, new ShortFormOptions { HoldoutFraction = 0.4, Seed = 5, ItemsPerFactor = 3 });
        var holdout = data.SelectRespondents(result.HoldoutRows);
        var selection = data.SelectRespondents(Enumerable.Range(0, data.RespondentCount).Except(result.HoldoutRows).ToList());
        var names = data.Items.Select(i => i.Name).ToList();
        Assert.Equal(2 * 2 * result.Scales.Count, result.Reliability.Count);
        foreach (var r in result.Reliability)
        {
            var scale = result.Scales.Single(s => s.Scale == r.Scale);
            var sample = r.Sample == SampleRole.Holdout ? holdout : selection;
            var full = scale.FullItems.Select(n => names.IndexOf(n)).ToList();
            var shortPositions = Enumerable.Range(0, full.Count).Where(a => scale.SelectedItems.Contains(scale.FullItems[a])).ToList();
            var items = r.Form == ScaleForm.Full ? full : shortPositions.Select(a => full[a]).ToList();
            var e = ScaleReliability.Compute(sample.SelectItems(items), 0.95);
            Assert.Equal(e.Respondents, r.Respondents);
            Assert.Equal(BitConverter.DoubleToInt64Bits(e.Alpha), BitConverter.DoubleToInt64Bits(r.Alpha));
            Assert.Equal(BitConverter.DoubleToInt64Bits(e.AlphaCiLow), BitConverter.DoubleToInt64Bits(r.AlphaCiLow));
            Assert.Equal(BitConverter.DoubleToInt64Bits(e.Omega), BitConverter.DoubleToInt64Bits(r.Omega));
            if (r.Form == ScaleForm.Short)
            {
                var (observed, corrected) = ScaleReliability.ShortFullCorrelation(sample.SelectItems(full), shortPositions);
                Assert.Equal(BitConverter.DoubleToInt64Bits(observed), BitConverter.DoubleToInt64Bits(r.ShortFullCorrelationObserved));
                Assert.Equal(BitConverter.DoubleToInt64Bits(corrected), BitConverter.DoubleToInt64Bits(r.ShortFullCorrelation));
            }
        }
    }

    [Fact]
    public void Invalid_sets_are_rejected_with_the_value_and_range()
    {
        var data = Load("listwise_real_items.csv", compact: false);
        var empty = Assert.Throws<ArgumentException>(() => ListwiseCovarianceBatch.Compute(data, [Array.Empty<int>()]));
        Assert.Contains("empty", empty.Message);
        var outside = Assert.Throws<ArgumentException>(() => ListwiseCovarianceBatch.Compute(data, [[0, 8]]));
        Assert.Contains("0..7", outside.Message);
        Assert.Throws<ArgumentException>(() => ScaleReliability.FromCovariance(new double[2, 3], 10));
        Assert.Throws<ArgumentException>(() => ScaleReliability.FromCovariance(new double[2, 2], -1));
    }
}
