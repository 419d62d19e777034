using System.Globalization;
using System.Runtime.CompilerServices;
using ItemReduce.Core.Data;
using ItemReduce.Core.Screening;

namespace ItemReduce.Core.Confirmatory;

/// <summary>
/// Confirmatory factor analysis of an independent-clusters model (<see cref="IndependentClustersModel"/>) by maximum
/// likelihood (Jöreskog, K. G., 1969, "A general approach to confirmatory maximum likelihood factor analysis",
/// Psychometrika 34, 183–202), with missing answers by the casewise likelihood (<see cref="CasewiseLikelihood"/>,
/// Arbuckle 1996) or listwise deletion. Steps: group rows by missing-data pattern → saturated model
/// (<see cref="SaturatedNormalEm"/>) → starting values → Fisher scoring (Lee, S.-Y., &amp; Jennrich, R. I., 1979, "A study
/// of algorithms for covariance structure analysis with specific comparisons using factor analysis", Psychometrika
/// 44, 99–113) with step halving → standard errors from the inverse expected information → fit statistics.
/// <para>Fit statistics (definitions as stated in the README): χ² = −2 ln L(model) + 2 ln L(saturated), which for
/// complete data is N·F_ML with the divide-by-N covariance; df = p(p+1)/2 − (2p + k(k−1)/2);
/// CFI = 1 − max(χ²−df, 0)/max(χ²₀−df₀, χ²−df, 0) (Bentler, P. M., 1990, Psychological Bulletin 107, 238–246);
/// TLI = (χ²₀/df₀ − χ²/df)/(χ²₀/df₀ − 1) (Tucker, L. R., &amp; Lewis, C., 1973, Psychometrika 38, 1–10);
/// RMSEA with its 90% interval (<see cref="RmseaInterval"/>); SRMR over the p(p+1)/2 residual correlations
/// (s_ij − σ̂_ij)/√(s_ii s_jj), s from the saturated model. The independence model has free means and variances
/// (its casewise estimates are the available-case moments). Robust versions: <see cref="SatorraBentlerScaling"/>.</para>
/// </summary>
internal static class ConfirmatoryFactorAnalysis
{
    /// <summary>Fisher-scoring iteration cap.</summary>
    public const int MaxIterations = 500;

    /// <summary>Iterations that always use a freshly computed information matrix.</summary>
    private const int RefreshedIterations = 3;

    /// <summary>Convergence: largest relative parameter step.</summary>
    public const double StepTolerance = 1e-10;

