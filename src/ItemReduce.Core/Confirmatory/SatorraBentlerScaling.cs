using System.Runtime.CompilerServices;
using ItemReduce.Core.LinearAlgebra;

namespace ItemReduce.Core.Confirmatory;

/// <summary>
/// Scaling factor c of the robust (mean-adjusted) χ², T_scaled = T_ML / c, c = tr(U Γ) / df with
/// U = W − W Δ (Δᵀ W Δ)⁻¹ Δᵀ W (Satorra, A., &amp; Bentler, P. M., 1994, "Corrections to test statistics and standard
/// errors in covariance structure analysis", in A. von Eye &amp; C. C. Clogg (Eds.), Latent Variables Analysis,
/// pp. 399–419, Sage). W is the normal-theory expected information of vech Σ at the fitted model, Δ = ∂ vech Σ/∂θ.
/// Complete data: Γ is the fourth-moment estimate Γ_N = (1/N) Σ (d_i − s)(d_i − s)ᵀ, d_i = vech((x_i − x̄)(x_i − x̄)ᵀ)
/// (which is also the sandwich A⁻¹ B A⁻¹ of the saturated model). Incomplete data (casewise likelihood): the sandwich
/// Γ = A⁻¹ B A⁻¹ with the saturated model's casewise scores (B) and its expected information under the observed patterns
/// (A), the Yuan–Bentler approach (Yuan, K.-H., &amp; Bentler, P. M., 2000, "Three likelihood-based methods for mean and
/// covariance structure analysis with nonnormal missing data", Sociological Methodology 30, 165–200). Using the expected
/// rather than the observed information of the saturated model is our choice; it is exact under MCAR and an
/// approximation under MAR (Savalei, V., 2010, Structural Equation Modeling 17, 241–264, from memory).
/// <para>Computation (our derivations; Γ is never formed). With n respondents, R = S A₁⁻¹ (S: scores, A₁: summed
/// information), c·df = tr(W₁ RᵀR) − tr((ΔᵀW₁Δ)⁻¹ ΔᵀW₁RᵀR W₁Δ), summed one respondent at a time:
/// Σ_i r_iᵀW₁r_i − Σ_i g_iᵀ(ΔᵀW₁Δ)⁻¹g_i with g_i = ΔᵀW₁r_i. Complete data: r_i = vech(E_i)/n with
/// E_i = r rᵀ − S (r = x_i − x̄), so r_iᵀW₁r_i = ½ tr(K E_i K E_i)/n and g_ij = s_j (uᵀK E_i K w) for
/// ∂Σ/∂θ_j = s_j(u wᵀ + w uᵀ), K = Σ̂⁻¹: O(p²) per respondent. Incomplete data: r_i by two triangular solves with the
/// Cholesky factor of A₁, O(p*²) per respondent. The independence model (diagonal Σ₀) has a diagonal W₀ and Δ₀ picks
/// the variances, so c₀·df₀ = Σ_(a≠b) W₀,(ab) Σ_i r_(ab),i².</para>
/// <para>Row cap: with more than <see cref="RowCap"/> respondents, A₁, W₁, ΔᵀW₁Δ and the scores are taken from
/// <see cref="RowCap"/> evenly spaced respondents (row ⌊j·N/cap⌋), at the estimates from all respondents. Every piece is
/// then a consistent estimate from a fixed, documented subsample, and the cost stays bounded at very large N.</para>
/// </summary>
public static class SatorraBentlerScaling
{
    /// <summary>Most respondents used for Γ and the informations of the scaling factors.</summary>
    public const int RowCap = 2000;

