namespace ItemReduce.Core.Correlation;

/// <summary>
/// The two-step maximum-likelihood polychoric estimate of Olsson (1979) for tables near independence, with the cell
/// probabilities written as Pearson's tetrachoric series: Pearson, K. (1900), "Mathematical contributions to the theory
/// of evolution. VII. On the correlation of characters not quantitatively measurable", Philosophical Transactions of the
/// Royal Society A 195, 1–47:
/// Φ₂(a, b; ρ) = Φ(a)Φ(b) + Σ_{k ≥ 1} ρᵏ / k! · φ(a)He_{k−1}(a) · φ(b)He_{k−1}(b), with He the (probabilists') Hermite
/// polynomials. A cell's probability is the rectangle difference of Φ₂, so with α_ik = Δ_i[φ He_{k−1}] over row i's
/// threshold interval and β_jk likewise, π_ij(ρ) = p_i q_j + Σ_k ρᵏ/k! α_ik β_jk, and its first and second derivatives in
/// ρ follow term by term. The estimate maximises ln L = Σ n_ij ln π_ij(ρ) (Olsson eq. 4) by Newton's method from ρ = 0
/// with these exact derivatives.
/// <para>
/// The series converges for |ρ| &lt; 1 and fast near 0; terms are added until they fall below 10⁻¹⁷ of the smallest cell
/// probability (common practice, no source). Used only for |ρ| ≤ <see cref="MaxRho"/>, where the log-likelihood of an
/// ordinary table is concave; when the estimate leaves that range, Newton's method does not settle, or a cell's
/// probability is not positive, the result is null and the caller takes the general path
/// (<see cref="PolychoricCorrelation.FromTable"/>). It serves tables of permuted (independent) items, whose estimates
/// lie near 0.
/// </para>
/// </summary>
internal static class TetrachoricSeries
{
    /// <summary>Largest |ρ| the series path returns.</summary>
    internal const double MaxRho = 0.3;

    /// <summary>Most terms of the series that are prepared (0.3⁶⁰ ≈ 4·10⁻³², far below any cell probability that counts).</summary>
    internal const int MaxTerms = 60;

    private const int MaxIterations = 50;

    private static readonly double[] InverseFactorial = MakeInverseFactorials();

    private static double[] MakeInverseFactorials()
    {
        var f = new double[MaxTerms + 1];
        f[0] = 1;
        for (int k = 1; k <= MaxTerms; k++) f[k] = f[k - 1] / k;
        return f;
    }

    /// <summary>Differences α[(k − 1)·c + i] = g_k(τ_{i+1}) − g_k(τ_i), k = 1 … <see cref="MaxTerms"/>, of
    /// g_k(τ) = φ(τ) He_{k−1}(τ) over the c categories of thresholds <paramref name="tau"/> (length c + 1, τ_0 = −∞,
    /// τ_c = +∞, where g_k = 0).</summary>
    internal static double[] Differences(double[] tau)
    {
        int c = tau.Length - 1;
        var g = new double[MaxTerms * (c + 1)];   // g[(k − 1)(c + 1) + m] at threshold m
        for (int m = 1; m < c; m++)
        {
            double x = tau[m];
            double phi = Math.Exp(-0.5 * x * x) / Math.Sqrt(2 * Math.PI);
            double hPrev = 1, h = x; // He_0, He_1
            g[m] = phi;              // k = 1: He_0 = 1
            for (int k = 2; k <= MaxTerms; k++)
            {
                g[(k - 1) * (c + 1) + m] = phi * h;
                double next = x * h - (k - 1) * hPrev; // He_k = x He_{k−1} − (k − 1) He_{k−2}
                hPrev = h;
                h = next;
            }
        }
        var alpha = new double[MaxTerms * c];
        for (int k = 0; k < MaxTerms; k++)
            for (int i = 0; i < c; i++)
                alpha[k * c + i] = g[k * (c + 1) + i + 1] - g[k * (c + 1) + i];
        return alpha;
    }

