using System.Runtime.CompilerServices;

namespace ItemReduce.Core.Screening;

/// <summary>Result of <see cref="ErAlgorithm.Fit"/>.</summary>
/// <param name="Location">Robust location μ (length p).</param>
/// <param name="Scatter">Robust scatter Σ (p × p), truncation-corrected.</param>
/// <param name="Rows">Rows the estimate was fitted to.</param>
/// <param name="Kept">Rows with weight 1 in the final step (distance within the rejection cutoff).</param>
/// <param name="KeptRows">Weight of each row (true = kept) in the final step.</param>
/// <param name="StartIterations">Steps (passes over the rows, extrapolated ones included) of the (non-robust) EM start.</param>
/// <param name="Iterations">Steps of the robust (ER) stages, staged and direct fits together.</param>
/// <param name="Converged">False when an iteration cap was reached or the chosen fit's last stage ended in a two-cycle of kept sets.</param>
/// <param name="TruncationFactor">Factor applied to the covariance of the kept rows.</param>
/// <param name="StagedCollapsed">True when the staged fit collapsed onto a cluster and the direct fit was used.</param>
internal sealed record ErEstimate(double[] Location, double[,] Scatter, int Rows, int Kept, bool[] KeptRows,
    int StartIterations, int Iterations, bool Converged, double TruncationFactor, bool StagedCollapsed);

/// <summary>
/// Robust location and scatter from incomplete data by the ER (expectation–robustification) approach of Little, R. J.
/// A., &amp; Smith, P. J. (1987), "Editing and imputation for quantitative survey data", Journal of the American
/// Statistical Association 82(397), 58–68: EM for the multivariate normal with missing values (Dempster, A. P.,
/// Laird, N. M., &amp; Rubin, D. B., 1977, "Maximum likelihood from incomplete data via the EM algorithm", JRSS B
/// 39(1), 1–38), in which every M-step is replaced by a weighted estimate whose weights depend on each row's squared
/// Mahalanobis distance on the items it answered. What is implemented here (our choices within that approach):
/// <list type="number">
/// <item>Start (deterministic, no random subsets): plain EM to convergence from the item means and the
/// pairwise-complete covariance.</item>
/// <item>Weights are 0 or 1 (hard rejection): a row is kept when its distance on its k answered items is within the
/// in-sample cutoff <see cref="BetaDistanceLaw.UpperQuantile"/>(α, k, N) for the N rows kept in the previous step.</item>
/// <item>E-step for a kept row with missing items M and answered items O: with Ω = Σ⁻¹ and y the centred row
/// (zeros at M), the conditional mean of the missing part is <c>z_M = −Ω_MM⁻¹ (Ω y)_M</c> and its conditional
/// covariance <c>Ω_MM⁻¹</c> (partitioned inverse; standard identities). The distance is <c>zᵀ Ω z</c> for the
/// filled vector z, which equals <c>y_Oᵀ Σ_OO⁻¹ y_O</c> (df = k).</item>
/// <item>M-step: mean and covariance (divisor N − 1) of the filled kept rows plus their conditional covariances,
/// the covariance multiplied by the normal-theory factor <c>(1 − α) / F_χ²(p+2)(χ²_p(1 − α))</c> for a
/// distribution truncated at that quantile (Croux, C., &amp; Haesbroeck, G., 1999, Journal of Multivariate Analysis
/// 71(2), 161–190).</item>
/// <item>Stop when the kept set repeats and the estimate changes by less than <see cref="Tolerance"/>
/// (<see cref="StageTolerance"/> for the wider stages, which only provide a start), or after 200 steps per stage.</item>
/// <item>Acceleration (changes the estimate only within the stopping rule's tolerance): the EM start and every ER stage
/// are iterated with the squared extrapolation of SQUAREM (Varadhan &amp; Roland 2008, see <see cref="Squarem"/>),
/// safeguarded by a positive definite extrapolated Σ, a log-likelihood not below the cycle's start (EM), and an
/// unchanged kept set (ER); otherwise the plain step is kept. When a stage's kept set alternates between two sets
/// (a two-cycle of the hard-weight map, found with missing answers; the plain iteration runs to its cap there), the
/// double step is iterated instead, and the stage ends, not converged, once the cycle repeats within its tolerance,
/// on the state the plain iteration would hold at its cap (see <c>Iterate</c>).</item>
/// </list>
/// Rows are processed in fixed blocks whose sums are added in block order, so the result does not depend on the
/// thread count.
/// </summary>
internal static class ErAlgorithm
{
    /// <summary>Rejection shares of the stages run before the requested one (each to convergence, from the previous).</summary>
    internal static readonly double[] StartRejection = [0.1, 0.025];

