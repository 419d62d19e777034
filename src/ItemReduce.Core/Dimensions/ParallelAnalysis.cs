using System.Runtime.CompilerServices;
using ItemReduce.Core.Correlation;
using ItemReduce.Core.Data;
using ItemReduce.Core.LinearAlgebra;
using ItemReduce.Core.Randomness;

namespace ItemReduce.Core.Dimensions;

/// <summary>Where the random reference eigenvalues of parallel analysis come from.</summary>
public enum ReferenceKind
{
    /// <summary>Uncorrelated normal data of the same size (drawn as Wishart matrices, see
    /// <see cref="BartlettWishartSampler"/>). Default.</summary>
    Normal,
    /// <summary>The observed data with each item's answers shuffled independently across respondents
    /// (Buja &amp; Eyuboglu, 1992), keeping every item's distribution.</summary>
    Permutation,
    /// <summary>Polychoric correlations of independent ordinal items with the observed marginal distributions
    /// (Garrido, Abad &amp; Ponsoda, 2013), drawn from their large-sample distribution
    /// (<see cref="PolychoricNullDistribution"/>). Default for polychoric correlations.</summary>
    Ordinal,
}

/// <summary>Settings of <see cref="ParallelAnalysis"/>.</summary>
public sealed record ParallelAnalysisOptions
{
    /// <summary>Default of <see cref="Replicates"/>.</summary>
    public const int DefaultReplicates = 1000;

    /// <summary>Allowed range of <see cref="Replicates"/>.</summary>
    public const int MinReplicates = 10, MaxReplicates = 100_000;

    /// <summary>Default of <see cref="Percentile"/> (Glorfeld, 1995).</summary>
    public const double DefaultPercentile = 95;

    /// <summary>Random reference data sets; default <see cref="DefaultReplicates"/>, range
    /// [<see cref="MinReplicates"/>, <see cref="MaxReplicates"/>].</summary>
    public int Replicates { get; init; } = DefaultReplicates;

    /// <summary>Percentile of the reference eigenvalues used as threshold; default <see cref="DefaultPercentile"/>,
    /// range (0, 100) exclusive; 50 gives the median.</summary>
    public double Percentile { get; init; } = DefaultPercentile;

    /// <summary>Reference kind; default <see cref="ReferenceKind.Normal"/>.</summary>
    public ReferenceKind Reference { get; init; } = ReferenceKind.Normal;

    /// <summary>Seed; replicate r uses <c>RandomStream.ForTask(Seed, r, purpose)</c>.</summary>
    public ulong Seed { get; init; } = RandomStream.DefaultSeed;

    /// <summary>Also compute reference eigenvalues of the reduced (SMC-diagonal) matrix; default true.</summary>
    public bool IncludeReducedMatrix { get; init; } = true;

    /// <summary>Thread cap (−1 = all cores). Results do not depend on it.</summary>
    public int MaxDegreeOfParallelism { get; init; } = -1;

    /// <summary>Permutation reference only: with more respondents than this, the replicates shuffle a seeded random
    /// subsample of this many respondents (<c>RandomStream.ForTask(Seed, 0, subsample purpose)</c>), so the cost per
    /// replicate does not grow with n; default 50,000, range [100, 10,000,000]. The reference eigenvalues then describe
    /// random data of the subsample's size, which is conservative (their spread is larger than at the full n).</summary>
    public int PermutationMaxRows { get; init; } = 50_000;

    /// <summary>Optional progress callback, called from worker threads with the number of replicates finished each time
    /// another tenth of them is done; default none. It does not affect the results.</summary>
    public Action<int>? ReplicatesDone { get; init; }

    internal void Validate()
    {
        if (Replicates is < MinReplicates or > MaxReplicates)
            throw new ArgumentException($"Replicates must lie in [{MinReplicates}, {MaxReplicates}], got {Replicates}.", nameof(Replicates));
        if (!(Percentile > 0 && Percentile < 100))
            throw new ArgumentException($"Percentile must lie in (0, 100), got {Percentile}.", nameof(Percentile));
        if (PermutationMaxRows is < 100 or > 10_000_000)
            throw new ArgumentException($"PermutationMaxRows must lie in [100, 10000000], got {PermutationMaxRows}.", nameof(PermutationMaxRows));
        if (MaxDegreeOfParallelism == 0 || MaxDegreeOfParallelism < -1)
            throw new ArgumentException($"MaxDegreeOfParallelism must be −1 or ≥ 1, got {MaxDegreeOfParallelism}.", nameof(MaxDegreeOfParallelism));
    }
}

