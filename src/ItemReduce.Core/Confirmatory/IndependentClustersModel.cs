using System.Runtime.CompilerServices;
namespace ItemReduce.Core.Confirmatory;

/// <summary>
/// The confirmatory model Σ = Λ Φ Λᵀ + Ψ with each item loading on exactly one factor (independent clusters): factor
/// variances fixed to 1, factor correlations free, unique variances free, item means free (saturated mean structure).
/// Parameter vector θ = (λ₁..λ_p, ψ₁..ψ_p, φ over factor pairs a &lt; b in row order, μ₁..μ_p).
/// </summary>
internal sealed class IndependentClustersModel
{
    /// <param name="itemFactor">0-based factor of each item.</param>
    /// <param name="factors">Number of factors k.</param>
    public IndependentClustersModel(int[] itemFactor, int factors)
    {
        ItemFactor = itemFactor;
        Factors = factors;
        Pairs = [.. from a in Enumerable.Range(0, factors) from b in Enumerable.Range(a + 1, factors - a - 1) select (a, b)];
    }

    public int[] ItemFactor { get; }
    public int Factors { get; }
    public int Items => ItemFactor.Length;
    public (int A, int B)[] Pairs { get; }

    /// <summary>Covariance parameters q = 2p + k(k−1)/2 (the means are not counted: they are saturated).</summary>
    public int CovarianceParameters => 2 * Items + Pairs.Length;

    /// <summary>All parameters including the p means.</summary>
    public int Parameters => CovarianceParameters + Items;

    [System.Diagnostics.CodeAnalysis.SuppressMessage("Performance", "CA1822", Justification = "An offset of this model's parameter vector, like its neighbours; it happens to start at 0.")]
    public int LoadingIndex(int j) => j;
    public int UniquenessIndex(int j) => Items + j;
    public int CorrelationIndex(int pair) => 2 * Items + pair;
    public int MeanIndex(int j) => CovarianceParameters + j;

    /// <summary>Φ (row-major k × k, unit diagonal).</summary>
    public double[] Phi(double[] theta)
    {
        int k = Factors;
        var phi = new double[k * k];
        for (int a = 0; a < k; a++) phi[a * k + a] = 1;
        for (int c = 0; c < Pairs.Length; c++)
        {
            var (a, b) = Pairs[c];
            phi[a * k + b] = phi[b * k + a] = theta[CorrelationIndex(c)];
        }
        return phi;
    }

    /// <summary>Model-implied covariance (row-major p × p).</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public double[] Sigma(double[] theta)
    {
        int p = Items, k = Factors;
        var phi = Phi(theta);
        var s = new double[p * p];
        for (int i = 0; i < p; i++)
            for (int j = 0; j < p; j++)
                s[i * p + j] = theta[i] * theta[j] * phi[ItemFactor[i] * k + ItemFactor[j]] + (i == j ? theta[UniquenessIndex(i)] : 0);
        return s;
    }

    /// <summary>The 2k non-unit vectors of the derivatives ∂Σ/∂θ (row-major 2k × p): c_f = Λ Φ e_f in row f
    /// (∂Σ/∂λ_j = e_j c_f(j)ᵀ + c_f(j) e_jᵀ) and column a of Λ in row k + a (∂Σ/∂φ_ab = Λ_a Λ_bᵀ + Λ_b Λ_aᵀ).</summary>
    public double[] DerivativeVectors(double[] theta)
    {
        int p = Items, k = Factors;
        var phi = Phi(theta);
        var z = new double[2 * k * p];
        for (int f = 0; f < k; f++)
            for (int l = 0; l < p; l++) z[f * p + l] = theta[l] * phi[f * k + ItemFactor[l]];
        for (int l = 0; l < p; l++) z[(k + ItemFactor[l]) * p + l] = theta[l];
        return z;
    }

    /// <summary>Means (p).</summary>
    public double[] Mu(double[] theta) => theta.AsSpan(CovarianceParameters, Items).ToArray();

    /// <summary>Chain rule: the gradient with respect to θ from the gradient with respect to each entry of Σ
    /// (<paramref name="gradSigma"/>, symmetric, p × p) and to μ.</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public double[] Gradient(double[] theta, double[] gradSigma, double[] gradMu)
    {
        int p = Items, k = Factors;
        var phi = Phi(theta);
        var g = new double[Parameters];
        for (int j = 0; j < p; j++)
        {
            double s = 0;
            for (int l = 0; l < p; l++) s += gradSigma[j * p + l] * theta[l] * phi[ItemFactor[j] * k + ItemFactor[l]];
            g[LoadingIndex(j)] = 2 * s;
            g[UniquenessIndex(j)] = gradSigma[j * p + j];
            g[MeanIndex(j)] = gradMu[j];
        }
        for (int c = 0; c < Pairs.Length; c++)
        {
            var (a, b) = Pairs[c];
            double s = 0;
            for (int i = 0; i < p; i++)
                if (ItemFactor[i] == a)
                    for (int j = 0; j < p; j++)
                        if (ItemFactor[j] == b) s += gradSigma[i * p + j] * theta[i] * theta[j];
            g[CorrelationIndex(c)] = 2 * s;
        }
        return g;
    }

    /// <summary>Jacobian ∂ vech Σ / ∂θ of the covariance parameters: row-major p* × q with vech in the order
    /// (0,0), (1,0), (1,1), (2,0), … (lower triangle by rows).</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public double[] CovarianceJacobian(double[] theta)
    {
        int p = Items, k = Factors, q = CovarianceParameters, ps = p * (p + 1) / 2;
        var phi = Phi(theta);
        var d = new double[ps * q];
        int r = 0;
        for (int a = 0; a < p; a++)
            for (int b = 0; b <= a; b++, r++)
            {
                double f = phi[ItemFactor[a] * k + ItemFactor[b]];
                d[r * q + LoadingIndex(a)] += theta[b] * f;
                d[r * q + LoadingIndex(b)] += theta[a] * f;
                if (a == b) d[r * q + UniquenessIndex(a)] = 1;
                for (int c = 0; c < Pairs.Length; c++)
                {
                    var (fa, fb) = Pairs[c];
                    if ((ItemFactor[a] == fa && ItemFactor[b] == fb) || (ItemFactor[a] == fb && ItemFactor[b] == fa))
                        d[r * q + CorrelationIndex(c)] = theta[a] * theta[b];
                }
            }
        return d;
    }
}