    /// <summary>Relative change of μ and Σ below which the EM start and the final stage stop.</summary>
    internal const double Tolerance = 1e-8;

    /// <summary>Relative change below which the wider stages before the final one stop (they only provide a start).</summary>
    internal const double StageTolerance = 1e-4;

    private const int BlockRows = 512;

    /// <summary>Fits the estimate to the row-major <paramref name="x"/> (n × p, NaN = missing).</summary>
    /// <param name="x">Row-major data, n × p; NaN = missing.</param>
    /// <param name="n">Rows.</param>
    /// <param name="p">Items.</param>
    /// <param name="rejectP">α: a row is set aside when its distance exceeds the upper-α in-sample quantile.</param>
    /// <param name="maxIterations">Cap on the EM and on the ER iterations (each).</param>
    /// <param name="reject">False: stop after the EM start (every row kept; the plain EM estimate).</param>
    /// <param name="accelerate">False: plain fixed-point steps without the SQUAREM extrapolation (for comparisons).</param>
    public static ErEstimate Fit(double[] x, int n, int p, double rejectP, int maxIterations = 200, bool reject = true, bool accelerate = true)
    {
        ArgumentNullException.ThrowIfNull(x);
        if (x.Length != (long)n * p) throw new ArgumentException($"Expected {n}×{p} values, got {x.Length}.", nameof(x));
        if (!(rejectP > 0 && rejectP < 0.5)) throw new ArgumentOutOfRangeException(nameof(rejectP), rejectP, "α must lie in (0, 0.5).");
        var (mean, cov) = PairwiseStart(x, n, p);
        var none = new double[p + 1];
        Array.Fill(none, double.PositiveInfinity);

        // 1. Plain EM (every row weight 1), accelerated by SQUAREM with the log-likelihood as the safeguard.
        var em = Iterate(new StepMap(x, n, p, none, 1, null), mean, cov, null, n, Tolerance, maxIterations, accelerate);
        if (em.Singular) throw new InvalidOperationException("EM start: the covariance matrix became singular.");
        (mean, cov) = (em.Mean, em.Cov);
        bool converged = em.Converged;
        int emIterations = em.Evaluations;
        if (!reject)
        {
            var all = new bool[n];
            Array.Fill(all, true);
            var plain = new double[p, p];
            for (int j = 0; j < p; j++)
                for (int k = 0; k < p; k++) plain[j, k] = cov[j * p + k];
            return new ErEstimate(mean, plain, n, n, all, emIterations, 0, converged, 1, false);
        }

        // 2. ER from the EM estimate, twice: (A) first at the wider rejection shares of StartRejection, each to
        //    convergence (a clean core that clusters of similar careless rows cannot mask), then at the requested α;
        //    (B) directly at α. A is used unless it keeps fewer than B's rows minus CollapseShare × n: then the
        //    narrow core has collapsed onto a dense cluster of tied answers (the exact-fit situation of ordinal
        //    data) and B is used.
        var staged = Stages(x, n, p, mean, cov, StartRejection.Where(a => a > rejectP).Append(rejectP), maxIterations, accelerate);
        var direct = Stages(x, n, p, mean, cov, [rejectP], maxIterations, accelerate);
        bool collapsed = staged.KeptCount < direct.KeptCount - CollapseShare * n;
        var chosen = collapsed ? direct : staged;
        var scatter = new double[p, p];
        for (int j = 0; j < p; j++)
            for (int k = 0; k < p; k++) scatter[j, k] = chosen.Cov[j * p + k];
        return new ErEstimate(chosen.Mean, scatter, n, chosen.KeptCount, chosen.Kept, emIterations, staged.Iterations + direct.Iterations,
            converged && chosen.Converged, chosen.Truncation, collapsed);
    }