/// <summary>Reference eigenvalues of parallel analysis; every array has length p, component 1 first.</summary>
/// <param name="Mean">Mean over replicates of the c-th largest eigenvalue of the reference correlation matrix.</param>
/// <param name="Percentile">The requested percentile of the same (linear interpolation, Hyndman &amp; Fan 1996 type 7).</param>
/// <param name="ReducedMean">As <paramref name="Mean"/> for the reduced (SMC-diagonal) reference matrices, or null.</param>
/// <param name="ReducedPercentile">As <paramref name="Percentile"/> for the reduced matrices, or null.</param>
/// <param name="Replicates">Number of replicates.</param>
/// <param name="PercentileLevel">The percentile level used (e.g. 95).</param>
/// <param name="Kind">Reference kind.</param>
public sealed record ParallelAnalysisReference(
    double[] Mean, double[] Percentile, double[]? ReducedMean, double[]? ReducedPercentile,
    int Replicates, double PercentileLevel, ReferenceKind Kind)
{
    /// <summary>Permutation reference: respondents shuffled in every replicate (all of them, or the seeded
    /// subsample when there were more than <see cref="ParallelAnalysisOptions.PermutationMaxRows"/>); null for the
    /// normal reference.</summary>
    public int? PermutedRespondents { get; init; }

    /// <summary>True when the permutation reference used a seeded random subsample of the respondents.</summary>
    public bool Subsampled { get; init; }
}

/// <summary>
/// Parallel analysis: Horn (1965), "A rationale and test for the number of factors in factor analysis",
/// Psychometrika 30(2), 179–185 — retain the leading components whose observed eigenvalues exceed those of
/// random data of the same size. Threshold at a percentile rather than the mean: Glorfeld (1995), "An
/// improvement on Horn's parallel analysis methodology for selecting the correct number of factors to retain",
/// Educational and Psychological Measurement 55(3), 377–393. Permutation reference: Buja &amp; Eyuboglu (1992),
/// "Remarks on parallel analysis", Multivariate Behavioral Research 27(4), 509–540. Reduced-matrix (factor
/// analytic) variant: the same comparison with squared multiple correlations on the diagonal
/// (<see cref="SquaredMultipleCorrelation"/>), as discussed by Humphreys &amp; Ilgen (1969), EPM 29, 571–578.
/// <para>
/// Normal reference without simulating data: each replicate draws the correlation matrix of n normal
/// p-vectors directly (<see cref="BartlettWishartSampler"/>), O(p³) per replicate independent of n.
/// Replicate r always uses <c>RandomStream.ForTask(seed, r, purpose)</c> and writes its own slot, so
/// results are identical for any number of threads.
/// </para>
/// </summary>
public static class ParallelAnalysis
{
    internal const ulong NormalPurpose = 0x4E4F524D;      // "NORM"
    internal const ulong PermutationPurpose = 0x5045524D; // "PERM"
    internal const ulong BruteForcePurpose = 0x42525554;  // "BRUT"
    internal const ulong SubsamplePurpose = 0x50535542;   // "PSUB"
    internal const ulong OrdinalPurpose = 0x4F524449;     // "ORDI"

    /// <summary>Normal-reference eigenvalues for <paramref name="respondents"/> × <paramref name="items"/> data.</summary>
    /// <exception cref="ArgumentException">items &lt; 1, respondents ≤ items, or invalid options.</exception>
    public static ParallelAnalysisReference NormalReference(int respondents, int items, ParallelAnalysisOptions options)
    {
        ArgumentNullException.ThrowIfNull(options);
        options.Validate();
        if (items < 1) throw new ArgumentException($"items must be ≥ 1, got {items}.", nameof(items));
        if (respondents <= items)
            throw new DataConditionException($"The normal reference needs more respondents than items; got n = {respondents}, p = {items}.", nameof(respondents));
        int p = items, df = respondents - 1;
        return Run(p, options with { Reference = ReferenceKind.Normal }, NormalPurpose, () => new double[p * p],
            (rng, scratch, r) => BartlettWishartSampler.SampleCorrelationInto(p, df, rng, scratch, r), SmcFromBartlettFactor);
    }

