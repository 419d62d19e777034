using System.Runtime.CompilerServices;
using ItemReduce.Core.Randomness;

namespace ItemReduce.Core.Screening;

/// <summary>Settings of <see cref="FastMcd"/>; defaults follow Rousseeuw &amp; Van Driessen (1999).</summary>
/// <param name="SupportSize">h, the number of rows whose covariance determinant is minimised; null means
/// <c>⌊(n + p + 1) / 2⌋</c> (highest breakdown point). Range p + 1 ≤ h ≤ n.</param>
/// <param name="InitialSubsets">Random (p + 1)-subsets started from in total (paper: 500).</param>
/// <param name="SubsetSize">Size of each subset in the nested extension (paper: 300).</param>
/// <param name="MaxSubsets">Maximum number of subsets; the merged set has at most MaxSubsets × SubsetSize rows (paper: 5, 1,500).</param>
/// <param name="BestPerStage">Candidates kept after each stage (paper: 10).</param>
/// <param name="MaxCSteps">Cap on C-steps while iterating a candidate to convergence.</param>
/// <param name="Seed">Seed of every random choice.</param>
internal sealed record FastMcdSettings(
    int? SupportSize = null,
    int InitialSubsets = 500,
    int SubsetSize = 300,
    int MaxSubsets = 5,
    int BestPerStage = 10,
    int MaxCSteps = 100,
    ulong Seed = Randomness.RandomStream.DefaultSeed);

/// <summary>Result of <see cref="FastMcd.Fit"/>. Matrices are p × p; all scatter matrices are symmetric.</summary>
/// <param name="RawLocation">Mean of the best h-subset.</param>
/// <param name="RawScatter">Covariance of the best h-subset (divided by h) times <paramref name="ConsistencyFactor"/>.</param>
/// <param name="RawLogDeterminant">ln det of the h-subset covariance before the consistency factor.</param>
/// <param name="ConsistencyFactor">median(raw D²) / χ²_p median.</param>
/// <param name="Location">Reweighted location: mean of the rows with corrected raw D² ≤ χ²_p(0.975).</param>
/// <param name="Scatter">Reweighted scatter: covariance of those rows (n_w − 1 normaliser) times <paramref name="ReweightingFactor"/>.</param>
/// <param name="ReweightingFactor">0.975 / F_χ²(p+2)(χ²_p(0.975)), the normal-theory factor for a covariance truncated at that quantile.</param>
/// <param name="SupportSize">h.</param>
/// <param name="ReweightedCount">Rows kept by the reweighting step.</param>
/// <param name="Nested">True when the nested (subsample-and-merge) extension was used.</param>
/// <param name="SubsetCount">Subsets in the nested extension (1 when not nested).</param>
/// <param name="MergedSize">Rows in the merged set (n when not nested).</param>
/// <param name="Trials">Random initial subsets drawn.</param>
/// <param name="Converged">False when a candidate hit <see cref="FastMcdSettings.MaxCSteps"/>.</param>
internal sealed record FastMcdEstimate(
    double[] RawLocation,
    double[,] RawScatter,
    double RawLogDeterminant,
    double ConsistencyFactor,
    double[] Location,
    double[,] Scatter,
    double ReweightingFactor,
    int SupportSize,
    int ReweightedCount,
    bool Nested,
    int SubsetCount,
    int MergedSize,
    int Trials,
    bool Converged);

/// <summary>
/// Thrown when more than h rows lie on a hyperplane, so the minimum covariance determinant is 0 and the
/// robust scatter is singular (the "exact fit" situation of the paper, Section 3). Typical for ordinal data in
/// which more than half the respondents give the same answer to some item.
/// </summary>
internal sealed class FastMcdExactFitException(string message) : Exception(message);