    /// <summary>Share of rows by which the staged fit may keep fewer rows than the direct one before it counts as collapsed.</summary>
    internal const double CollapseShare = 0.2;

    private sealed record StageResult(double[] Mean, double[] Cov, bool[] Kept, int KeptCount, int Iterations, bool Converged, double Truncation);

    /// <summary>ER iterations at each rejection share in turn, each to convergence, starting from (mean, cov) with every row kept.</summary>
    private static StageResult Stages(double[] x, int n, int p, double[] mean, double[] cov, IEnumerable<double> alphas, int maxIterations,
        bool accelerate)
    {
        var kept = new bool[n];
        Array.Fill(kept, true);
        int keptCount = n, iterations = 0;
        bool converged = false;
        double truncation = 1;
        var cuts = new Dictionary<(double, int), double[]>();
        var list = alphas.ToList();
        for (int a = 0; a < list.Count; a++)
        {
            double alpha = list[a], tolerance = a == list.Count - 1 ? Tolerance : StageTolerance;
            truncation = TruncationFactor(alpha, p);
            var map = new StepMap(x, n, p, null, truncation, (alpha, cuts));
            var stage = Iterate(map, mean, cov, kept, keptCount, tolerance, maxIterations, accelerate);
            (mean, cov, kept, keptCount) = (stage.Mean, stage.Cov, stage.Kept!, stage.KeptCount);
            iterations += stage.Evaluations;
            converged = stage.Converged;
        }
        return new StageResult(mean, cov, kept, keptCount, iterations, converged, truncation);
    }

    /// <summary>Result of one step: the new μ and Σ, the rows kept, and the observed-data log-likelihood at the input
    /// over the kept rows (up to the constant; the EM objective when every row is kept).</summary>
    private sealed record StepResult(double[] Mean, double[] Cov, bool[] Kept, int KeptCount, double LogLikelihood);

    /// <summary>One E- and M-step as a map of (μ, Σ, kept set): plain EM (every row weight 1, fixed cutoffs) or ER at one
    /// rejection share (cutoffs for the input's kept count, cached per count).</summary>
    private sealed class StepMap(double[] x, int n, int p, double[]? fixedCut, double factor,
        (double Alpha, Dictionary<(double, int), double[]> Cache)? rejection)
    {
        public int Items => p;

        /// <summary>True for an ER stage (hard weights: the map is smooth only while the kept set stays the same).</summary>
        public bool Rejects => rejection is not null;

        public StepResult? Apply(double[] mean, double[] cov, bool[]? kept, int keptCount) =>
            Step(x, n, p, mean, cov, fixedCut ?? Cut(keptCount), factor, Rejects ? kept : null, keptCount);

        private double[] Cut(int keptCount)
        {
            var (alpha, cache) = rejection!.Value;
            if (cache.TryGetValue((alpha, keptCount), out var cut)) return cut;
            cut = new double[p + 1];
            cut[0] = double.NaN;
            for (int k = 1; k <= p; k++) cut[k] = BetaDistanceLaw.Applies(keptCount, k) || keptCount > BetaDistanceLaw.ChiSquareAbove
                ? BetaDistanceLaw.UpperQuantile(alpha, k, keptCount) : double.PositiveInfinity;
            cache[(alpha, keptCount)] = cut;
            return cut;
        }
    }