    /// <summary>Ordinal-reference eigenvalues (<see cref="ReferenceKind.Ordinal"/>) for <paramref name="respondents"/>
    /// respondents and items with the information factors <paramref name="information"/>
    /// (<see cref="PolychoricNullDistribution.InformationFactors"/>).</summary>
    /// <exception cref="ArgumentException">No items, a factor outside (0, 1], respondents ≤ items, or invalid options.</exception>
    public static ParallelAnalysisReference OrdinalReference(int respondents, IReadOnlyList<double> information, ParallelAnalysisOptions options)
    {
        ArgumentNullException.ThrowIfNull(information);
        ArgumentNullException.ThrowIfNull(options);
        options.Validate();
        int p = information.Count;
        if (p < 1) throw new ArgumentException("At least one item is needed.", nameof(information));
        if (information.Any(x => !(x > 0 && x <= 1)))
            throw new ArgumentException("Information factors must lie in (0, 1].", nameof(information));
        if (respondents <= p)
            throw new DataConditionException($"The ordinal reference needs more respondents than items; got n = {respondents}, p = {p}.", nameof(respondents));
        int df = respondents - 1;
        var inverseRoot = information.Select(x => 1 / Math.Sqrt(x)).ToArray();
        return Run(p, options with { Reference = ReferenceKind.Ordinal }, OrdinalPurpose, () => new double[p * p],
            (rng, scratch, r) => PolychoricNullDistribution.SampleInto(p, df, inverseRoot, rng, scratch, r));
    }

    /// <summary>Permutation-reference eigenvalues for data correlated as <paramref name="correlation"/> says: the
    /// replicates of <see cref="PermutationReplicates"/> where they apply (compact integer answers), otherwise the plain
    /// implementation below. Both shuffle the same way, so they describe the same permuted data sets.</summary>
    internal static ParallelAnalysisReference PermutationReference(
        ResponseMatrix data, CorrelationOptions correlation, ParallelAnalysisOptions options)
    {
        ArgumentNullException.ThrowIfNull(correlation);
        options.Validate();
        var (sample, subsampled) = PermutationSample(data, options);
        var replicates = PermutationReplicates.TryCreate(sample, correlation);
        if (replicates is null) return PermutationReference(data, d => correlation.Compute(d, 1), options);
        int p = sample.ItemCount;
        // Workers (one n × p byte copy each) are lent to one replicate at a time; with at most one replicate per core at
        // once, no more than that many are ever made, however many threads the pool adds.
        var workers = new System.Collections.Concurrent.ConcurrentBag<PermutationReplicates.Worker>();
        var draw = CountDraws(options, (rng, _, r) =>
        {
            if (!workers.TryTake(out var worker)) worker = replicates.NewWorker();
            replicates.Draw(worker, rng, r);
            workers.Add(worker);
        });
        var reference = Run(p, options with { Reference = ReferenceKind.Permutation, ReplicatesDone = null, MaxDegreeOfParallelism = Workers(options) },
            PermutationPurpose, () => [], draw);
        return reference with { PermutedRespondents = sample.RespondentCount, Subsampled = subsampled };
    }

    /// <summary>Permutation-reference eigenvalues, plain implementation: every replicate shuffles each item's answers
    /// independently (missing answers move with them) into a per-thread copy and recomputes the correlation matrix with
    /// <paramref name="correlate"/>, which is called from several threads at once and must be single-threaded and
    /// side-effect free.</summary>
    internal static ParallelAnalysisReference PermutationReference(
        ResponseMatrix data, Func<ResponseMatrix, double[,]> correlate, ParallelAnalysisOptions options)
    {
        options.Validate();
        (data, bool subsampled) = PermutationSample(data, options);
        int n = data.RespondentCount;
        var quiet = options with { ReplicatesDone = null, MaxDegreeOfParallelism = Workers(options) };
        var reference = data.IsCompact ? PermuteCodes(data, correlate, quiet, options) : PermuteValues(data, correlate, quiet, options);
        return reference with { PermutedRespondents = n, Subsampled = subsampled };
    }

    /// <summary>Replicates run at once by the permutation reference, each with its own copy of the data: the thread cap,
    /// or the number of cores (not more, which the thread pool may otherwise reach when replicates take long).</summary>
    private static int Workers(ParallelAnalysisOptions options)
        => options.MaxDegreeOfParallelism == -1 ? Environment.ProcessorCount : options.MaxDegreeOfParallelism;

