using ItemReduce.Core.Correlation;
using ItemReduce.Core.Data;
using ItemReduce.Core.Randomness;
using ItemReduce.Core.Screening;
using ItemReduce.Simulation;

namespace ItemReduce.Tests.Core.Data;

/// <summary>
/// Compact (one byte per cell) storage against the dense double path on the same values: decoding, views,
/// reverse scoring and the kernels must give the same doubles bit for bit (property checks: the two storages
/// hold the same numbers, so every result must agree exactly; no outside values are needed).
/// </summary>
public class CompactStorageTests
{
    private static readonly ItemDefinition[] Items =
    [
        new("a", "S1", false, 1, 5, null), new("b", "S1", true, 1, 5, null), new("c", "S2", false, 0, 10, null),
        new("d", "S2", true, 0, 6, null), new("e", "S3", false, -3, 3, null), new("f", "S3", true, 1, 7, null),
        new("g", "S1", false, 1, 4, null),
    ];

    /// <summary>Random integer answers within each item's range, with <paramref name="missing"/> share missing.</summary>
    private static (string[] Ids, double[] Values) RandomAnswers(int n, double missing, ulong seed)
    {
        var rng = new RandomStream(seed);
        int p = Items.Length;
        var v = new double[n * p];
        for (int i = 0; i < n; i++)
        {
            // A common component makes the items correlate, so covariance matrices are well conditioned.
            double common = rng.NextGaussian();
            for (int j = 0; j < p; j++)
            {
                var it = Items[j];
                int k = (int)(it.Max - it.Min) + 1;
                double u = Math.Clamp(0.5 + 0.25 * common + 0.2 * rng.NextGaussian(), 0, 0.999999);
                v[i * p + j] = rng.NextDouble() < missing ? double.NaN : it.Min + Math.Floor(u * k);
            }
        }
        return (Enumerable.Range(1, n).Select(i => "r" + i).ToArray(), v);
    }

    private static (ResponseMatrix Compact, ResponseMatrix Dense) Both(int n, double missing, ulong seed)
    {
        var (ids, v) = RandomAnswers(n, missing, seed);
        var builder = new ResponseMatrixBuilder(Items);
        for (int i = 0; i < n; i++) builder.Add(ids[i], v.AsSpan(i * Items.Length, Items.Length));
        Assert.True(builder.IsCompact);
        var compact = builder.Build();
        Assert.True(compact.IsCompact);
        return (compact, new ResponseMatrix(ids, Items, v));
    }

    private static void AssertSameBits(double[] expected, double[] actual)
    {
        Assert.Equal(expected.Length, actual.Length);
        for (int k = 0; k < expected.Length; k++)
            Assert.True(BitConverter.DoubleToInt64Bits(expected[k]) == BitConverter.DoubleToInt64Bits(actual[k]),
                $"cell {k}: expected {expected[k]:R}, got {actual[k]:R}");
    }

    private static void AssertSameBits(double[,] expected, double[,] actual) =>
        AssertSameBits(expected.Cast<double>().ToArray(), actual.Cast<double>().ToArray());

    [Theory]
    [InlineData(0.0, 1UL)]
    [InlineData(0.1, 2UL)]
    public void Decoding_equals_the_stored_doubles_through_views_and_reverse_scoring(double missing, ulong seed)
    {
        var (compact, dense) = Both(1500, missing, seed);
        AssertSameBits(dense.ToArray(), compact.ToArray());
        Assert.Equal(dense.HasMissing(), compact.HasMissing());

        var rc = ReverseScoring.Apply(compact);
        var rd = ReverseScoring.Apply(dense);
        Assert.True(rc.IsCompact); // only the decoding table changed
        AssertSameBits(rd.ToArray(), rc.ToArray());

        int[] rows = [1499, 3, 3, 700, 0];
        int[] cols = [6, 1, 4];
        var vc = rc.SelectRespondents(rows).SelectItems(cols);
        var vd = rd.SelectRespondents(rows).SelectItems(cols);
        AssertSameBits(vd.ToArray(), vc.ToArray());
        Assert.Equal(vd.RespondentIds, vc.RespondentIds);
        for (int i = 0; i < rows.Length; i++)
            for (int j = 0; j < cols.Length; j++)
                Assert.Equal(BitConverter.DoubleToInt64Bits(vd[i, j]), BitConverter.DoubleToInt64Bits(vc[i, j]));
        var block = new double[2 * cols.Length];
        AssertSameBits(vd.ToArray()[3..9], vc.Rows(1, 2, block).ToArray());
    }