    /// <summary>Fits the model.</summary>
    /// <param name="data">Responses (NaN = missing).</param>
    /// <param name="items">Columns of <paramref name="data"/> in the model, in model order.</param>
    /// <param name="itemFactor">0-based factor of each of <paramref name="items"/>; every factor needs ≥ 2 items, and a
    /// factor with 2 items needs another factor (identified through the factor correlations).</param>
    /// <param name="factorNames">One name per factor.</param>
    /// <param name="listwise">Drop rows with any missing answer on <paramref name="items"/> instead of the casewise likelihood.</param>
    /// <param name="robust">Compute the robust scaling (costs p⁴-order work per model).</param>
    /// <exception cref="ArgumentException">A model that is not identified, or too few respondents.</exception>
    public static ConfirmatoryResult Fit(ResponseMatrix data, IReadOnlyList<int> items, IReadOnlyList<int> itemFactor,
        IReadOnlyList<string> factorNames, bool listwise, bool robust = true)
    {
        ArgumentNullException.ThrowIfNull(data);
        ArgumentNullException.ThrowIfNull(items);
        ArgumentNullException.ThrowIfNull(itemFactor);
        ArgumentNullException.ThrowIfNull(factorNames);
        int p = items.Count, k = factorNames.Count;
        if (itemFactor.Count != p) throw new ArgumentException($"{itemFactor.Count} factor assignments for {p} items.", nameof(itemFactor));
        for (int f = 0; f < k; f++)
        {
            int count = itemFactor.Count(x => x == f);
            if (count < 2 || (count == 2 && k == 1))
                throw new DataConditionException($"Factor '{factorNames[f]}' has {count} item(s); it is not identified.", nameof(itemFactor));
        }
        var model = new IndependentClustersModel([.. itemFactor], k);
        var patterns = MissingDataPatterns.From(data, items, listwise);
        int n = patterns.Respondents;
        if (n < p + 1) throw new DataConditionException($"{n} respondents for {p} items; the model needs at least {p + 1}.", nameof(data));
        var names = items.Select(j => data.Items[j].Name).ToArray();
        var warnings = new List<AnalysisWarning>();

        var (mu1, sigma1, emIterations, emConverged) = SaturatedNormalEm.Fit(patterns);
        if (!emConverged)
            warnings.Add(new AnalysisWarning("saturated-not-converged", "confirmatory", string.Create(CultureInfo.InvariantCulture,
                $"The saturated model (EM) did not converge in {emIterations} iterations; χ² and SRMR are approximate.")));

        var theta = Start(model, mu1, sigma1);
        var (converged, iterations) = Minimise(model, patterns, theta);
        var sigma = model.Sigma(theta);
        double fModel = CasewiseLikelihood.Minus2LogLikelihood(patterns, model.Mu(theta), sigma);
        double fSaturated = CasewiseLikelihood.Minus2LogLikelihood(patterns, mu1, sigma1);
        var (mu0, sigma0) = SaturatedNormalEm.AvailableCaseStart(patterns);
        double fIndependence = CasewiseLikelihood.Minus2LogLikelihood(patterns, mu0, sigma0);

        var info = FisherInformation(model, patterns, theta);
        double[]? covariance = info is null ? null : InvertOrNull(info, model.Parameters);
        var fit = Statistics(model, patterns, sigma, mu1, sigma1, sigma0, fModel - fSaturated, fIndependence - fSaturated, theta, robust, info);
        var estimates = new List<ConfirmatoryEstimate>();
        for (int j = 0; j < p; j++)
            estimates.Add(new ConfirmatoryEstimate(names[j], factorNames[itemFactor[j]], theta[j], Se(covariance, model.Parameters, j),
                theta[j] / Math.Sqrt(sigma[j * p + j])));
        for (int c = 0; c < model.Pairs.Length; c++)
        {
            var (a, b) = model.Pairs[c];
            int idx = model.CorrelationIndex(c);
            estimates.Add(new ConfirmatoryEstimate(null, factorNames[a] + "~" + factorNames[b], theta[idx], Se(covariance, model.Parameters, idx), theta[idx]));
        }
        var psi = Enumerable.Range(0, p).Select(j => theta[model.UniquenessIndex(j)]).ToArray();
        var omega = new double[k];
        for (int f = 0; f < k; f++)
        {
            double sl = 0, sp = 0;
            for (int j = 0; j < p; j++) if (itemFactor[j] == f) { sl += theta[j]; sp += psi[j]; }
            omega[f] = sl * sl / (sl * sl + sp);
        }
        Warn(warnings, converged, iterations, names, factorNames, estimates, psi, covariance is null);
        return new ConfirmatoryResult
        {
            Items = names,
            Factors = [.. factorNames],
            ItemFactor = [.. itemFactor],
            Estimator = patterns.Complete ? ConfirmatoryEstimator.MaximumLikelihood : ConfirmatoryEstimator.FullInformation,
            Converged = converged,
            Iterations = iterations,
            RespondentRows = patterns.RowIndex,
            Estimates = estimates,
            UniqueVariances = psi,
            CompositeReliability = omega,
            Fit = fit,
            Warnings = warnings,
        };
    }

    /// <summary>Loadings from each item's mean correlation with its factor mates, unique variances as the rest of the
    /// variance, factor correlations from the mean cross-factor item correlation; means from the saturated model.</summary>
    private static double[] Start(IndependentClustersModel model, double[] mu1, double[] sigma1)
    {
        int p = model.Items, k = model.Factors;
        var theta = new double[model.Parameters];
        double R(int i, int j) => sigma1[i * p + j] / Math.Sqrt(sigma1[i * p + i] * sigma1[j * p + j]);
        var within = new double[p];
        for (int i = 0; i < p; i++)
        {
            double s = 0;
            int c = 0;
            for (int j = 0; j < p; j++) if (j != i && model.ItemFactor[j] == model.ItemFactor[i]) { s += R(i, j); c++; }
            within[i] = Math.Clamp(c > 0 ? s / c : 0.3, 0.05, 0.9);
            double sd = Math.Sqrt(sigma1[i * p + i]);
            theta[model.LoadingIndex(i)] = Math.Sqrt(within[i]) * sd;
            theta[model.UniquenessIndex(i)] = (1 - within[i]) * sd * sd;
            theta[model.MeanIndex(i)] = mu1[i];
        }
        for (int c = 0; c < model.Pairs.Length; c++)
        {
            var (a, b) = model.Pairs[c];
            double s = 0, scale = 0;
            int cnt = 0;
            for (int i = 0; i < p; i++)
                for (int j = 0; j < p; j++)
                    if (model.ItemFactor[i] == a && model.ItemFactor[j] == b) { s += R(i, j); scale += Math.Sqrt(within[i] * within[j]); cnt++; }
            theta[model.CorrelationIndex(c)] = Math.Clamp(s / scale, -0.9, 0.9);
        }
        _ = k;
        return theta;
    }

