using ItemReduce.Core.Correlation;
using ItemReduce.Core.Data;
using ItemReduce.Core.Randomness;
using static ItemReduce.Tests.Core.Dimensions.DimensionsReferenceData;

namespace ItemReduce.Tests.Core.Correlation;

public class PearsonCorrelationTests
{
    [Fact]
    public void Iris_correlation_matches_numpy_corrcoef()
    {
        // Expected: np.corrcoef of Fisher's iris data (make_eigen_fixtures.py).
        var r = PearsonCorrelation.Compute(Responses("iris.csv"));
        var expected = Matrix("iris_correlation.csv");
        for (int i = 0; i < 4; i++)
            for (int j = 0; j < 4; j++) Assert.Equal(expected[i, j], r[i, j], 1e-14);
    }

    private static ResponseMatrix RandomData(int n, int p, ulong seed, double missing = 0)
    {
        var rng = new RandomStream(seed);
        var v = new double[n * p];
        for (int i = 0; i < n; i++)
        {
            double common = rng.NextGaussian();
            for (int j = 0; j < p; j++)
                v[i * p + j] = rng.NextDouble() < missing ? double.NaN : 3 + 0.5 * common * (j % 3) + rng.NextGaussian();
        }
        var items = Enumerable.Range(0, p).Select(j => new ItemDefinition($"x{j}", null, false, -1e9, 1e9, null)).ToList();
        return new ResponseMatrix(Enumerable.Range(0, n).Select(i => $"r{i}").ToList(), items, v);
    }

    /// <summary>Textbook two-pass Pearson r of two columns over rows where both are present (independent of the kernel).</summary>
    private static double Naive(ResponseMatrix d, int a, int b)
    {
        var rows = Enumerable.Range(0, d.RespondentCount).Where(i => !double.IsNaN(d[i, a]) && !double.IsNaN(d[i, b])).ToList();
        double ma = rows.Average(i => d[i, a]), mb = rows.Average(i => d[i, b]);
        double sab = rows.Sum(i => (d[i, a] - ma) * (d[i, b] - mb));
        double saa = rows.Sum(i => (d[i, a] - ma) * (d[i, a] - ma));
        double sbb = rows.Sum(i => (d[i, b] - mb) * (d[i, b] - mb));
        return sab / Math.Sqrt(saa * sbb);
    }

    [Theory]
    [InlineData(2100, 37)]  // p not a multiple of the 4-wide kernel, n spanning three segments
    [InlineData(10, 1)]
    [InlineData(257, 6)]    // one tile plus one row
    public void Fast_complete_path_equals_textbook_formula(int n, int p)
    {
        // Definition of Pearson's r (Pearson 1896) evaluated naively in the test.
        var d = RandomData(n, p, 11);
        var r = PearsonCorrelation.Compute(d);
        for (int a = 0; a < p; a++)
        {
            Assert.Equal(1.0, r[a, a]);
            for (int b = 0; b < a; b++)
            {
                Assert.Equal(Naive(d, a, b), r[a, b], 1e-12);
                Assert.Equal(r[a, b], r[b, a]);
            }
        }
    }

    [Fact]
    public void Fast_path_gives_identical_bits_for_any_thread_count()
    {
        var d = RandomData(20_000, 23, 5);
        var one = PearsonCorrelation.Compute(d, MissingDataHandling.Pairwise, 1);
        var two = PearsonCorrelation.Compute(d, MissingDataHandling.Pairwise, 2);
        Assert.Equal(one, two);
    }

    [Fact]
    public void Register_blocked_tile_kernel_sums_every_entry_like_a_single_dot_product()
    {
        // Property (no outside source needed): the kernel's register blocking (4 × 3 with 4 × 1 steps for the remainder)
        // must not change any entry: each is the 4-lane fused multiply-add over the tile in order, reduced once and
        // added to the accumulator. Reference: that definition written out per entry. Padded widths 4..24 cover all
        // remainder steps; the accumulator starts non-zero, as after earlier tiles.
        if (!System.Runtime.Intrinsics.X86.Fma.IsSupported || !System.Runtime.Intrinsics.Vector256.IsHardwareAccelerated) return;
        var rng = new RandomStream(11);
        int rows = PearsonCorrelation.TileRows;
        for (int padded = 4; padded <= 24; padded += 4)
        {
            var tile = new double[padded * rows];
            for (int i = 0; i < tile.Length; i++) tile[i] = rng.NextGaussian();
            var acc = new double[padded * padded];
            for (int i = 0; i < acc.Length; i++) acc[i] = rng.NextGaussian();
            var expected = (double[])acc.Clone();
            for (int j = 0; j < padded; j++)
                for (int k = 0; k < (j / 4 + 1) * 4; k++)
                {
                    var s = System.Runtime.Intrinsics.Vector256<double>.Zero;
                    for (int t = 0; t < rows; t += 4)
                        s = System.Runtime.Intrinsics.X86.Fma.MultiplyAdd(System.Runtime.Intrinsics.Vector256.Create(tile.AsSpan(j * rows + t, 4)),
                            System.Runtime.Intrinsics.Vector256.Create(tile.AsSpan(k * rows + t, 4)), s);
                    expected[j * padded + k] += System.Runtime.Intrinsics.Vector256.Sum(s);
                }
            PearsonCorrelation.AccumulateTile(tile, padded, acc);
            Assert.Equal(expected, acc);
        }
    }

    [Fact]
    public void Pairwise_uses_each_pairs_joint_answers_and_listwise_only_complete_rows()
    {
        var d = RandomData(400, 5, 3, missing: 0.15);
        var pairwise = PearsonCorrelation.Compute(d, MissingDataHandling.Pairwise);
        for (int a = 0; a < 5; a++)
            for (int b = 0; b < a; b++) Assert.Equal(Naive(d, a, b), pairwise[a, b], 1e-12);
        var complete = d.SelectRespondents(PearsonCorrelation.CompleteRows(d));
        var listwise = PearsonCorrelation.Compute(d, MissingDataHandling.Listwise);
        for (int a = 0; a < 5; a++)
            for (int b = 0; b < a; b++) Assert.Equal(Naive(complete, a, b), listwise[a, b], 1e-12);
    }

    [Fact]
    public void Pairwise_counts_count_joint_answers()
    {
        var items = Enumerable.Range(0, 3).Select(j => new ItemDefinition($"x{j}", null, false, 0, 9, null)).ToList();
        var nan = double.NaN;
        var d = new ResponseMatrix(["a", "b", "c"], items, [1, nan, 2, 3, 4, nan, nan, 5, 6]);
        var c = PearsonCorrelation.PairwiseCounts(d);
        // Hand-counted from the 3 × 3 pattern above.
        Assert.Equal(new[,] { { 2, 1, 1 }, { 1, 2, 1 }, { 1, 1, 2 } }, c);
    }
}