    /// <summary>Where <see cref="Iterate"/> stopped: the last estimate, the steps taken (passes over the rows), whether the
    /// stopping rule was met, and whether a step found Σ singular (the estimate before it is returned).</summary>
    private sealed record IterationOutcome(double[] Mean, double[] Cov, bool[]? Kept, int KeptCount, int Evaluations, bool Converged, bool Singular);

    /// <summary>
    /// Iterates <paramref name="map"/> from (μ, Σ, kept set) until a step keeps the same rows as its input and changes
    /// μ and Σ by less than <paramref name="tolerance"/> (<see cref="Change"/>), taking at most <paramref name="cap"/>
    /// steps (passes over the rows). With <paramref name="accelerate"/>:
    /// <list type="bullet">
    /// <item>Every two plain steps are followed by a <see cref="Squarem"/> extrapolation and one step from the
    /// extrapolated point, which replaces the second plain step only when (1) the kept set was the same in both plain
    /// steps and the step from the extrapolated point keeps it (hard weights make the map jump when it changes),
    /// (2) the extrapolated Σ passes <see cref="ScreeningCholesky"/>, and (3) for plain EM, the log-likelihood at the
    /// extrapolated point is not below that at the cycle's start (the paper's monotonicity safeguard); for an ER
    /// stage, which has no likelihood, the change made by the step from the extrapolated point is not larger than the
    /// first plain step's (our choice).</item>
    /// <item>When the kept set alternates between two sets A, B, A, B (a two-cycle of the hard-weight map, common with
    /// missing answers, where the plain iteration runs to its cap), the same is done for the double step; once a
    /// double step changes μ and Σ by less than the tolerance, the iteration stops, not converged, on the cycle state
    /// the plain iteration would hold at its cap (the parity of the cap), so the result is the plain iteration's to
    /// within the tolerance.</item>
    /// </list>
    /// Every result returned is the output of a plain step.
    /// </summary>
    private static IterationOutcome Iterate(StepMap map, double[] mean, double[] cov, bool[]? kept, int keptCount, double tolerance, int cap,
        bool accelerate = true)
    {
        int p = map.Items, evaluations = 0;
        Squarem squarem = new(), cycleSquarem = new();
        bool[]? target = null;   // in a two-cycle: the kept set of the state the plain iteration holds at its cap
        var state = new StepResult(mean, cov, kept ?? [], keptCount, double.NaN);
        // Kept sets of the last plain steps in a row (newest last), for spotting a two-cycle.
        var history = new List<bool[]>();
        static bool Same(bool[] a, bool[] b) => a.AsSpan().SequenceEqual(b);
        bool SameKept(bool[] a, bool[] b) => !map.Rejects || Same(a, b);
        bool Small(StepResult from, StepResult to) => Change(from.Mean, from.Cov, to.Mean, to.Cov, p) < tolerance;
        IterationOutcome Outcome(StepResult s, bool converged, bool singular = false) =>
            new(s.Mean, s.Cov, map.Rejects ? s.Kept : null, s.KeptCount, evaluations, converged, singular);
        StepResult? Plain(StepResult from)
        {
            evaluations++;
            var r = map.Apply(from.Mean, from.Cov, map.Rejects ? from.Kept : null, from.KeptCount);
            if (r is not null) history.Add(r.Kept);
            if (history.Count > 4) history.RemoveAt(0);
            return r;
        }
        bool TwoCycle() => map.Rejects && history.Count == 4
            && Same(history[3], history[1]) && Same(history[2], history[0]) && !Same(history[3], history[2]);

        while (evaluations < cap)
        {
            if (accelerate && TwoCycle() && evaluations + 4 <= cap)
            {
                // Double steps G = F∘F from a state holding kept set A (s1, s3, u1 hold B): G(θ₀) = s2, G(G(θ₀)) = s4.
                var a = state.Kept;
                target ??= (cap - evaluations) % 2 == 0 ? a : history[2];
                var s1 = Plain(state);
                var s2 = s1 is null ? null : Plain(s1);
                if (s1 is null || s2 is null) return Outcome(s1 ?? state, false, true);
                if (!Same(s2.Kept, a) || Same(s1.Kept, a)) { (state, target) = (s2, null); continue; }
                if (Small(state, s2)) return Outcome(Same(target, a) ? s2 : s1, false);
                var s3 = Plain(s2);
                var s4 = s3 is null ? null : Plain(s3);
                if (s3 is null || s4 is null) return Outcome(s3 ?? s2, false, true);
                if (!Same(s4.Kept, a) || !Same(s3.Kept, s1.Kept)) { (state, target) = (s4, null); continue; }
                if (Small(s2, s4)) return Outcome(Same(target, a) ? s4 : s3, false);
                var theta = cycleSquarem.Extrapolate(Pack(state.Mean, state.Cov), Pack(s2.Mean, s2.Cov), Pack(s4.Mean, s4.Cov), out double cycleStep);
                state = s4;
                if (theta is null || !(cycleStep > 1) || evaluations + 2 > cap)
                {
                    if (theta is not null) cycleSquarem.Accepted(cycleStep);
                    continue;
                }
                var (cm, cc) = Unpack(theta, p);
                var cycleJump = new StepResult(cm, cc, a, s4.KeptCount, double.NaN);
                var u1 = ScreeningCholesky.TryFactor(cc, p) is null ? null : Plain(cycleJump);
                var u2 = u1 is null ? null : Plain(u1);
                if (u1 is not null && u2 is not null && Same(u1.Kept, s1.Kept) && Same(u2.Kept, a)
                    && Change(cm, cc, u2.Mean, u2.Cov, p) <= Change(s2.Mean, s2.Cov, s4.Mean, s4.Cov, p))
                {
                    cycleSquarem.Accepted(cycleStep);
                    if (Small(cycleJump, u2)) return Outcome(Same(target, a) ? u2 : u1, false);
                    state = u2;
                }
                else
                {
                    cycleSquarem.Rejected();
                    history.Clear();
                    history.AddRange([s1.Kept, s2.Kept, s3.Kept, s4.Kept]);
                }
                continue;
            }
            var t1 = Plain(state);
            if (t1 is null) return Outcome(state, false, true);
            if (SameKept(t1.Kept, state.Kept) && Small(state, t1)) return Outcome(t1, true);
            if (!accelerate || evaluations == cap) { state = t1; continue; }
            var t2 = Plain(t1);
            if (t2 is null) return Outcome(t1, false, true);
            if (SameKept(t2.Kept, t1.Kept) && Small(t1, t2)) return Outcome(t2, true);
            var next = t2;
            bool stable = SameKept(t1.Kept, state.Kept) && SameKept(t2.Kept, t1.Kept);
            if (stable && evaluations < cap)
            {
                var theta = squarem.Extrapolate(Pack(state.Mean, state.Cov), Pack(t1.Mean, t1.Cov), Pack(t2.Mean, t2.Cov), out double step);
                if (theta is not null && step > 1)
                {
                    // Step length 1 is θ₂ itself; otherwise one step from the extrapolated point, kept when the safeguards hold.
                    var (em, ec) = Unpack(theta, p);
                    var jump = new StepResult(em, ec, t2.Kept, t2.KeptCount, double.NaN);
                    var t3 = ScreeningCholesky.TryFactor(ec, p) is null ? null : Plain(jump);
                    bool keep = t3 is not null && (map.Rejects
                        ? Same(t3.Kept, t2.Kept) && Change(em, ec, t3.Mean, t3.Cov, p) <= Change(state.Mean, state.Cov, t1.Mean, t1.Cov, p)
                        : t3.LogLikelihood >= t1.LogLikelihood);
                    history.Clear();
                    if (keep)
                    {
                        squarem.Accepted(step);
                        if (SameKept(t3!.Kept, jump.Kept) && Small(jump, t3)) return Outcome(t3, true);
                        next = t3;
                    }
                    else squarem.Rejected();
                }
                else if (theta is not null) squarem.Accepted(step);
            }
            state = next;
        }
        return Outcome(state, false);
    }