    /// <summary>The respondents the permutation replicates shuffle: all of them, or the seeded subsample above
    /// <see cref="ParallelAnalysisOptions.PermutationMaxRows"/>.</summary>
    private static (ResponseMatrix Data, bool Subsampled) PermutationSample(ResponseMatrix data, ParallelAnalysisOptions options)
    {
        int all = data.RespondentCount;
        bool subsampled = all > options.PermutationMaxRows;
        return (subsampled ? data.SelectRespondents(SubsampleRows(all, options.PermutationMaxRows, options.Seed)) : data, subsampled);
    }

    /// <summary>Progress of the permutation replicates, whose correlation matrices are the slow part: "0 done" at once,
    /// then every hundredth of the replicates as their matrices are drawn (so a view shows movement from the first
    /// second even when one replicate takes long). Reporting does not touch the random streams.</summary>
    private static Action<RandomStream, double[], double[]> CountDraws(ParallelAnalysisOptions options, Action<RandomStream, double[], double[]> draw)
    {
        if (options.ReplicatesDone is not { } report) return draw;
        report(0);
        int drawn = 0, step = Math.Max(1, options.Replicates / 100);
        return (rng, scratch, r) =>
        {
            draw(rng, scratch, r);
            int k = Interlocked.Increment(ref drawn);
            if (k % step == 0 || k == options.Replicates) report(k);
        };
    }

    /// <summary>Permutation replicates of compact data: the byte codes are shuffled (the same permutations as
    /// <see cref="PermuteValues"/> would apply, since each column is shuffled by the same stream), so every
    /// replicate is itself compact and is correlated by the fast exact path.</summary>
    private static ParallelAnalysisReference PermuteCodes(ResponseMatrix data, Func<ResponseMatrix, double[,]> correlate,
        ParallelAnalysisOptions options, ParallelAnalysisOptions progress)
    {
        int n = data.RespondentCount, p = data.ItemCount;
        var columns = new byte[p][];
        for (int j = 0; j < p; j++) columns[j] = data.ColumnCodes(j);
        using var codes = new ThreadLocal<byte[]>(() => new byte[(long)n * p]);
        using var shuffledColumn = new ThreadLocal<byte[]>(() => new byte[n]);
        return Run(p, options with { Reference = ReferenceKind.Permutation }, PermutationPurpose, () => [],
            CountDraws(progress, (rng, _, r) =>
            {
                var buffer = codes.Value!;
                var shuffled = shuffledColumn.Value!;
                for (int j = 0; j < p; j++)
                {
                    columns[j].CopyTo(shuffled, 0);
                    rng.Shuffle(shuffled.AsSpan());
                    for (int i = 0; i < n; i++) buffer[(long)i * p + j] = shuffled[i];
                }
                var c = correlate(data.WithCodes(buffer));
                Buffer.BlockCopy(c, 0, r, 0, p * p * sizeof(double));
            }));
    }

    /// <summary>Permutation replicates of dense data: shuffled doubles in a per-worker buffer.</summary>
    private static ParallelAnalysisReference PermuteValues(ResponseMatrix data, Func<ResponseMatrix, double[,]> correlate,
        ParallelAnalysisOptions options, ParallelAnalysisOptions progress)
    {
        int n = data.RespondentCount, p = data.ItemCount;
        var columns = new double[p][];
        for (int j = 0; j < p; j++) columns[j] = data.Column(j);
        return Run(p, options with { Reference = ReferenceKind.Permutation }, PermutationPurpose, () => new double[(long)n * p],
            CountDraws(progress, (rng, buffer, r) =>
            {
                var shuffled = new double[n];
                for (int j = 0; j < p; j++)
                {
                    columns[j].CopyTo(shuffled, 0);
                    rng.Shuffle(shuffled.AsSpan());
                    for (int i = 0; i < n; i++) buffer[(long)i * p + j] = shuffled[i];
                }
                var c = correlate(data.WithValues(buffer));
                Buffer.BlockCopy(c, 0, r, 0, p * p * sizeof(double));
            }));
    }