    /// <summary>Fisher scoring on −2 ln L: step −½ I⁻¹ ∇, halved until −2 ln L falls (Armijo) with every pattern's
    /// covariance block positive definite. Returns (converged, iterations); <paramref name="theta"/> is updated in place.</summary>
    private static (bool Converged, int Iterations) Minimise(IndependentClustersModel model, MissingDataPatterns data, double[] theta)
    {
        int p = model.Items, q = model.Parameters;
        var gs = new double[p * p];
        var gm = new double[p];
        double f = CasewiseLikelihood.Minus2LogLikelihood(data, model.Mu(theta), model.Sigma(theta), gs, gm);
        if (double.IsNaN(f)) return (false, 0);
        double[]? inverse = null;
        bool refresh = true;
        double previousLargest = double.PositiveInfinity;
        for (int it = 1; it <= MaxIterations; it++)
        {
            var grad = model.Gradient(theta, gs, gm);
            if (refresh || inverse is null)
            {
                var info = FisherInformation(model, data, theta);
                if (info is null) return (false, it);
                inverse = InvertOrNull(info, q);
                if (inverse is null) return (false, it);
            }
            var step = new double[q];
            for (int i = 0; i < q; i++)
            {
                double v = 0;
                for (int j = 0; j < q; j++) v += inverse[i * q + j] * grad[j];
                step[i] = -0.5 * v;
            }
            double slope = 0;
            for (int i = 0; i < q; i++) slope += grad[i] * step[i];
            double t = 1;
            var trial = new double[q];
            double fTrial = double.NaN;
            for (int half = 0; half < 40; half++, t *= 0.5)
            {
                for (int i = 0; i < q; i++) trial[i] = theta[i] + t * step[i];
                fTrial = CasewiseLikelihood.Minus2LogLikelihood(data, model.Mu(trial), model.Sigma(trial), gs, gm);
                if (!double.IsNaN(fTrial) && fTrial <= f + 1e-4 * t * slope) break;
                // A step that changes −2 ln L by rounding only is accepted: the minimum is reached.
                if (!double.IsNaN(fTrial) && Math.Abs(fTrial - f) <= 1e-13 * Math.Abs(f)) break;
                fTrial = double.NaN;
            }
            if (double.IsNaN(fTrial)) return (false, it);
            double largest = 0;
            for (int i = 0; i < q; i++) largest = Math.Max(largest, Math.Abs(t * step[i]) / Math.Max(1, Math.Abs(theta[i])));
            Array.Copy(trial, theta, q);
            f = fTrial;
            if (largest < StepTolerance) return (true, it);
            // The information changes little once θ is near the optimum: it is kept (a fixed metric, still a descent
            // direction checked by the line search) while the steps shrink fast, and refreshed otherwise.
            refresh = it < RefreshedIterations || t < 1 || largest > 0.5 * previousLargest;
            previousLargest = largest;
        }
        return (false, MaxIterations);
    }