    /// <summary>θ = (μ, Σ row-major) as one vector.</summary>
    private static double[] Pack(double[] mean, double[] cov) => [.. mean, .. cov];

    private static (double[] Mean, double[] Cov) Unpack(double[] theta, int p) => (theta[..p], theta[p..]);

    /// <summary>Largest change of μ and Σ relative to the largest diagonal entry of Σ.</summary>
    private static double Change(double[] m0, double[] c0, double[] m1, double[] c1, int p)
    {
        double scale = 0, change = 0;
        for (int j = 0; j < p; j++) scale = Math.Max(scale, c0[j * p + j]);
        for (int j = 0; j < p; j++) change = Math.Max(change, Math.Abs(m1[j] - m0[j]) / Math.Sqrt(scale));
        for (int t = 0; t < p * p; t++) change = Math.Max(change, Math.Abs(c1[t] - c0[t]) / scale);
        return change;
    }

    /// <summary>Item means over the answered values and the covariance over the rows answering both items (about
    /// those means, divisor count − 1), with a ridge added when it is not positive definite.</summary>
    private static (double[] Mean, double[] Cov) PairwiseStart(double[] x, int n, int p)
    {
        var mean = new double[p];
        var count = new long[p];
        for (int i = 0; i < n; i++)
            for (int j = 0; j < p; j++)
            {
                double v = x[(long)i * p + j];
                if (!double.IsNaN(v)) { mean[j] += v; count[j]++; }
            }
        for (int j = 0; j < p; j++) mean[j] = count[j] > 0 ? mean[j] / count[j] : 0;
        var sum = new double[p * p];
        var pairs = new long[p * p];
        var d = new double[p];
        for (int i = 0; i < n; i++)
        {
            for (int j = 0; j < p; j++) d[j] = x[(long)i * p + j] - mean[j];
            for (int j = 0; j < p; j++)
            {
                if (double.IsNaN(d[j])) continue;
                for (int k = 0; k <= j; k++)
                {
                    if (double.IsNaN(d[k])) continue;
                    sum[j * p + k] += d[j] * d[k];
                    pairs[j * p + k]++;
                }
            }
        }
        var cov = new double[p * p];
        for (int j = 0; j < p; j++)
            for (int k = 0; k <= j; k++)
                cov[j * p + k] = cov[k * p + j] = pairs[j * p + k] > 1 ? sum[j * p + k] / (pairs[j * p + k] - 1) : 0;
        for (double ridge = 1e-8; ScreeningCholesky.TryFactor(cov, p) is null && ridge < 1; ridge *= 10)
        {
            double trace = 0;
            for (int j = 0; j < p; j++) trace += cov[j * p + j];
            for (int j = 0; j < p; j++) cov[j * p + j] += ridge * Math.Max(trace / p, 1e-12);
        }
        return (mean, cov);
    }