/// <summary>
/// FAST-MCD: the minimum covariance determinant estimator of location and scatter computed with the algorithm of
/// Rousseeuw, P. J., &amp; Van Driessen, K. (1999), "A fast algorithm for the minimum covariance determinant
/// estimator", Technometrics 41(3), 212–223.
/// Steps, following the paper: random (p + 1)-subsets extended until non-singular (Section 3, step 2a);
/// C-steps (Theorem 1: the determinant never increases); two C-steps per start, keep the 10 best, iterate them to
/// convergence (selective iteration); for n &gt; 2 × 300 the nested extension (Section 3.3): up to 5 disjoint random
/// subsets of 300 rows, their union as the merged set (≤ 1,500 rows), the 10 best per subset refined on the merged
/// set, the 10 best of those given two C-steps on the full data and the best of them iterated to convergence. Then the consistency factor median(D²) / χ²_p(0.5)
/// (the small-sample correction factor of Pison, Van Aelst &amp; Willems, 2002, is NOT applied) and one-step
/// reweighting with weights 1{D² ≤ χ²_p(0.975)}; the reweighted covariance is scaled by the normal-theory factor
/// 0.975 / F_χ²(p+2)(χ²_p(0.975)) (Croux, C., &amp; Haesbroeck, G., 1999, "Influence function and efficiency of
/// the minimum covariance determinant scatter matrix estimator", Journal of Multivariate Analysis 71(2),
/// 161–190), so that reweighted distances are χ²_p-calibrated under normality.
/// Each random start draws from its own <see cref="RandomStream.ForTask"/> stream, so results do not depend on the
/// thread count. Input rows must be complete (no NaN).
/// </summary>
internal static class FastMcd
{
    private const ulong PurposeStart = 0x4D4344_01;
    private const ulong PurposeSplit = 0x4D4344_02;
    private const double ConvergenceTolerance = 1e-12;

    private sealed class Candidate(double[] mean, double[] cov, ScreeningCholesky factor, int[] support)
    {
        public double[] Mean { get; } = mean;
        public double[] Cov { get; } = cov;
        public ScreeningCholesky Factor { get; } = factor;
        public int[] Support { get; } = support; // row numbers in the full data, sorted
        public double LogDet => Factor.LogDeterminant;
    }

    /// <summary>Fits FAST-MCD to the complete row-major <paramref name="x"/> (n × p).</summary>
    public static FastMcdEstimate Fit(double[] x, int n, int p, FastMcdSettings settings)
    {
        ArgumentNullException.ThrowIfNull(x);
        ArgumentNullException.ThrowIfNull(settings);
        if (p < 1) throw new ArgumentException($"FAST-MCD needs at least 1 item, got {p}.", nameof(p));
        if (n < p + 2) throw new ArgumentException($"FAST-MCD needs at least p + 2 = {p + 2} complete rows, got {n}.", nameof(n));
        if (x.Length != (long)n * p) throw new ArgumentException($"Expected {n}×{p} values, got {x.Length}.", nameof(x));
        int h = settings.SupportSize ?? (n + p + 1) / 2;
        if (h < p + 1 || h > n) throw new ArgumentException($"Support size h = {h} must lie in [{p + 1}, {n}].", nameof(settings));
        if (settings.InitialSubsets < 1 || settings.SubsetSize < p + 2 || settings.MaxSubsets < 1 || settings.BestPerStage < 1 || settings.MaxCSteps < 1)
            throw new ArgumentException("FAST-MCD settings out of range: InitialSubsets ≥ 1, SubsetSize ≥ p + 2, MaxSubsets ≥ 1, BestPerStage ≥ 1, MaxCSteps ≥ 1.", nameof(settings));

        var all = Enumerable.Range(0, n).ToArray();
        bool converged = true, nested = false;
        int subsetCount = 1, mergedSize = n, trials = 0;
        Candidate best;
        if (h == n)
        {
            best = FromSupport(x, p, all) ?? throw ExactFit(h);
        }
        else if (n <= 2 * settings.SubsetSize)
        {
            trials = settings.InitialSubsets;
            var starts = Starts(x, p, all, h, trials, 0, settings.Seed);
            best = Refine(x, p, all, h, KeepBest(starts, settings.BestPerStage), settings.MaxCSteps, true, ref converged);
        }
        else
        {
            nested = true;
            (best, subsetCount, mergedSize, trials) = Nested(x, n, p, h, settings, all, ref converged);
        }

        // Consistency factor: median(D²) / χ²_p(0.5), applied to the raw covariance and distances.
        var rawD2 = Distances(x, p, all, best);
        double median = Median(rawD2);
        double chiMedian = ChiSquareTail.UpperQuantile(0.5, p);
        double consistency = median / chiMedian;
        if (!(consistency > 0)) throw ExactFit(h);
        var rawScatter = ToSquare(best.Cov, p, consistency);

        // One-step reweighting: weight 1 when corrected D² ≤ χ²_p(0.975).
        double limit = ChiSquareTail.UpperQuantile(0.025, p);
        var kept = new List<int>();
        for (int i = 0; i < n; i++) if (rawD2[i] / consistency <= limit) kept.Add(i);
        var (rwMean, rwCov) = RowMoments.MeanCovariance(x, p, kept.ToArray(), kept.Count - 1);
        double reweighting = 0.975 / ChiSquareTail.Cdf(limit, p + 2);
        var scatter = ToSquare(rwCov, p, reweighting);

        return new FastMcdEstimate(best.Mean, rawScatter, best.LogDet, consistency, rwMean, scatter, reweighting,
            h, kept.Count, nested, subsetCount, mergedSize, trials, converged);
    }

