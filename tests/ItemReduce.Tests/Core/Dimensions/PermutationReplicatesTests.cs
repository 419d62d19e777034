using ItemReduce.Core.Correlation;
using ItemReduce.Core.Data;
using ItemReduce.Core.Dimensions;
using ItemReduce.Core.LinearAlgebra;
using ItemReduce.Simulation;
using static ItemReduce.Tests.Core.Dimensions.DimensionsReferenceData;

namespace ItemReduce.Tests.Core.Dimensions;

public class PermutationReplicatesTests
{
    /// <summary>Realistic survey data (rules for tests): two correlated factors, skewed five-point items, 5% missing
    /// answers, stored compactly as the reader stores them.</summary>
    private static ResponseMatrix Survey(int respondents, int itemsPerFactor, ulong seed, double missing = 0.05)
    {
        var spec = FactorModelSpec.Simple(2, itemsPerFactor, 0.6, 0.3) with { CategoryProbabilities = [0.40, 0.25, 0.15, 0.12, 0.08] };
        var s = FactorModelSimulator.Generate(spec, new FactorModelSimulator.Settings(respondents, seed, MissingRate: missing));
        var b = new ResponseMatrixBuilder(s.Responses.Items);
        var row = new double[s.Responses.ItemCount];
        for (int i = 0; i < s.Responses.RespondentCount; i++) { s.Responses.CopyRow(i, row); b.Add(s.Responses.RespondentIds[i], row); }
        var compact = ReverseScoring.Apply(b.Build());
        Assert.True(compact.IsCompact);
        return compact;
    }

    private static void SameReference(ParallelAnalysisReference a, ParallelAnalysisReference b, double tolerance)
    {
        for (int c = 0; c < a.Mean.Length; c++)
        {
            Assert.Equal(a.Mean[c], b.Mean[c], tolerance);
            Assert.Equal(a.Percentile[c], b.Percentile[c], tolerance);
            Assert.Equal(a.ReducedMean![c], b.ReducedMean![c], tolerance);
            Assert.Equal(a.ReducedPercentile![c], b.ReducedPercentile![c], tolerance);
        }
    }

    [Theory]
    [InlineData(0.05)]
    [InlineData(0.0)]
    public void Pearson_replicates_equal_the_plain_column_permutation(double missing)
    {
        // The plain implementation (a permuted copy per replicate, correlated by PearsonCorrelation) is the slow
        // reference; both shuffle with the same draws, so the eigenvalues agree up to the rounding of the correlations.
        var data = Survey(300, 6, 11, missing);
        Assert.NotNull(PermutationReplicates.TryCreate(data, new CorrelationOptions()));
        var o = new ParallelAnalysisOptions { Replicates = 40, Seed = 5, MaxDegreeOfParallelism = 1 };
        var fast = ParallelAnalysis.PermutationReference(data, new CorrelationOptions(), o);
        var plain = ParallelAnalysis.PermutationReference(data, d => PearsonCorrelation.Compute(d, MissingDataHandling.Pairwise, 1), o);
        SameReference(plain, fast, 1e-12);
    }

    [Theory]
    [InlineData(0.05, 12ul)]
    [InlineData(0.0, 13ul)]
    public void Polychoric_replicates_equal_the_plain_column_permutation(double missing, ulong seed)
    {
        // Without missing answers the thresholds are computed once and the last row and column come from the margins.
        var data = Survey(250, 4, seed, missing);
        var polychoric = new CorrelationOptions { Kind = CorrelationKind.Polychoric };
        Assert.NotNull(PermutationReplicates.TryCreate(data, polychoric));
        var o = new ParallelAnalysisOptions { Replicates = 30, Seed = 6, MaxDegreeOfParallelism = 1 };
        var fast = ParallelAnalysis.PermutationReference(data, polychoric, o);
        var plain = ParallelAnalysis.PermutationReference(data, d => PolychoricCorrelation.Compute(d, MissingDataHandling.Pairwise, 1), o);
        // The plain estimate stops Brent's search at about 1e-10 in ρ.
        SameReference(plain, fast, 1e-8);
    }

    [Fact]
    public void Results_do_not_depend_on_the_number_of_threads()
    {
        var data = Survey(300, 5, 14);
        foreach (var kind in new[] { CorrelationKind.Pearson, CorrelationKind.Polychoric })
        {
            var c = new CorrelationOptions { Kind = kind };
            var o = new ParallelAnalysisOptions { Replicates = 24, Seed = 8 };
            var one = ParallelAnalysis.PermutationReference(data, c, o with { MaxDegreeOfParallelism = 1 });
            var two = ParallelAnalysis.PermutationReference(data, c, o with { MaxDegreeOfParallelism = 2 });
            var four = ParallelAnalysis.PermutationReference(data, c, o with { MaxDegreeOfParallelism = 4 });
            Assert.Equal(one.Percentile, two.Percentile);
            Assert.Equal(one.ReducedPercentile, two.ReducedPercentile);
            Assert.Equal(one.Mean, four.Mean);
            Assert.Equal(one.ReducedMean, four.ReducedMean);
        }
    }