    /// <summary>Expected (Fisher) information of θ for ln L, summed over respondents (q × q, row-major), or null when a
    /// covariance block is not positive definite. Every ∂Σ/∂θ is s (u wᵀ + w uᵀ) with u, w among the unit vectors e_j,
    /// the k vectors c_f = Λ Φ e_f (∂Σ/∂λ_j uses e_j and c_f(j)) and the k columns of Λ, so each entry
    /// ½ tr(K ∂Σ_i K ∂Σ_j) is a sum of products of the bilinear forms zᵀ K z' of those p + 2k vectors (our derivation);
    /// per pattern that needs K itself and K times the 2k non-unit vectors, O(q²k).</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    internal static double[]? FisherInformation(IndependentClustersModel model, MissingDataPatterns data, double[] theta)
    {
        int p = model.Items, k = model.Factors, q = model.Parameters, qc = model.CovarianceParameters;
        var sigma = model.Sigma(theta);
        var inverter = new CasewiseLikelihood.PatternInverter(data, sigma);
        int nv = 2 * k;
        var z = model.DerivativeVectors(theta);
        // Vector codes: j < p is e_j; p + v is non-unit vector v.
        int dim = p + nv;
        var table = new double[dim * dim];
        var u = new int[qc];
        var w = new int[qc];
        var s = new double[qc];
        for (int j = 0; j < p; j++)
        {
            (u[j], w[j], s[j]) = (j, p + model.ItemFactor[j], 1);
            (u[p + j], w[p + j], s[p + j]) = (j, j, 0.5);
        }
        for (int c = 0; c < model.Pairs.Length; c++)
            (u[2 * p + c], w[2 * p + c], s[2 * p + c]) = (p + k + model.Pairs[c].A, p + k + model.Pairs[c].B, 1);
        var info = new double[q * q];
        var pos = new int[p];
        var kz = new double[p * nv];
        var zkz = new double[nv * nv];
        var active = new int[qc];
        for (int gi = 0; gi < data.Patterns.Count; gi++)
        {
            var g = data.Patterns[gi];
            var o = g.Observed;
            int m = o.Length;
            if (!inverter.TryInverse(gi, out var kk, out _)) return null;
            Array.Fill(pos, -1);
            for (int a = 0; a < m; a++) pos[o[a]] = a;
            // KZ (m × nv) and ZᵀKZ (nv × nv) over the answered items.
            Array.Clear(kz, 0, m * nv);
            for (int a = 0; a < m; a++)
                for (int b = 0; b < m; b++)
                {
                    double v = kk[a * m + b];
                    int col = o[b];
                    for (int c = 0; c < nv; c++) kz[a * nv + c] += v * z[c * p + col];
                }
            Array.Clear(zkz);
            for (int a = 0; a < m; a++)
                for (int c = 0; c < nv; c++)
                {
                    double zc = z[c * p + o[a]];
                    if (zc == 0) continue;
                    for (int d = 0; d < nv; d++) zkz[c * nv + d] += zc * kz[a * nv + d];
                }
            // Table of the bilinear forms: rows/columns 0..p−1 the unit vectors (zero when unanswered), p.. the others.
            Array.Clear(table);
            for (int a = 0; a < m; a++)
            {
                int ra = o[a] * dim;
                for (int b = 0; b < m; b++) table[ra + o[b]] = kk[a * m + b];
                for (int c = 0; c < nv; c++)
                {
                    double v = kz[a * nv + c];
                    table[ra + p + c] = v;
                    table[(p + c) * dim + o[a]] = v;
                }
            }
            for (int c = 0; c < nv; c++)
                for (int d = 0; d < nv; d++) table[(p + c) * dim + p + d] = zkz[c * nv + d];
            // Parameters of unanswered items have zero derivative blocks here.
            int na = 0;
            for (int i = 0; i < qc; i++)
                if ((u[i] >= p || pos[u[i]] >= 0) && (w[i] >= p || pos[w[i]] >= 0)) active[na++] = i;
            double n = g.Count;
            for (int x = 0; x < na; x++)
            {
                int i = active[x];
                for (int y = 0; y <= x; y++)
                {
                    int j = active[y];
                    double v = n * s[i] * s[j] * (table[w[i] * dim + u[j]] * table[w[j] * dim + u[i]] + table[w[i] * dim + w[j]] * table[u[i] * dim + u[j]]);
                    info[i * q + j] += v;
                    if (i != j) info[j * q + i] += v;
                }
            }
            for (int a = 0; a < m; a++)
                for (int b = 0; b < m; b++) info[(qc + o[a]) * q + qc + o[b]] += n * kk[a * m + b];
        }
        return info;
    }