    /// <summary>Section 3.3: split, refine on the merged set, refine on the full data.</summary>
    private static (Candidate Best, int Subsets, int Merged, int Trials) Nested(
        double[] x, int n, int p, int h, FastMcdSettings s, int[] all, ref bool converged)
    {
        int k = Math.Max(1, Math.Min(s.MaxSubsets, n / s.SubsetSize));
        int merged = Math.Min(n, k * s.SubsetSize);
        var perm = (int[])all.Clone();
        RandomStream.ForTask(s.Seed, 0, PurposeSplit).Shuffle(perm.AsSpan());
        var mergedRows = perm[..merged];
        Array.Sort(mergedRows);
        int perSubset = (s.InitialSubsets + k - 1) / k;
        var pooled = new List<Candidate>();
        for (int g = 0; g < k; g++)
        {
            int lo = g * merged / k, hi = (g + 1) * merged / k;
            var rows = perm[lo..hi];
            Array.Sort(rows);
            int hSub = (int)Math.Ceiling(rows.Length * (double)h / n);
            hSub = Math.Clamp(hSub, p + 1, rows.Length);
            pooled.AddRange(KeepBest(Starts(x, p, rows, hSub, perSubset, g, s.Seed), s.BestPerStage));
        }
        int hMerged = Math.Clamp((int)Math.Ceiling(merged * (double)h / n), p + 1, merged);
        var onMerged = pooled.Select(c => CSteps(x, p, mergedRows, hMerged, c, 2)).ToList();
        var bestMerged = KeepBest(onMerged, s.BestPerStage);
        var best = Refine(x, p, all, h, bestMerged, s.MaxCSteps, merged == n, ref converged);
        return (best, k, merged, perSubset * k);
    }

    /// <summary>Random (p + 1)-subset starts, each followed by two C-steps (paper, steps 2a–2b).</summary>
    private static List<Candidate> Starts(double[] x, int p, int[] rows, int h, int count, int group, ulong seed)
    {
        var result = new Candidate?[count];
        ParallelFor(count, t =>
        {
            var rng = RandomStream.ForTask(seed, (long)group * 1_000_000 + t, PurposeStart);
            var start = InitialCandidate(x, p, rows, h, rng);
            result[t] = CSteps(x, p, rows, h, start, 2);
        });
        return result.Select(c => c!).ToList();
    }

    /// <summary>
    /// Step 2a: a random (p + 1)-subset J; while its covariance is singular, add random rows. Then the h rows with
    /// the smallest distances from (mean_J, cov_J) form H₁.
    /// </summary>
    private static Candidate InitialCandidate(double[] x, int p, int[] rows, int h, RandomStream rng)
    {
        var order = (int[])rows.Clone();
        int size = p + 1;
        for (int i = 0; i < size; i++) Swap(order, i, i + rng.NextInt(order.Length - i));
        Candidate? c = FromSupport(x, p, order[..size]);
        while (c is null)
        {
            if (size >= h) throw ExactFit(h);
            Swap(order, size, size + rng.NextInt(order.Length - size));
            size++;
            c = FromSupport(x, p, order[..size]);
        }
        return SmallestH(x, p, rows, h, c) ?? throw ExactFit(h);
    }