    /// <summary>Scaling factors (c, c₀) and the respondents used, of the model (fitted θ, covariance <paramref name="sigmaModel"/>) and of the
    /// independence model (diagonal <paramref name="sigma0"/>); NaN where df ≤ 0. <paramref name="informationAll"/>: the
    /// expected information of θ over all respondents when already computed.</summary>
    internal static (double C, double C0, int Respondents) Factors(MissingDataPatterns all, IndependentClustersModel model, double[] theta, double[] sigmaModel,
        double[] mu1, double[] sigma1, double[] sigma0, int df, int df0, double[]? informationAll = null)
    {
        if (!(df > 0)) return (double.NaN, double.NaN, 0);
        var data = all.EvenlySpaced(RowCap);
        int qc = model.CovarianceParameters;
        var full = (ReferenceEquals(data, all) ? informationAll : null) ?? ConfirmatoryFactorAnalysis.FisherInformation(model, data, theta)
            ?? throw new MatrixNotPositiveDefiniteException("The model covariance is not positive definite.");
        // Δᵀ W₁ Δ: the covariance block of the expected information (same normal-theory information).
        var dwd = new double[qc * qc];
        for (int i = 0; i < qc; i++) Array.Copy(full, i * model.Parameters, dwd, i * qc, qc);
        CholeskyDecomposition.FactorInPlace(dwd, qc);
        var (c, c0) = data.Complete
            ? CompleteData(data, model, theta, sigmaModel, mu1, sigma1, sigma0, dwd, df, df0)
            : Casewise(data, model, theta, sigmaModel, mu1, sigma1, sigma0, dwd, df, df0);
        return (c, c0, data.Respondents);
    }