    /// <summary>One E- and M-step; rows whose distance on k answered items exceeds <paramref name="cut"/>[k] get weight 0.
    /// Null when Σ is singular or fewer than p + 1 rows are kept.</summary>
    private static StepResult? Step(double[] x, int n, int p, double[] mean, double[] cov, double[] cut, double factor,
        bool[]? inEstimate = null, int estimateRows = 0)
    {
        var chol = ScreeningCholesky.TryFactor(cov, p);
        if (chol is null) return null;
        var omega = chol.Inverse();
        int blocks = (n + BlockRows - 1) / BlockRows;
        var sums = new double[blocks][];
        var counts = new int[blocks];
        var kept = new bool[n];
        Parallel.For(0, blocks, () => new Scratch(p), (b, _, s) =>
        {
            var acc = new double[p + p * p + 1];
            int c = 0;
            int end = Math.Min(n, (b + 1) * BlockRows);
            for (int i = b * BlockRows; i < end; i++)
            {
                if (!FillRow(x.AsSpan(i * p, p), p, mean, omega, s, out int answered)) continue;
                double d2 = inEstimate is null || inEstimate[i] ? s.D2 : LeaveIn(s.D2, estimateRows);
                if (!(d2 <= cut[answered])) continue;
                kept[i] = true;
                c++;
                Accumulate(acc, s, p);
                acc[p + p * p] += s.SmallLogDeterminant + s.D2;
            }
            sums[b] = acc;
            counts[b] = c;
            return s;
        }, _ => { });
        var total = new double[p + p * p + 1];
        int keptCount = 0;
        for (int b = 0; b < blocks; b++)
        {
            keptCount += counts[b];
            for (int t = 0; t < total.Length; t++) total[t] += sums[b][t];
        }
        if (keptCount < p + 1) return null;
        var zbar = new double[p];
        var newMean = new double[p];
        for (int j = 0; j < p; j++)
        {
            zbar[j] = total[j] / keptCount;
            newMean[j] = mean[j] + zbar[j];
        }
        var newCov = new double[p * p];
        for (int j = 0; j < p; j++)
            for (int k = 0; k <= j; k++)
            {
                double v = (total[p + j * p + k] - keptCount * zbar[j] * zbar[k]) / (keptCount - 1) * factor;
                newCov[j * p + k] = newCov[k * p + j] = v;
            }
        // ln det Σ_OO = ln det Σ + ln det Ω_MM for each row (Schur complement); −2ℓ = Σ (ln det Σ_OO + distance).
        double logLikelihood = -0.5 * (keptCount * chol.LogDeterminant + total[p + p * p]);
        return new StepResult(newMean, newCov, kept, keptCount, logLikelihood);
    }