    /// <summary><paramref name="steps"/> C-steps on <paramref name="rows"/> starting from <paramref name="c"/>.</summary>
    private static Candidate CSteps(double[] x, int p, int[] rows, int h, Candidate c, int steps)
    {
        for (int s = 0; s < steps; s++) c = SmallestH(x, p, rows, h, c) ?? throw ExactFit(h);
        return c;
    }

    /// <summary>
    /// Selective iteration on <paramref name="rows"/>. With <paramref name="iterateAll"/> every candidate is iterated
    /// with C-steps until the determinant stops decreasing (Theorem 1) or the support repeats, and the lowest
    /// determinant wins (paper, small n). Otherwise (full data after the nested stages, where one C-step costs a pass
    /// over all rows) each candidate gets two C-steps and only the best is iterated to convergence.
    /// </summary>
    private static Candidate Refine(double[] x, int p, int[] rows, int h, List<Candidate> candidates, int maxSteps, bool iterateAll, ref bool converged)
    {
        var done = new Candidate[candidates.Count];
        var ok = new bool[candidates.Count];
        if (iterateAll)
        {
            ParallelFor(candidates.Count, i => (done[i], ok[i]) = Converge(x, p, rows, h, candidates[i], maxSteps));
            if (ok.Contains(false)) converged = false;
            return KeepBest(done.ToList(), 1)[0];
        }
        ParallelFor(candidates.Count, i => done[i] = CSteps(x, p, rows, h, candidates[i], 2));
        var (best, fine) = Converge(x, p, rows, h, KeepBest(done.ToList(), 1)[0], maxSteps);
        if (!fine) converged = false;
        return best;
    }

    private static (Candidate Best, bool Converged) Converge(double[] x, int p, int[] rows, int h, Candidate c, int maxSteps)
    {
        var best = SmallestH(x, p, rows, h, c) ?? throw ExactFit(h);
        for (int step = 1; step < maxSteps; step++)
        {
            var next = SmallestH(x, p, rows, h, best) ?? throw ExactFit(h);
            bool same = next.Support.AsSpan().SequenceEqual(best.Support);
            bool flat = next.LogDet >= best.LogDet - ConvergenceTolerance * Math.Max(1, Math.Abs(best.LogDet));
            if (next.LogDet <= best.LogDet) best = next;
            if (same || flat) return (best, true);
        }
        return (best, false);
    }

    /// <summary>C-step: the h rows of <paramref name="rows"/> nearest to (mean, cov) of <paramref name="c"/>, and their mean and covariance.</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private static Candidate? SmallestH(double[] x, int p, int[] rows, int h, Candidate c)
    {
        var d = Distances(x, p, rows, c);
        // The h-th smallest distance by selection (no full sort); rows below it are chosen, ties at it are broken by row number.
        double cutoff = Select((double[])d.Clone(), h - 1);
        var chosen = new List<int>(h);
        var tied = new List<int>();
        for (int i = 0; i < d.Length; i++)
        {
            if (d[i] < cutoff) chosen.Add(rows[i]);
            else if (d[i] == cutoff) tied.Add(rows[i]);
        }
        tied.Sort();
        chosen.AddRange(tied.Take(h - chosen.Count));
        var support = chosen.ToArray();
        Array.Sort(support);
        return FromSupport(x, p, support);
    }

    /// <summary>Mean and covariance (divided by the row count) of <paramref name="support"/>; null when singular.</summary>
    private static Candidate? FromSupport(double[] x, int p, int[] support)
    {
        var (mean, cov) = RowMoments.MeanCovariance(x, p, support, support.Length);
        var f = ScreeningCholesky.TryFactor(cov, p);
        return f is null ? null : new Candidate(mean, cov, f, support);
    }

    /// <summary>D² of each of <paramref name="rows"/> from the candidate's mean and covariance.</summary>
    private static double[] Distances(double[] x, int p, int[] rows, Candidate c)
    {
        var d = new double[rows.Length];
        // Large sets (the C-steps on all rows) are split into chunks computed in parallel; each row's distance depends
        // only on that row, so the result is the same as one sequential pass.
        const int chunk = 4096;
        if (rows.Length >= 2 * chunk)
            ParallelFor((rows.Length + chunk - 1) / chunk, b => DistancesOf(x, p, rows, c, d, b * chunk, Math.Min(rows.Length, (b + 1) * chunk)));
        else
            DistancesOf(x, p, rows, c, d, 0, rows.Length);
        return d;
    }