    /// <summary>Complete data: per-respondent identities, O(p²) each.</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private static (double, double) CompleteData(MissingDataPatterns data, IndependentClustersModel model, double[] theta, double[] sigmaModel,
        double[] mu1, double[] sigma1, double[] sigma0, double[] dwdFactor, int df, int df0)
    {
        int p = data.Items, k = model.Factors, qc = model.CovarianceParameters, n = data.Respondents;
        if (!SymmetricFactor.TryInvert(sigmaModel, p, out var kInv, out _))
            throw new MatrixNotPositiveDefiniteException("The model covariance is not positive definite.");
        var h = CasewiseLikelihood.Multiply(CasewiseLikelihood.Multiply(kInv, sigma1, p), kInv, p);
        double trHS = 0;
        for (int e = 0; e < p * p; e++) trHS += h[e] * sigma1[e];
        // Non-unit vectors: c_f (f), Λ column a (k + a).
        int nv = 2 * k;
        var z = model.DerivativeVectors(theta);
        // H z for the constants uᵀ H w.
        var hz = new double[nv * p];
        for (int v = 0; v < nv; v++)
            for (int a = 0; a < p; a++) hz[v * p + a] = VectorKernels.Dot(h.AsSpan(a * p, p), z.AsSpan(v * p, p));
        var constant = new double[qc];
        for (int j = 0; j < p; j++)
        {
            constant[j] = hz[model.ItemFactor[j] * p + j];
            constant[p + j] = h[j * p + j];
        }
        for (int c = 0; c < model.Pairs.Length; c++)
            constant[2 * p + c] = VectorKernels.Dot(z.AsSpan((k + model.Pairs[c].A) * p, p), hz.AsSpan((k + model.Pairs[c].B) * p, p));
        var inv0 = new double[p];
        for (int a = 0; a < p; a++) inv0[a] = 1 / sigma0[a * p + a];
        var scratch = new double[data.RowWidth];
        var x = new double[p];
        var y = new double[p];
        var sy = new double[p];
        var zy = new double[nv];
        var gvec = new double[qc];
        double t1 = 0, t2 = 0, t0 = 0;
        for (int i = 0; i < n; i++)
        {
            data.ReadRow(i, scratch, x);
            for (int a = 0; a < p; a++) x[a] -= mu1[a];
            for (int a = 0; a < p; a++) y[a] = VectorKernels.Dot(kInv.AsSpan(a * p, p), x);
            for (int a = 0; a < p; a++) sy[a] = VectorKernels.Dot(sigma1.AsSpan(a * p, p), y);
            double xky = VectorKernels.Dot(x, y), ysy = VectorKernels.Dot(y, sy);
            // ½ tr(K E K E), E = x xᵀ − S.
            t1 += 0.5 * (xky * xky - 2 * ysy + trHS);
            for (int v = 0; v < nv; v++) zy[v] = VectorKernels.Dot(z.AsSpan(v * p, p), y);
            for (int j = 0; j < p; j++)
            {
                gvec[j] = y[j] * zy[model.ItemFactor[j]] - constant[j];
                gvec[p + j] = 0.5 * (y[j] * y[j] - constant[p + j]);
            }
            for (int c = 0; c < model.Pairs.Length; c++)
                gvec[2 * p + c] = zy[k + model.Pairs[c].A] * zy[k + model.Pairs[c].B] - constant[2 * p + c];
            t2 += ForwardNormSquared(dwdFactor, qc, gvec);
            // Independence model: Σ_(a>b) E_ab² / (σ0_a σ0_b).
            for (int a = 1; a < p; a++)
                for (int b = 0; b < a; b++)
                {
                    double e = x[a] * x[b] - sigma1[a * p + b];
                    t0 += e * e * inv0[a] * inv0[b];
                }
        }
        return ((t1 / n - t2) / df, t0 / n / df0);
    }

    /// <summary>Incomplete data: r_i = A₁⁻¹ s_i by triangular solves, four respondents at a time.</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private static (double, double) Casewise(MissingDataPatterns data, IndependentClustersModel model, double[] theta, double[] sigmaModel,
        double[] mu1, double[] sigma1, double[] sigma0, double[] dwdFactor, int df, int df0)
    {
        int p = data.Items, ps = p * (p + 1) / 2, qc = model.CovarianceParameters, n = data.Respondents;
        var l = NormalInformation.ExpectedCovarianceBlock(data, sigma1);

        CholeskyDecomposition.FactorInPlace(l, ps);
        var u = new double[ps * ps];
        for (int i = 0; i < ps; i++)
            for (int j = 0; j <= i; j++) u[j * ps + i] = l[i * ps + j];
        var w = NormalInformation.ExpectedCovarianceBlock(data, sigmaModel);
        // W Δ (ps × qc) from the ≤ 4 non-zero entries in each row of Δ; stored transposed (qc × ps) for dot products.
        var jac = model.CovarianceJacobian(theta);
        var wdT = new double[qc * ps];
        for (int r = 0; r < ps; r++)
            for (int j = 0; j < qc; j++)
            {
                double d = jac[r * qc + j];
                if (d == 0) continue;
                for (int i = 0; i < ps; i++) wdT[j * ps + i] += w[r * ps + i] * d;
            }
        // Off-diagonal W₀ entries: Σ over respondents answering both items of 1/(σ0_a σ0_b).
        var w0 = new double[ps];
        foreach (var g in data.Patterns)
        {
            var o = g.Observed;
            for (int a = 0; a < o.Length; a++)
                for (int b = 0; b < a; b++)
                    w0[o[a] * (o[a] + 1) / 2 + o[b]] += g.Count / (sigma0[o[a] * p + o[a]] * sigma0[o[b] * p + o[b]]);
        }
        var inverses = CasewiseLikelihood.PatternInverses(data, sigma1)
            ?? throw new MatrixNotPositiveDefiniteException("The saturated covariance is not positive definite.");
        // Blocks of respondents: each matrix row is read from memory once per block and reused from cache; inside a
        // block four rows meet four respondents at a time (BlockedDots).
        const int block = 32;
        var rs = new double[block][];
        for (int b = 0; b < block; b++) rs[b] = new double[ps];
        var gs = new double[block][];
        for (int b = 0; b < block; b++) gs[b] = new double[qc];
        var scratch = new double[data.RowWidth];
        var x = new double[p];
        var kr = new double[p];
        var sums = new double[16];
        var quad = new double[block];
        double t1 = 0, t2 = 0, t0 = 0;
        for (int i0 = 0; i0 < n; i0 += block)
        {
            int nb = Math.Min(block, n - i0), used = (nb + 3) & ~3;
            for (int b = 0; b < nb; b++)
            {
                int gi = data.PatternOf[i0 + b];
                data.ReadRow(i0 + b, scratch, x);
                NormalInformation.CovarianceScore(x, data.Patterns[gi].Observed, inverses[gi], mu1, rs[b], kr);
            }
            for (int b = nb; b < used; b++) Array.Clear(rs[b]);
            // r = A₁⁻¹ s: L y = s, then Lᵀ r = y (in place), then rᵀ W r.
            ForwardSolve(l, ps, rs, used, sums);
            BackwardSolve(u, ps, rs, used, sums);
            Array.Clear(quad);
            QuadraticForms(w, ps, rs, used, sums, quad);
            for (int b = 0; b < nb; b++) t1 += quad[b];
            // g = Δᵀ W r.
            for (int j0 = 0; j0 < qc; j0 += 4)
            {
                int rows = Math.Min(4, qc - j0);
                for (int b = 0; b < used; b += 4)
                {
                    BlockedDots.RowsByVectors(wdT, ps, j0, rows, 0, ps, rs, b, sums);
                    for (int c = 0; c < 4; c++)
                        for (int rr = 0; rr < rows; rr++) gs[b + c][j0 + rr] = sums[rr * 4 + c];
                }
            }
            for (int b = 0; b < nb; b++)
            {
                var r = rs[b];
                t2 += ForwardNormSquared(dwdFactor, qc, gs[b]);
                for (int e = 0; e < ps; e++) t0 += w0[e] * r[e] * r[e];
            }
        }
        return ((t1 - t2) / df, t0 / df0);
    }

    /// <summary>‖L⁻¹ g‖² = gᵀ(LLᵀ)⁻¹g for the row-major lower Cholesky factor L (g is overwritten).</summary>
    private static double ForwardNormSquared(double[] l, int q, double[] g)
    {
        double s = 0;
        for (int j = 0; j < q; j++)
        {
            double v = (g[j] - VectorKernels.Dot(l.AsSpan(j * q, j), g.AsSpan(0, j))) / l[j * q + j];
            g[j] = v;
            s += v * v;
        }
        return s;
    }

    /// <summary>Solves L y = s in place for the first <paramref name="used"/> (a multiple of 4) vectors of
    /// <paramref name="v"/>; L row-major lower triangular n × n. Rows four at a time: their dot products with the solved
    /// part come from <see cref="BlockedDots.Dot4x4"/>, the small triangle inside the four rows is finished one by one.</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private static void ForwardSolve(double[] l, int n, double[][] v, int used, double[] sums)
    {
        for (int j0 = 0; j0 < n; j0 += 4)
        {
            int rows = Math.Min(4, n - j0);
            for (int b = 0; b < used; b += 4)
            {
                BlockedDots.RowsByVectors(l, n, j0, rows, 0, j0, v, b, sums);
                for (int c = 0; c < 4; c++)
                {
                    var y = v[b + c];
                    for (int rr = 0; rr < rows; rr++)
                    {
                        int j = j0 + rr, row = j * n;
                        double s = y[j] - sums[rr * 4 + c];
                        for (int q = j0; q < j; q++) s -= l[row + q] * y[q];
                        y[j] = s / l[row + j];
                    }
                }
            }
        }
    }

    /// <summary>Solves Lᵀ r = y in place for the first <paramref name="used"/> (a multiple of 4) vectors of
    /// <paramref name="v"/>, given <paramref name="u"/> = Lᵀ row-major (upper triangular n × n); four rows at a time
    /// from the last, as in <see cref="ForwardSolve"/>.</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private static void BackwardSolve(double[] u, int n, double[][] v, int used, double[] sums)
    {
        for (int end = n; end > 0; end -= 4)
        {
            int j0 = Math.Max(0, end - 4), rows = end - j0;
            for (int b = 0; b < used; b += 4)
            {
                BlockedDots.RowsByVectors(u, n, j0, rows, end, n - end, v, b, sums);
                for (int c = 0; c < 4; c++)
                {
                    var y = v[b + c];
                    for (int rr = rows - 1; rr >= 0; rr--)
                    {
                        int j = j0 + rr, row = j * n;
                        double s = y[j] - sums[rr * 4 + c];
                        for (int q = j + 1; q < end; q++) s -= u[row + q] * y[q];
                        y[j] = s / u[row + j];
                    }
                }
            }
        }
    }

    /// <summary>quad[b] += rᵀ W r = Σ_j r_j (W_jj r_j + 2 Σ_(l&gt;j) W_jl r_l) for the first <paramref name="used"/>
    /// (a multiple of 4) vectors r of <paramref name="v"/>, W symmetric row-major n × n (upper part read).</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private static void QuadraticForms(double[] w, int n, double[][] v, int used, double[] sums, double[] quad)
    {
        for (int end = n; end > 0; end -= 4)
        {
            int j0 = Math.Max(0, end - 4), rows = end - j0;
            for (int b = 0; b < used; b += 4)
            {
                BlockedDots.RowsByVectors(w, n, j0, rows, end, n - end, v, b, sums);
                for (int c = 0; c < 4; c++)
                {
                    var y = v[b + c];
                    double total = 0;
                    for (int rr = 0; rr < rows; rr++)
                    {
                        int j = j0 + rr, row = j * n;
                        double s = sums[rr * 4 + c];
                        for (int q = j + 1; q < end; q++) s += w[row + q] * y[q];
                        total += y[j] * (w[row + j] * y[j] + 2 * s);
                    }
                    quad[b + c] += total;
                }
            }
        }
    }
}