    private static ConfirmatoryFitStatistics Statistics(IndependentClustersModel model, MissingDataPatterns data, double[] sigma,
        double[] mu1, double[] sigma1, double[] sigma0, double chi2, double chi20, double[] theta, bool robust, double[]? information)
    {
        int p = model.Items, n = data.Respondents, ps = p * (p + 1) / 2;
        int df = ps - model.CovarianceParameters, df0 = ps - p;
        chi2 = Math.Max(chi2, 0);
        double pValue = df > 0 ? ChiSquareTail.UpperTail(chi2, df) : double.NaN;
        double cfi = Cfi(chi2, df, chi20, df0);
        double tli = Tli(chi2, df, chi20, df0);
        var (rmsea, lo, hi) = RmseaInterval.Compute(chi2, df, n);
        double srmr = 0;
        for (int a = 0; a < p; a++)
            for (int b = 0; b <= a; b++)
            {
                double r = (sigma1[a * p + b] - sigma[a * p + b]) / Math.Sqrt(sigma1[a * p + a] * sigma1[b * p + b]);
                srmr += r * r;
            }
        srmr = Math.Sqrt(srmr / ps);
        double c = double.NaN, c0 = double.NaN;
        int robustRespondents = 0;
        if (robust && df > 0)
        {
            (c, c0, robustRespondents) = SatorraBentlerScaling.Factors(data, model, theta, sigma, mu1, sigma1, sigma0, df, df0, information);
        }
        double robustRmsea = df > 0 ? Math.Sqrt(Math.Max(chi2 - c * df, 0) / (df * (double)n)) : double.NaN;
        double rc = chi2 - c * df, rc0 = chi20 - c0 * df0;
        double denominator = Math.Max(Math.Max(rc0, rc), 0);
        double robustCfi = denominator > 0 ? 1 - Math.Max(rc, 0) / denominator : double.NaN;
        double robustTli = df > 0 && rc0 != 0 ? 1 - (rc / df) / (rc0 / df0) : double.NaN;
        return new ConfirmatoryFitStatistics(chi2, df, pValue, cfi, tli, rmsea, lo, hi, srmr, chi2 / c, c, robustCfi, robustTli,
            robustRmsea, chi20, df0, c0, robustRespondents);
    }

    /// <summary>CFI = 1 − max(χ²−df, 0)/max(χ²₀−df₀, χ²−df, 0); NaN when the denominator is 0 or df ≤ 0.</summary>
    internal static double Cfi(double chi2, int df, double chi20, int df0)
    {
        if (df <= 0) return double.NaN;
        double d = Math.Max(Math.Max(chi20 - df0, chi2 - df), 0);
        return d > 0 ? 1 - Math.Max(chi2 - df, 0) / d : double.NaN;
    }

    /// <summary>TLI = (χ²₀/df₀ − χ²/df)/(χ²₀/df₀ − 1); NaN when df ≤ 0 or χ²₀/df₀ = 1.</summary>
    internal static double Tli(double chi2, int df, double chi20, int df0)
    {
        if (df <= 0) return double.NaN;
        double r0 = chi20 / df0;
        return r0 != 1 ? (r0 - chi2 / df) / (r0 - 1) : double.NaN;
    }

    private static void Warn(List<AnalysisWarning> warnings, bool converged, int iterations, string[] names, IReadOnlyList<string> factors,
        List<ConfirmatoryEstimate> estimates, double[] psi, bool noInformation)
    {
        var ci = CultureInfo.InvariantCulture;
        if (!converged)
            warnings.Add(new AnalysisWarning("confirmatory-not-converged", "confirmatory", string.Create(ci,
                $"The confirmatory model of {string.Join(", ", factors)} did not converge ({iterations} iterations); its estimates and fit are not trustworthy.")));
        for (int j = 0; j < psi.Length; j++)
            if (!(psi[j] > 0) || Math.Abs(estimates[j].Standardized) >= 1)
                warnings.Add(new AnalysisWarning("heywood-case", "confirmatory", string.Create(ci,
                    $"Item {names[j]} has a unique variance of {psi[j]:G3} (standardized loading {estimates[j].Standardized:F3}), a Heywood case: the model does not describe this item properly.")));
        foreach (var e in estimates.Where(e => e.Item is null && Math.Abs(e.Estimate) >= 1))
            warnings.Add(new AnalysisWarning("factor-correlation-out-of-range", "confirmatory", string.Create(ci,
                $"The estimated correlation {e.Factor} is {e.Estimate:F3}, at or beyond ±1: the two factors are not distinguished.")));
        if (noInformation)
            warnings.Add(new AnalysisWarning("no-standard-errors", "confirmatory", "The information matrix of the confirmatory model could not be inverted; no standard errors."));
    }

    private static double Se(double[]? covariance, int q, int i) => covariance is null ? double.NaN : Math.Sqrt(covariance[i * q + i]);

    private static double[]? InvertOrNull(double[] a, int q) => SymmetricFactor.TryInvert(a, q, out var inv, out _) ? inv : null;
}