    /// <summary>Distances of rows[first..end) into d.</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private static void DistancesOf(double[] x, int p, int[] rows, Candidate c, double[] d, int first, int end)
    {
        const int lanes = ScreeningCholesky.Lanes;
        var diff = new double[p];
        var work = new double[p];
        var group = new double[p * lanes];
        var groupWork = new double[p * lanes];
        Span<double> forms = stackalloc double[lanes];
        var mean = c.Mean;
        var factor = c.Factor;
        int i = first;
        // Lanes rows at a time (bit-identical to the scalar form, see ScreeningCholesky.QuadraticForms), then the rest.
        for (; i + lanes <= end; i += lanes)
        {
            for (int k = 0; k < lanes; k++)
            {
                int o = rows[i + k] * p;
                for (int j = 0; j < p; j++) group[j * lanes + k] = x[o + j] - mean[j];
            }
            factor.QuadraticForms(group, groupWork, forms);
            for (int k = 0; k < lanes; k++) d[i + k] = forms[k];
        }
        for (; i < end; i++)
        {
            int o = rows[i] * p;
            for (int j = 0; j < p; j++) diff[j] = x[o + j] - mean[j];
            d[i] = factor.QuadraticForm(diff, work);
        }
    }

    /// <summary>The value of rank <paramref name="k"/> (0-based) of <paramref name="a"/> (reordered in place): Hoare's
    /// selection with median-of-three pivots; values must not be NaN.</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    internal static double Select(double[] a, int k)
    {
        int lo = 0, hi = a.Length - 1;
        while (lo < hi)
        {
            int mid = lo + (hi - lo) / 2;
            if (a[mid] < a[lo]) (a[mid], a[lo]) = (a[lo], a[mid]);
            if (a[hi] < a[lo]) (a[hi], a[lo]) = (a[lo], a[hi]);
            if (a[hi] < a[mid]) (a[hi], a[mid]) = (a[mid], a[hi]);
            double pivot = a[mid];
            int i = lo, j = hi;
            while (i <= j)
            {
                while (a[i] < pivot) i++;
                while (pivot < a[j]) j--;
                if (i <= j) { (a[i], a[j]) = (a[j], a[i]); i++; j--; }
            }
            if (k <= j) hi = j;
            else if (k >= i) lo = i;
            else return a[k];
        }
        return a[k];
    }

    private static List<Candidate> KeepBest(List<Candidate> candidates, int count) =>
        candidates.Select((c, i) => (c, i)).OrderBy(t => t.c.LogDet).ThenBy(t => t.i).Take(count).Select(t => t.c).ToList();

    private static double Median(double[] values)
    {
        var s = (double[])values.Clone();
        Array.Sort(s);
        int m = s.Length / 2;
        return s.Length % 2 == 1 ? s[m] : 0.5 * (s[m - 1] + s[m]);
    }

    private static double[,] ToSquare(double[] flat, int p, double factor)
    {
        var m = new double[p, p];
        for (int j = 0; j < p; j++)
            for (int k = 0; k < p; k++) m[j, k] = flat[j * p + k] * factor;
        return m;
    }

    /// <summary>Parallel loop that rethrows the first exception itself (not wrapped in an AggregateException).</summary>
    private static void ParallelFor(int count, Action<int> body)
    {
        try
        {
            Parallel.For(0, count, body);
        }
        catch (AggregateException e) when (e.InnerExceptions.Count > 0)
        {
            System.Runtime.ExceptionServices.ExceptionDispatchInfo.Capture(e.InnerExceptions[0]).Throw();
        }
    }

    private static void Swap(int[] a, int i, int j) => (a[i], a[j]) = (a[j], a[i]);

    private static FastMcdExactFitException ExactFit(int h) =>
        new($"At least h = {h} complete rows lie on a hyperplane, so the minimum covariance determinant is 0 and the robust scatter is singular.");
}
