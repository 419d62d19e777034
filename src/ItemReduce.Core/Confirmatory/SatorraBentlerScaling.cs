using System.Numerics;
using System.Runtime.CompilerServices;
using System.Runtime.InteropServices;
using System.Runtime.Intrinsics;
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
        // Blocks of respondents: each matrix row is read from memory once per block and reused from cache.
        const int block = 32;
        var rs = new double[block][];
        var ys = new double[block][];
        for (int b = 0; b < block; b++) (rs[b], ys[b]) = (new double[ps], new double[ps]);
        var gs = new double[block][];
        for (int b = 0; b < block; b++) gs[b] = new double[qc];
        var scratch = new double[data.RowWidth];
        var x = new double[p];
        var kr = new double[p];
        var dots = new double[block];
        var dots2 = new double[block];
        double t1 = 0, t2 = 0, t0 = 0;
        for (int i0 = 0; i0 < n; i0 += block)
        {
            int nb = Math.Min(block, n - i0), used = (nb + 3) & ~3;
            for (int b = 0; b < nb; b++)
            {
                int gi = data.PatternOf[i0 + b];
                data.ReadRow(i0 + b, scratch, x);
                NormalInformation.CovarianceScore(x, data.Patterns[gi].Observed, inverses[gi], mu1, ys[b], kr);
            }
            for (int b = nb; b < used; b++) Array.Clear(ys[b]);
            // Forward: L y = s (in place in ys).
            for (int j = 0; j < ps; j++)
            {
                Dots(l.AsSpan(j * ps, j), ys, 0, used, dots);
                double inv = 1 / l[j * ps + j];
                for (int b = 0; b < used; b++) ys[b][j] = (ys[b][j] - dots[b]) * inv;
            }
            // Backward: Lᵀ r = y, and in the same pass rᵀ W r = Σ_j r_j (W_jj r_j + 2 Σ_{l>j} W_jl r_l).
            for (int j = ps - 1; j >= 0; j--)
            {
                for (int b = 0; b < used; b += 4)
                    Dot4x2At(u.AsSpan(j * ps + j + 1, ps - j - 1), w.AsSpan(j * ps + j + 1, ps - j - 1), rs, b, j + 1, dots, dots2);
                double inv = 1 / u[j * ps + j], wjj = w[j * ps + j];
                for (int b = 0; b < used; b++) rs[b][j] = (ys[b][j] - dots[b]) * inv;
                for (int b = 0; b < nb; b++) t1 += rs[b][j] * (2 * dots2[b] + wjj * rs[b][j]);
            }
            // g = Δᵀ W r.
            for (int j = 0; j < qc; j++)
            {
                Dots(wdT.AsSpan(j * ps, ps), rs, 0, used, dots);
                for (int b = 0; b < nb; b++) gs[b][j] = dots[b];
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

    /// <summary>dots[b] = Σ_t a_t x_b[start + t] for the first <paramref name="rows"/> vectors (a multiple of 4).</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private static void Dots(ReadOnlySpan<double> a, double[][] x, int start, int rows, double[] dots)
    {
        for (int b = 0; b < rows; b += 4) Dot4At(a, x, b, start, a.Length, dots);
    }

    /// <summary>As <see cref="Dot4At"/> for two rows <paramref name="a"/> and <paramref name="c"/> at once (into
    /// <paramref name="dots"/> and <paramref name="dots2"/>), sharing the loads of the four vectors.</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private static void Dot4x2At(ReadOnlySpan<double> a, ReadOnlySpan<double> c, double[][] x, int first, int start, double[] dots, double[] dots2)
    {
        int length = a.Length;
        var x0 = x[first].AsSpan(start, length);
        var x1 = x[first + 1].AsSpan(start, length);
        var x2 = x[first + 2].AsSpan(start, length);
        var x3 = x[first + 3].AsSpan(start, length);
        double s0 = 0, s1 = 0, s2 = 0, s3 = 0, r0 = 0, r1 = 0, r2 = 0, r3 = 0;
        int t = 0;
        if (Vector512.IsHardwareAccelerated && length >= Vector512<double>.Count)
        {
            var va = MemoryMarshal.Cast<double, Vector512<double>>(a);
            var vc = MemoryMarshal.Cast<double, Vector512<double>>(c);
            var v0 = MemoryMarshal.Cast<double, Vector512<double>>(x0);
            var v1 = MemoryMarshal.Cast<double, Vector512<double>>(x1);
            var v2 = MemoryMarshal.Cast<double, Vector512<double>>(x2);
            var v3 = MemoryMarshal.Cast<double, Vector512<double>>(x3);
            Vector512<double> a0 = default, a1 = default, a2 = default, a3 = default, c0 = default, c1 = default, c2 = default, c3 = default;
            for (int v = 0; v < va.Length; v++)
            {
                var av = va[v];
                var cv = vc[v];
                var y0 = v0[v];
                var y1 = v1[v];
                var y2 = v2[v];
                var y3 = v3[v];
                a0 = Vector512.FusedMultiplyAdd(av, y0, a0);
                a1 = Vector512.FusedMultiplyAdd(av, y1, a1);
                a2 = Vector512.FusedMultiplyAdd(av, y2, a2);
                a3 = Vector512.FusedMultiplyAdd(av, y3, a3);
                c0 = Vector512.FusedMultiplyAdd(cv, y0, c0);
                c1 = Vector512.FusedMultiplyAdd(cv, y1, c1);
                c2 = Vector512.FusedMultiplyAdd(cv, y2, c2);
                c3 = Vector512.FusedMultiplyAdd(cv, y3, c3);
            }
            (s0, s1, s2, s3) = (Vector512.Sum(a0), Vector512.Sum(a1), Vector512.Sum(a2), Vector512.Sum(a3));
            (r0, r1, r2, r3) = (Vector512.Sum(c0), Vector512.Sum(c1), Vector512.Sum(c2), Vector512.Sum(c3));
            t = va.Length * Vector512<double>.Count;
        }
        for (; t < length; t++)
        {
            double av = a[t], cv = c[t];
            s0 += av * x0[t];
            s1 += av * x1[t];
            s2 += av * x2[t];
            s3 += av * x3[t];
            r0 += cv * x0[t];
            r1 += cv * x1[t];
            r2 += cv * x2[t];
            r3 += cv * x3[t];
        }
        (dots[first], dots[first + 1], dots[first + 2], dots[first + 3]) = (s0, s1, s2, s3);
        (dots2[first], dots2[first + 1], dots2[first + 2], dots2[first + 3]) = (r0, r1, r2, r3);
    }

    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private static void Dot4At(ReadOnlySpan<double> a, double[][] x, int first, int start, int length, double[] dots)
    {
        var x0 = x[first].AsSpan(start, length);
        var x1 = x[first + 1].AsSpan(start, length);
        var x2 = x[first + 2].AsSpan(start, length);
        var x3 = x[first + 3].AsSpan(start, length);
        a = a[..length];
        double s0 = 0, s1 = 0, s2 = 0, s3 = 0;
        int t = 0;
        if (Vector512.IsHardwareAccelerated && length >= Vector512<double>.Count)
        {
            var va = MemoryMarshal.Cast<double, Vector512<double>>(a);
            var v0 = MemoryMarshal.Cast<double, Vector512<double>>(x0);
            var v1 = MemoryMarshal.Cast<double, Vector512<double>>(x1);
            var v2 = MemoryMarshal.Cast<double, Vector512<double>>(x2);
            var v3 = MemoryMarshal.Cast<double, Vector512<double>>(x3);
            Vector512<double> a0 = default, a1 = default, a2 = default, a3 = default;
            for (int v = 0; v < va.Length; v++)
            {
                var av = va[v];
                a0 = Vector512.FusedMultiplyAdd(av, v0[v], a0);
                a1 = Vector512.FusedMultiplyAdd(av, v1[v], a1);
                a2 = Vector512.FusedMultiplyAdd(av, v2[v], a2);
                a3 = Vector512.FusedMultiplyAdd(av, v3[v], a3);
            }
            (s0, s1, s2, s3) = (Vector512.Sum(a0), Vector512.Sum(a1), Vector512.Sum(a2), Vector512.Sum(a3));
            t = va.Length * Vector512<double>.Count;
        }
        else if (Vector.IsHardwareAccelerated && length >= Vector<double>.Count)
        {
            var va = MemoryMarshal.Cast<double, Vector<double>>(a);
            var v0 = MemoryMarshal.Cast<double, Vector<double>>(x0);
            var v1 = MemoryMarshal.Cast<double, Vector<double>>(x1);
            var v2 = MemoryMarshal.Cast<double, Vector<double>>(x2);
            var v3 = MemoryMarshal.Cast<double, Vector<double>>(x3);
            Vector<double> a0 = default, a1 = default, a2 = default, a3 = default;
            for (int v = 0; v < va.Length; v++)
            {
                var av = va[v];
                a0 += av * v0[v];
                a1 += av * v1[v];
                a2 += av * v2[v];
                a3 += av * v3[v];
            }
            (s0, s1, s2, s3) = (Vector.Sum(a0), Vector.Sum(a1), Vector.Sum(a2), Vector.Sum(a3));
            t = va.Length * Vector<double>.Count;
        }
        for (; t < length; t++)
        {
            double av = a[t];
            s0 += av * x0[t];
            s1 += av * x1[t];
            s2 += av * x2[t];
            s3 += av * x3[t];
        }
        (dots[first], dots[first + 1], dots[first + 2], dots[first + 3]) = (s0, s1, s2, s3);
    }
}