    [Fact]
    public void Complete_data_give_bit_identical_correlations_moments_and_distances()
    {
        var (c0, d0) = Both(3000, 0.0, 3);
        var compact = ReverseScoring.Apply(c0);
        var dense = ReverseScoring.Apply(d0);
        foreach (var handling in new[] { MissingDataHandling.Pairwise, MissingDataHandling.Listwise })
            AssertSameBits(PearsonCorrelation.Compute(dense, handling, 1), PearsonCorrelation.Compute(compact, handling, -1));
        AssertSameMoments(dense, compact);

        var (meanC, covC, _) = PairwiseCovariance.Compute(compact);
        var (meanD, covD, _) = PairwiseCovariance.Compute(dense);
        AssertSameBits(meanD, meanC);
        AssertSameBits(covD, covC);
        var (dc, ac) = new MahalanobisDistance(meanC, covC).Compute(compact);
        var (dd, ad) = new MahalanobisDistance(meanD, covD).Compute(dense);
        Assert.Equal(ad, ac);
        AssertSameBits(dd, dc);

        var sc = RespondentScreening.Run(compact, new ScreeningOptions(), c0);
        var sd = RespondentScreening.Run(dense, new ScreeningOptions(), d0);
        Assert.Equal(sd.Respondents, sc.Respondents, (x, y) =>
            x.RespondentId == y.RespondentId && x.Reasons.SequenceEqual(y.Reasons) &&
            (x with { Reasons = [] }).Equals(y with { Reasons = [] }));
    }

    [Theory]
    [InlineData(0.0, 41UL)]
    [InlineData(0.05, 42UL)]
    [InlineData(0.9, 43UL)]
    public void Data_summary_from_code_counts_equals_the_row_pass(double missing, ulong seed)
    {
        // Property: compact storage summarises from per-code counts, dense storage by a pass over the rows; both see
        // the same values, so every field (min, max, distinct answers, empty and complete rows) must agree exactly, except
        // the standard deviation, whose centred sum of squares is summed per code instead of per answer (checked
        // against exact arithmetic in AssertSameMoments).
        var (compact, dense) = Both(600, missing, seed);
        var sc = DataSummary.Of(compact);
        var sd = DataSummary.Of(dense);
        AssertSameItems(sd.Items, sc.Items);
        Assert.Equal(sd.RespondentsWithNoAnswers, sc.RespondentsWithNoAnswers);
        Assert.Equal(sd.CompleteRespondents, sc.CompleteRespondents);
        Assert.Equal(sd.MissingShare, sc.MissingShare);
        if (missing >= 0.9) Assert.True(sc.RespondentsWithNoAnswers > 0);
        if (missing == 0) Assert.Equal(600, sc.CompleteRespondents);
        // A view (row map) counts the codes of its own rows and must still agree with the dense rows it selects.
        var rows = Enumerable.Range(0, 300).Select(i => 2 * i).ToList();
        AssertSameItems(DataSummary.Of(dense.SelectRespondents(rows)).Items, DataSummary.Of(compact.SelectRespondents(rows)).Items);
        AssertSameMoments(dense, compact);
        AssertSameMoments(dense.SelectRespondents(rows), compact.SelectRespondents(rows));
    }

    private static void AssertSameItems(IReadOnlyList<ItemSummary> dense, IReadOnlyList<ItemSummary> compact)
    {
        Assert.Equal(dense.Count, compact.Count);
        for (int j = 0; j < dense.Count; j++)
        {
            Assert.Equal(dense[j] with { StandardDeviation = 0 }, compact[j] with { StandardDeviation = 0 });
            Assert.Equal(dense[j].StandardDeviation, compact[j].StandardDeviation, 1e-13);
        }
    }