    /// <summary>The ML estimate for the <paramref name="rows"/> × <paramref name="cols"/> table <paramref name="n"/>
    /// (row-major, no empty row or column) with marginal proportions <paramref name="p"/>, <paramref name="q"/> and the
    /// differences <paramref name="alpha"/>, <paramref name="beta"/> of <see cref="Differences"/> for the thresholds
    /// taken from the same margins; null when the series path does not apply (see the type summary).</summary>
    internal static double? Estimate(ReadOnlySpan<int> n, int rows, int cols, ReadOnlySpan<double> p, ReadOnlySpan<double> q,
        ReadOnlySpan<double> alpha, ReadOnlySpan<double> beta)
    {
        double smallest = double.PositiveInfinity;
        for (int i = 0; i < rows; i++)
            for (int j = 0; j < cols; j++)
                if (n[i * cols + j] > 0) smallest = Math.Min(smallest, p[i] * q[j]);
        // β transposed so that each cell's sums over k run over contiguous memory.
        Span<double> bt = stackalloc double[cols * MaxTerms];
        for (int k = 0; k < MaxTerms; k++)
            for (int j = 0; j < cols; j++) bt[j * MaxTerms + k] = beta[k * cols + j];
        Span<double> c0 = stackalloc double[MaxTerms], c1 = stackalloc double[MaxTerms], c2 = stackalloc double[MaxTerms];
        Span<double> a0 = stackalloc double[MaxTerms], a1 = stackalloc double[MaxTerms], a2 = stackalloc double[MaxTerms];
        double rho = 0;
        for (int iteration = 0; iteration < MaxIterations; iteration++)
        {
            int terms = Terms(rho, smallest, rows, cols, alpha, beta);
            if (terms < 0) return null;
            // Coefficients of term k (index k − 1) in π, dπ/dρ and d²π/dρ²: ρᵏ/k!, ρᵏ⁻¹/(k − 1)!, ρᵏ⁻²/(k − 2)!.
            double power = 1; // ρ^(k−1)
            for (int k = 1; k <= terms; k++)
            {
                c1[k - 1] = power * InverseFactorial[k - 1];
                c0[k - 1] = power * rho * InverseFactorial[k];
                c2[k - 1] = k >= 2 ? c1[k - 2] : 0;
                power *= rho;
            }
            double score = 0, curvature = 0;
            for (int i = 0; i < rows; i++)
            {
                for (int k = 0; k < terms; k++)
                {
                    double a = alpha[k * rows + i];
                    a0[k] = a * c0[k];
                    a1[k] = a * c1[k];
                    a2[k] = a * c2[k];
                }
                for (int j = 0; j < cols; j++)
                {
                    int count = n[i * cols + j];
                    if (count == 0) continue;
                    var b = bt.Slice(j * MaxTerms, terms);
                    double pi = p[i] * q[j], d1 = 0, d2 = 0;
                    for (int k = 0; k < b.Length; k++)
                    {
                        pi += a0[k] * b[k];
                        d1 += a1[k] * b[k];
                        d2 += a2[k] * b[k];
                    }
                    if (!(pi > 0)) return null;
                    double u = d1 / pi;
                    score += count * u;
                    curvature += count * (d2 / pi - u * u);
                }
            }
            if (!(curvature < 0)) return null;
            double step = score / curvature;
            rho -= step;
            if (!(Math.Abs(rho) <= MaxRho)) return null;
            // Newton's method converges quadratically here: after a step of 1e-10 the error is of order 1e-20.
            if (Math.Abs(step) <= 1e-10) return rho;
        }
        return null;
    }

    /// <summary>Terms needed at ρ: the first k whose largest possible term max|α_k|·max|β_k|/k!·|ρ|ᵏ falls below
    /// 10⁻¹⁷ of the smallest cell probability; −1 if <see cref="MaxTerms"/> are not enough.</summary>
    private static int Terms(double rho, double smallest, int rows, int cols, ReadOnlySpan<double> alpha, ReadOnlySpan<double> beta)
    {
        double r = Math.Abs(rho), power = 1, limit = 1e-17 * smallest;
        for (int k = 1; k <= MaxTerms; k++)
        {
            power *= r;
            double a = 0, b = 0;
            for (int i = 0; i < rows; i++) a = Math.Max(a, Math.Abs(alpha[(k - 1) * rows + i]));
            for (int j = 0; j < cols; j++) b = Math.Max(b, Math.Abs(beta[(k - 1) * cols + j]));
            if (a * b * InverseFactorial[k] * power < limit && k >= 2) return k;
        }
        return -1;
    }
}