    /// <summary>Normal-theory consistency factor of the covariance of rows truncated at the χ²_p(1 − α) quantile:
    /// <c>(1 − α) / F_χ²(p+2)(χ²_p(1 − α))</c> (Croux &amp; Haesbroeck 1999, see the type's summary).</summary>
    internal static double TruncationFactor(double alpha, int p) => (1 - alpha) / ChiSquareTail.Cdf(ChiSquareTail.UpperQuantile(alpha, p), p + 2);

    /// <summary>
    /// The in-sample distance a row would have if it were added to the N rows of the estimate, from its distance D to
    /// that estimate: with δ = x − x̄, S the covariance of the N rows (divisor N − 1) and the row added (mean moves by
    /// δ / (N + 1), covariance with divisor N), the Sherman–Morrison formula gives
    /// <c>D_in = (N / (N + 1))² · N / (N − 1) · D / (1 + N D / ((N + 1)(N − 1)))</c> (our derivation).
    /// Comparing D_in with the in-sample law for N + 1 rows judges rows inside and outside the estimate alike.
    /// </summary>
    internal static double LeaveIn(double d, int n)
    {
        if (n < 2) return d;
        double a = n / (n + 1.0);
        return a * a * n / (n - 1.0) * d / (1 + n * d / ((n + 1.0) * (n - 1.0)));
    }

    private sealed class Scratch(int p)
    {
        public readonly double[] Z = new double[p], W = new double[p], Small = new double[p * p], SmallInverse = new double[p * p], Rhs = new double[p];
        public readonly int[] Missing = new int[p];
        public int MissingCount;
        public double D2, SmallLogDeterminant;
    }