    private static void AssertSameMoments(ResponseMatrix dense, ResponseMatrix compact)
    {
        var mc = ItemMoments.Compute(compact);
        var md = ItemMoments.Compute(dense);
        Assert.Equal(md.Counts, mc.Counts);
        // Integer answers: both sums are exact, so the means agree to the bit.
        AssertSameBits(md.Means, mc.Means);
        // Standard deviations: compact storage sums (v − mean)² once per code (weighted by its count), dense storage once
        // per answer; both must agree with the exact rational variance (BigInteger sums) to rounding error.
        for (int j = 0; j < md.Counts.Length; j++)
        {
            long n = md.Counts[j];
            if (n < 2) { Assert.True(double.IsNaN(mc.StandardDeviations[j])); continue; }
            System.Numerics.BigInteger sum = 0, squares = 0;
            for (int i = 0; i < dense.RespondentCount; i++)
            {
                double x = dense[i, j];
                if (double.IsNaN(x)) continue;
                sum += (long)x;
                squares += (long)(x * x);
            }
            double exact = Math.Sqrt((double)(n * squares - sum * sum) / ((double)n * (n - 1)));
            Assert.Equal(exact, mc.StandardDeviations[j], exact * 1e-15);
            Assert.Equal(exact, md.StandardDeviations[j], exact * 1e-13);
        }
    }

    /// <summary>Pairwise-complete covariance (m − 1) and correlation of items j, k in exact rational arithmetic:
    /// an independent brute-force reference (BigInteger sums over the respondents answering both).</summary>
    private static (double Cov, double R) ExactPair(ResponseMatrix d, int j, int k)
    {
        System.Numerics.BigInteger m = 0, sj = 0, sk = 0, sjj = 0, skk = 0, sjk = 0;
        for (int i = 0; i < d.RespondentCount; i++)
        {
            double a = d[i, j], b = d[i, k];
            if (double.IsNaN(a) || double.IsNaN(b)) continue;
            var x = new System.Numerics.BigInteger(a);
            var y = new System.Numerics.BigInteger(b);
            m++; sj += x; sk += y; sjj += x * x; skk += y * y; sjk += x * y;
        }
        var cjk = m * sjk - sj * sk;       // m² × covariance × (m − 1) / m
        var cjj = m * sjj - sj * sj;
        var ckk = m * skk - sk * sk;
        double cov = (double)cjk / ((double)m * (double)(m - 1));
        double r = (double)cjk / Math.Sqrt((double)cjj * (double)ckk);
        return (cov, r);
    }

    [Fact]
    public void With_missing_answers_pairwise_moments_of_integer_data_are_exact()
    {
        var (c0, d0) = Both(3000, 0.08, 4);
        var compact = ReverseScoring.Apply(c0);
        var dense = ReverseScoring.Apply(d0);
        AssertSameMoments(dense, compact);
        // Listwise deletion still takes the complete-data path: bit-identical.
        AssertSameBits(PearsonCorrelation.Compute(dense, MissingDataHandling.Listwise, 1), PearsonCorrelation.Compute(compact, MissingDataHandling.Listwise, -1));

        // Pairwise: the compact path sums integers exactly and rounds once, so it matches the exact rational value to
        // a few ulps; the dense two-pass path agrees to rounding error.
        var rc = PearsonCorrelation.Compute(compact, MissingDataHandling.Pairwise, -1);
        var rd = PearsonCorrelation.Compute(dense, MissingDataHandling.Pairwise, 1);
        var (_, covC, withoutC) = PairwiseCovariance.Compute(compact);
        var (_, covD, withoutD) = PairwiseCovariance.Compute(dense);
        Assert.Equal(withoutD, withoutC);
        int p = compact.ItemCount;
        for (int j = 0; j < p; j++)
            for (int k = 0; k <= j; k++)
            {
                var (cov, r) = ExactPair(compact, j, k);
                Assert.Equal(cov, covC[j, k], Math.Abs(cov) * 1e-15);
                Assert.Equal(covD[j, k], covC[j, k], Math.Abs(cov) * 1e-12);
                if (j == k) continue;
                Assert.Equal(r, rc[j, k], 1e-15);
                Assert.Equal(rd[j, k], rc[j, k], 1e-12);
            }
    }