    [Fact]
    public void The_first_eigenvalue_agrees_in_distribution_with_an_independent_column_permutation()
    {
        // An independent slow reference: System.Random shuffles of a dense copy, PearsonCorrelation, eigenvalues.
        // Two-sample Kolmogorov–Smirnov distance of the largest eigenvalue over 300 replicates each; the critical
        // value at α = 0.001 is 1.95·√(2/300) ≈ 0.159: the asymptotic Kolmogorov quantile, scipy.special.kolmogi(0.001) =
        // 1.9494746 (Debian python3-scipy; equal to √(−ln(α/2)/2) to 1e-10).
        var data = Survey(200, 5, 15);
        const int replicates = 300;
        var fast = FirstEigenvalues(data, replicates);
        var rng = new Random(2026);
        int n = data.RespondentCount, p = data.ItemCount;
        var columns = Enumerable.Range(0, p).Select(data.Column).ToArray();
        var slow = new double[replicates];
        for (int r = 0; r < replicates; r++)
        {
            var v = new double[n * p];
            for (int j = 0; j < p; j++)
            {
                var c = (double[])columns[j].Clone();
                rng.Shuffle(c);
                for (int i = 0; i < n; i++) v[i * p + j] = c[i];
            }
            var corr = PearsonCorrelation.Compute(data.WithValues(v), MissingDataHandling.Pairwise);
            slow[r] = SymmetricEigensolver.Eigenvalues(corr)[0];
        }
        double d = ParallelAnalysisTests.KolmogorovSmirnov(fast, slow);
        Assert.True(d < 0.159, $"D = {d}");
    }

    /// <summary>The largest eigenvalue of each fast replicate (one replicate per call, percentile of one = the value).</summary>
    private static double[] FirstEigenvalues(ResponseMatrix data, int replicates)
    {
        var values = new double[replicates];
        var reps = PermutationReplicates.TryCreate(data, new CorrelationOptions())!;
        var worker = reps.NewWorker();
        int p = data.ItemCount;
        var r = new double[p * p];
        for (int k = 0; k < replicates; k++)
        {
            reps.Draw(worker, ItemReduce.Core.Randomness.RandomStream.ForTask(99, k, 1), r);
            var m = new double[p, p];
            Buffer.BlockCopy(r, 0, m, 0, r.Length * sizeof(double));
            values[k] = SymmetricEigensolver.Eigenvalues(m)[0];
        }
        return values;
    }

    [Fact]
    public void Progress_starts_at_zero_and_ends_at_all_replicates()
    {
        var data = Survey(120, 3, 16);
        var seen = new List<int>();
        var o = new ParallelAnalysisOptions
        {
            Replicates = 50,
            Seed = 9,
            MaxDegreeOfParallelism = 1,
            ReplicatesDone = k => { lock (seen) seen.Add(k); },
        };
        ParallelAnalysis.PermutationReference(data, new CorrelationOptions(), o);
        Assert.Equal(0, seen[0]);
        Assert.Equal(50, seen[^1]);
        Assert.Equal(51, seen.Count); // 0, then every replicate (a hundredth of 50 rounds up to one)
    }

    public static TheoryData<string> PermutedTables => new()
    {
        "five_by_five_n200", "seven_by_seven_n2000", "four_by_six_n500", "two_by_five_n300", "seven_by_three_n20000", "three_by_three_n100",
    };

    [Theory]
    [MemberData(nameof(PermutedTables))]
    public void Series_estimate_matches_scipy_maximum_likelihood_for_permuted_tables(string name)
    {
        // Expected: scipy two-step ML with the bivariate normal CDF from Owen's T (make_permuted_polychoric_fixture.py).
        var f = Fields("permuted_polychoric_tables.csv").Single(x => x[0] == name);
        int rows = int.Parse(f[1]), cols = int.Parse(f[2]);
        var counts = f[3].Split(';').Select(int.Parse).ToArray();
        double expected = Parse(f[4]);
        long all = counts.Sum();
        var rowTotals = Enumerable.Range(0, rows).Select(i => (long)Enumerable.Range(0, cols).Sum(j => counts[i * cols + j])).ToArray();
        var colTotals = Enumerable.Range(0, cols).Select(j => (long)Enumerable.Range(0, rows).Sum(i => counts[i * cols + j])).ToArray();
        var alpha = TetrachoricSeries.Differences(PolychoricCorrelation.Thresholds(rowTotals));
        var beta = TetrachoricSeries.Differences(PolychoricCorrelation.Thresholds(colTotals));
        var estimate = TetrachoricSeries.Estimate(counts, rows, cols,
            rowTotals.Select(x => (double)x / all).ToArray(), colTotals.Select(x => (double)x / all).ToArray(), alpha, beta);
        Assert.NotNull(estimate);
        Assert.Equal(expected, estimate!.Value, 1e-7);
        var table = new int[rows, cols];
        for (int i = 0; i < rows; i++) for (int j = 0; j < cols; j++) table[i, j] = counts[i * cols + j];
        Assert.Equal(PolychoricCorrelation.FromTable(table), estimate.Value, 1e-8);
    }

    [Fact]
    public void Series_estimate_declines_a_strong_correlation()
    {
        // ρ far from 0 (about 0.8): the series path returns null and the general estimate is used.
        int[] counts = [40, 8, 1, 8, 30, 9, 1, 9, 44];
        long[] totals = [49, 47, 54];
        var d = TetrachoricSeries.Differences(PolychoricCorrelation.Thresholds(totals));
        var shares = totals.Select(x => x / 150.0).ToArray();
        Assert.Null(TetrachoricSeries.Estimate(counts, 3, 3, shares, shares, d, d));
    }
}