    /// <summary>A seeded random subset of <paramref name="count"/> of the rows 0 .. n − 1, in ascending order.</summary>
    internal static int[] SubsampleRows(int n, int count, ulong seed)
    {
        var rows = new int[n];
        for (int i = 0; i < n; i++) rows[i] = i;
        RandomStream.ForTask(seed, 0, SubsamplePurpose).Shuffle(rows.AsSpan());
        var chosen = rows[..count];
        Array.Sort(chosen);
        return chosen;
    }

    /// <summary>
    /// Normal reference the slow way, for validation and benchmarks: simulate n × p standard-normal data,
    /// correlate (complete-data Pearson fast path), eigenvalues. O(n p²) per replicate.
    /// </summary>
    internal static ParallelAnalysisReference BruteForceNormalReference(int respondents, int items, ParallelAnalysisOptions options)
    {
        options.Validate();
        int n = respondents, p = items;
        return Run(p, options with { Reference = ReferenceKind.Normal }, BruteForcePurpose, () => new double[(long)n * p],
            (rng, x, r) => BruteForceReplicate(n, p, rng, x, r));
    }

    /// <summary>One brute-force replicate: fill <paramref name="x"/> with N(0,1) draws, correlate into <paramref name="r"/>.</summary>
    internal static void BruteForceReplicate(int n, int p, RandomStream rng, double[] x, double[] r)
    {
        for (long k = 0; k < x.Length; k++) x[k] = rng.NextGaussian();
        var c = PearsonCorrelation.Complete(x, n, p, 1);
        Buffer.BlockCopy(c, 0, r, 0, p * p * sizeof(double));
    }

    /// <summary>Number of leading observed eigenvalues that exceed the reference, stopping at the first that
    /// does not (Horn's rule applied sequentially).</summary>
    public static int RetainedCount(IReadOnlyList<double> observed, IReadOnlyList<double> reference)
    {
        ArgumentNullException.ThrowIfNull(observed);
        ArgumentNullException.ThrowIfNull(reference);
        int m = Math.Min(observed.Count, reference.Count), c = 0;
        while (c < m && observed[c] > reference[c]) c++;
        return c;
    }

    /// <summary>Shared replicate loop: draw a reference correlation matrix (row-major, full) per replicate,
    /// take its eigenvalues (and those of its reduced version), then summarise per component. The optional
    /// <c>smcFromDraw</c> computes the SMCs of the drawn matrix from what the draw left in the scratch array (instead of
    /// a Cholesky factorisation of the drawn matrix).</summary>
    private static ParallelAnalysisReference Run(
        int p, ParallelAnalysisOptions options, ulong purpose, Func<double[]> newScratch,
        Action<RandomStream, double[], double[]> draw, Func<ReplicateBuffers, int, double[]>? smcFromDraw = null)
    {
        int reps = options.Replicates;
        bool reduced = options.IncludeReducedMatrix;
        var eig = new double[reps][];
        var eigReduced = reduced ? new double[reps][] : null;
        var po = new ParallelOptions { MaxDegreeOfParallelism = options.MaxDegreeOfParallelism };
        int done = 0, step = Math.Max(1, reps / 10);
        Parallel.For(0, reps, po, () => new ReplicateBuffers(p, newScratch()), [MethodImpl(MethodImplOptions.AggressiveOptimization)] (rep, _, b) =>
        {
            var rng = RandomStream.ForTask(options.Seed, rep, purpose);
            draw(rng, b.Scratch, b.R);
            if (eigReduced is not null)
            {
                var smc = smcFromDraw is null ? ReferenceSmc(b, p) : smcFromDraw(b, p);
                Array.Copy(b.R, b.Reduced, b.R.Length);
                for (int j = 0; j < p; j++) b.Reduced[j * p + j] = smc[j];
                eigReduced[rep] = (double[])SymmetricEigensolver.EigenvaluesInPlace(b.Reduced, p, b.D, b.E, b.Tri).Clone();
            }
            eig[rep] = (double[])SymmetricEigensolver.EigenvaluesInPlace(b.R, p, b.D, b.E, b.Tri).Clone();
            int finished = Interlocked.Increment(ref done);
            if (options.ReplicatesDone is { } report && finished % step == 0) report(finished);
            return b;
        }, _ => { });
        var (mean, pct) = Summarise(eig, p, options.Percentile);
        double[]? rMean = null, rPct = null;
        if (eigReduced is not null) (rMean, rPct) = Summarise(eigReduced, p, options.Percentile);
        return new ParallelAnalysisReference(mean, pct, rMean, rPct, reps, options.Percentile, options.Reference);
    }