    [Fact]
    public void Listwise_scale_covariance_of_integer_data_is_exact()
    {
        var (c0, d0) = Both(2500, 0.05, 6);
        var compact = ReverseScoring.Apply(c0).SelectRespondents(Enumerable.Range(0, 2500).Where(i => i % 7 != 3).ToList());
        var dense = ReverseScoring.Apply(d0).SelectRespondents(Enumerable.Range(0, 2500).Where(i => i % 7 != 3).ToList());
        var all = Enumerable.Range(0, compact.ItemCount).ToArray();
        var (covC, nC) = ItemReduce.Core.Reliability.ScaleReliability.ListwiseCovariance(compact, all);
        var (covD, nD) = ItemReduce.Core.Reliability.ScaleReliability.ListwiseCovariance(dense, all);
        Assert.Equal(nD, nC);
        // Independent reference: exact rational covariance over the complete rows (BigInteger sums).
        var complete = Enumerable.Range(0, compact.RespondentCount).Where(compact.IsComplete).ToList();
        Assert.Equal(complete.Count, nC);
        var listwise = compact.SelectRespondents(complete);
        for (int a = 0; a < all.Length; a++)
            for (int b = 0; b <= a; b++)
            {
                var (cov, _) = ExactPair(listwise, a, b);
                Assert.Equal(cov, covC[a, b], Math.Abs(cov) * 1e-15);
                Assert.Equal(covD[a, b], covC[a, b], Math.Abs(cov) * 1e-12);
            }
    }

    [Fact]
    public void The_builder_falls_back_to_doubles_for_values_without_an_exact_code()
    {
        var items = new ItemDefinition[] { new("x", null, false, 1, 5, null), new("y", null, false, 0, 100, null) };
        var b = new ResponseMatrixBuilder(items);
        b.Add("1", [3, 40]);
        b.Add("2", [double.NaN, 0]);
        Assert.True(b.IsCompact);
        b.Add("3", [2.5, 7]); // not an integer code: switch to doubles, keeping earlier rows
        Assert.False(b.IsCompact);
        b.Add("4", [-0.0 + 1, double.NaN]);
        var m = b.Build();
        Assert.False(m.IsCompact);
        AssertSameBits([3, 40, double.NaN, 0, 2.5, 7, 1, double.NaN], m.ToArray());

        // Scales that cannot be coded in one byte are dense from the start.
        Assert.False(ResponseMatrixBuilder.CanStoreCompact(new ItemDefinition("w", null, false, 0, 255, null)));
        Assert.False(ResponseMatrixBuilder.CanStoreCompact(new ItemDefinition("h", null, false, 0.5, 4.5, null)));
        Assert.True(ResponseMatrixBuilder.CanStoreCompact(new ItemDefinition("k", null, false, -127, 127, null)));
    }

    [Fact]
    public void Simulated_surveys_read_through_the_builder_screen_identically()
    {
        // Planted factor model with careless respondents (our simulator), dense vs compact.
        var s = FactorModelSimulator.Generate(FactorModelSpec.Simple(3, 4, 0.7, 0.3) with
        { ReverseKeyed = Enumerable.Range(0, 12).Select(j => j % 4 == 1).ToArray() },
            new FactorModelSimulator.Settings(800, 9, 0.03, 5, 5));
        var dense = s.Responses;
        var b = new ResponseMatrixBuilder(dense.Items);
        var row = new double[dense.ItemCount];
        for (int i = 0; i < dense.RespondentCount; i++) { dense.CopyRow(i, row); b.Add(dense.RespondentIds[i], row); }
        var compact = b.Build();
        Assert.True(compact.IsCompact);
        var rc = RespondentScreening.Run(ReverseScoring.Apply(compact), new ScreeningOptions(), compact);
        var rd = RespondentScreening.Run(ReverseScoring.Apply(dense), new ScreeningOptions(), dense);
        Assert.Equal(rd.FlaggedRespondents, rc.FlaggedRespondents);
        AssertSameBits(rd.Respondents.Select(x => x.RobustD2).ToArray(), rc.Respondents.Select(x => x.RobustD2).ToArray());
        AssertSameBits(rd.Respondents.Select(x => x.EvenOdd).ToArray(), rc.Respondents.Select(x => x.EvenOdd).ToArray());
    }