    /// <summary>Filled centred vector z, distance and missing-part conditional covariance of one row; false when it has no answers
    /// or Ω_MM cannot be factorised.</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private static bool FillRow(ReadOnlySpan<double> row, int p, double[] mean, double[] omega, Scratch s, out int answered)
    {
        int m = 0;
        for (int j = 0; j < p; j++)
        {
            double v = row[j];
            if (double.IsNaN(v)) { s.Z[j] = 0; s.Missing[m++] = j; }
            else s.Z[j] = v - mean[j];
        }
        s.MissingCount = m;
        s.SmallLogDeterminant = 0;
        answered = p - m;
        if (answered == 0) return false;
        if (m > 0)
        {
            // r = (Ω y)_M; A = Ω_MM; z_M = −A⁻¹ r; conditional covariance A⁻¹.
            for (int a = 0; a < m; a++)
            {
                int ja = s.Missing[a];
                double r = 0;
                for (int j = 0; j < p; j++) r += omega[ja * p + j] * s.Z[j];
                s.Rhs[a] = r;
                for (int b = 0; b < m; b++) s.Small[a * m + b] = omega[ja * p + s.Missing[b]];
            }
            if (!InvertSpd(s.Small, s.SmallInverse, m, out s.SmallLogDeterminant)) return false;
            for (int a = 0; a < m; a++)
            {
                double t = 0;
                for (int b = 0; b < m; b++) t += s.SmallInverse[a * m + b] * s.Rhs[b];
                s.Z[s.Missing[a]] = -t;
            }
        }
        double d2 = 0;
        var z = s.Z.AsSpan(0, p);
        for (int j = 0; j < p; j++) d2 += z[j] * Dot(omega.AsSpan(j * p, p), z);
        s.D2 = d2;
        return true;
    }

    /// <summary>Σ a_i b_i, in SIMD lanes then the tail; the summation order depends only on the length, so results
    /// do not depend on the thread count.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private static double Dot(ReadOnlySpan<double> a, ReadOnlySpan<double> b)
    {
        int n = a.Length, i = 0;
        var acc = System.Numerics.Vector<double>.Zero;
        int w = System.Numerics.Vector<double>.Count;
        for (; i <= n - w; i += w) acc += new System.Numerics.Vector<double>(a.Slice(i, w)) * new System.Numerics.Vector<double>(b.Slice(i, w));
        double sum = System.Numerics.Vector.Sum(acc);
        for (; i < n; i++) sum += a[i] * b[i];
        return sum;
    }

    /// <summary>y += a · x, in SIMD lanes then the tail.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private static void Axpy(double a, ReadOnlySpan<double> x, Span<double> y)
    {
        int n = x.Length, i = 0;
        int w = System.Numerics.Vector<double>.Count;
        var va = new System.Numerics.Vector<double>(a);
        for (; i <= n - w; i += w) (new System.Numerics.Vector<double>(y.Slice(i, w)) + va * new System.Numerics.Vector<double>(x.Slice(i, w))).CopyTo(y.Slice(i, w));
        for (; i < n; i++) y[i] += a * x[i];
    }

    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private static void Accumulate(double[] acc, Scratch s, int p)
    {
        var z = s.Z;
        for (int j = 0; j < p; j++)
        {
            acc[j] += z[j];
            Axpy(z[j], z.AsSpan(0, j + 1), acc.AsSpan(p + j * p, j + 1));
        }
        int m = s.MissingCount;
        for (int a = 0; a < m; a++)
            for (int b = 0; b < m; b++)
            {
                int ja = s.Missing[a], jb = s.Missing[b];
                if (jb <= ja) acc[p + ja * p + jb] += s.SmallInverse[a * m + b];
            }
    }

    /// <summary>Inverse and log-determinant of a small SPD matrix (row-major m × m) by Cholesky; false when not positive definite.</summary>
    private static bool InvertSpd(double[] a, double[] inverse, int m, out double logDeterminant)
    {
        var f = ScreeningCholesky.TryFactor(a.AsSpan(0, m * m).ToArray(), m);
        logDeterminant = f?.LogDeterminant ?? double.NaN;
        if (f is null) return false;
        var inv = f.Inverse();
        inv.AsSpan(0, m * m).CopyTo(inverse);
        return true;
    }
}