    /// <summary>SMCs of a normal-reference draw R = D^{−1/2} W D^{−1/2} from its Bartlett factor L (W = L Lᵀ, left in the
    /// scratch array by <see cref="BartlettWishartSampler.SampleCorrelationInto(int, int, RandomStream, double[], double[])"/>):
    /// L is already the Cholesky factor of W, so (R⁻¹)_jj = W_jj (W⁻¹)_jj with W_jj = Σ_k L_jk² and (W⁻¹)_jj the squared
    /// norm of column j of L⁻¹ — the factorisation of R is skipped. Equal to <see cref="ReferenceSmc"/> up to rounding
    /// (a rescaling of a positive definite matrix rescales its inverse).</summary>
    private static double[] SmcFromBartlettFactor(ReplicateBuffers b, int p) => SmcFromBartlettFactor(b.Scratch, p, b.Work, b.Smc);

    /// <summary>Kernel of <see cref="SmcFromBartlettFactor(ReplicateBuffers, int)"/>: <paramref name="l"/> is the Bartlett
    /// factor (row-major, lower), <paramref name="work"/> (p × p) scratch, the SMCs are written to <paramref name="result"/>.</summary>
    internal static double[] SmcFromBartlettFactor(double[] l, int p, double[] work, double[] result)
    {
        var inverseDiagonal = CholeskyDecomposition.InverseDiagonalFromFactor(l, p, work, result);
        for (int j = 0; j < p; j++)
        {
            double wjj = VectorKernels.Dot(l.AsSpan(j * p, j + 1), l.AsSpan(j * p, j + 1));
            inverseDiagonal[j] = 1 - 1 / (wjj * inverseDiagonal[j]);
        }
        return inverseDiagonal;
    }

    /// <summary>SMCs of a reference matrix; a matrix that is not positive definite (possible with pairwise
    /// deletion in permuted data) is first replaced by its nearest correlation matrix.</summary>
    private static double[] ReferenceSmc(ReplicateBuffers b, int p)
    {
        Array.Copy(b.R, b.Work, b.R.Length);
        try
        {
            return SquaredMultipleCorrelation.FromRowMajor(b.Work, p, b.Reduced, b.Smc);
        }
        catch (MatrixNotPositiveDefiniteException)
        {
            var smoothed = NearestCorrelationMatrix.Find(MatrixChecks.FromRowMajor(b.R, p)).Matrix;
            return SquaredMultipleCorrelation.Compute(smoothed);
        }
    }

    private sealed class ReplicateBuffers(int p, double[] scratch)
    {
        public double[] Scratch { get; } = scratch;
        public double[] R { get; } = new double[p * p];
        public double[] Work { get; } = new double[p * p];
        public double[] Reduced { get; } = new double[p * p];
        public double[] Smc { get; } = new double[p];
        public double[] D { get; } = new double[p];
        public double[] E { get; } = new double[p];
        public double[] Tri { get; } = new double[SymmetricEigensolver.EigenvaluesWorkLength(p)];
    }

    /// <summary>Per-component mean and percentile over replicates.</summary>
    internal static (double[] Mean, double[] Percentile) Summarise(double[][] eig, int p, double percentile)
    {
        int reps = eig.Length;
        var mean = new double[p];
        var pct = new double[p];
        var column = new double[reps];
        for (int c = 0; c < p; c++)
        {
            double s = 0;
            for (int r = 0; r < reps; r++) { column[r] = eig[r][c]; s += column[r]; }
            mean[c] = s / reps;
            Array.Sort(column);
            pct[c] = Quantile(column, percentile / 100);
        }
        return (mean, pct);
    }

    /// <summary>Sample quantile of sorted data, linear interpolation between order statistics: Hyndman &amp;
    /// Fan (1996), "Sample quantiles in statistical packages", The American Statistician 50(4), 361–365, type 7.</summary>
    internal static double Quantile(double[] sorted, double q)
    {
        double h = (sorted.Length - 1) * q;
        int lo = (int)Math.Floor(h);
        int hi = Math.Min(lo + 1, sorted.Length - 1);
        return sorted[lo] + (h - lo) * (sorted[hi] - sorted[lo]);
    }
}