    [Fact]
    public void Pairwise_correlations_of_a_kept_subset_are_the_same_whether_derived_from_the_whole_or_computed_afresh()
    {
        // Property: for integer answers the pairwise sums are exact integers, so the kept respondents' sums obtained as
        // (all respondents) − (respondents left out) equal the sums accumulated over the kept rows bit for bit.
        var (compact, _) = Both(3000, 0.1, 77);
        var whole = PearsonCorrelation.Compute(compact, MissingDataHandling.Pairwise, -1); // caches the whole matrix's sums
        Assert.Equal(3000, compact.RespondentCount);
        var keep = Enumerable.Range(0, 3000).Where(i => i % 7 != 3).ToList();
        var derived = PearsonCorrelation.Compute(compact.SelectRespondents(keep), MissingDataHandling.Pairwise, -1);
        // A fresh matrix holding only the kept rows (no parent to derive from).
        var (ids, v) = RandomAnswers(3000, 0.1, 77);
        var builder = new ResponseMatrixBuilder(Items);
        foreach (int i in keep) builder.Add(ids[i], v.AsSpan(i * Items.Length, Items.Length));
        var fresh = PearsonCorrelation.Compute(builder.Build(), MissingDataHandling.Pairwise, -1);
        AssertSameBits(fresh, derived);
        Assert.NotEqual(whole[0, 1], derived[0, 1]);
    }

    [Theory]
    [InlineData(0.0, 81UL)]
    [InlineData(0.02, 82UL)]
    [InlineData(0.3, 83UL)]
    public void Pairwise_sums_from_column_totals_and_corrections_equal_the_stacked_kernel(double missing, ulong seed)
    {
        // Property: both routes sum the same integers exactly, so every count, sum, sum of squares and product agrees;
        // the independent BigInteger reference below checks one pair as well.
        var (compact, dense) = Both(2500, missing, seed);
        var view = compact.SelectRespondents(Enumerable.Range(0, 2500).Where(i => i % 5 != 1).ToList());
        foreach (var data in new[] { compact, view })
        {
            var a = PairwiseSums.AccumulateFewMissing(data, -1);
            var b = PairwiseSums.AccumulateStacked(data, -1);
            int p = data.ItemCount;
            for (int j = 0; j < p; j++)
                for (int k = 0; k < p; k++)
                {
                    Assert.Equal(b.Count(j, k), a.Count(j, k));
                    Assert.Equal(b.Sum(j, k), a.Sum(j, k));
                    Assert.Equal(b.SumSquares(j, k), a.SumSquares(j, k));
                    Assert.Equal(b.Product(j, k), a.Product(j, k));
                }
        }
        // Brute force for items 0 and 1 over the dense copy: respondents answering both, Σ x0, Σ x0², Σ x0 x1.
        long m = 0, s0 = 0, q0 = 0, s01 = 0;
        for (int i = 0; i < dense.RespondentCount; i++)
        {
            double x = dense[i, 0], y = dense[i, 1];
            if (double.IsNaN(x) || double.IsNaN(y)) continue;
            m++; s0 += (long)x; q0 += (long)(x * x); s01 += (long)(x * y);
        }
        var few = PairwiseSums.AccumulateFewMissing(compact, 1);
        Assert.Equal(m, few.Count(0, 1));
        Assert.Equal(s0, few.Sum(0, 1));
        Assert.Equal(q0, few.SumSquares(0, 1));
        Assert.Equal(s01, few.Product(0, 1));
    }
}
