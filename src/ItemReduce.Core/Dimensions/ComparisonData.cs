using ItemReduce.Core.Factoring;
using ItemReduce.Core.LinearAlgebra;
using ItemReduce.Core.Randomness;

namespace ItemReduce.Core.Dimensions;

/// <summary>Settings of <see cref="ComparisonData"/>.</summary>
public sealed record ComparisonDataOptions
{
    /// <summary>Samples drawn from each comparison population; default 250, range [20, 100000]. Ruscio &amp; Roche
    /// (2012) drew 500; the spread of a mean RMSR over 250 samples is already small next to the differences tested.</summary>
    public int Samples { get; init; } = 250;

    /// <summary>Significance level of the one-sided Mann–Whitney test of "k factors fit better than k − 1";
    /// default 0.30 as in Ruscio &amp; Roche (2012), range (0, 1).</summary>
    public double Alpha { get; init; } = 0.30;

    /// <summary>Seed; sample s of the k-factor population uses <c>RandomStream.ForTask(Seed, (k − 1)·Samples + s, purpose)</c>.</summary>
    public ulong Seed { get; init; } = 1;

    /// <summary>Thread cap (−1 = all cores). Results do not depend on it.</summary>
    public int MaxDegreeOfParallelism { get; init; } = -1;

    internal void Validate()
    {
        if (Samples is < 20 or > 100_000)
            throw new ArgumentException($"Samples must lie in [20, 100000], got {Samples}.", nameof(Samples));
        if (!(Alpha > 0 && Alpha < 1))
            throw new ArgumentException($"Alpha must lie in (0, 1), got {Alpha}.", nameof(Alpha));
        if (MaxDegreeOfParallelism == 0 || MaxDegreeOfParallelism < -1)
            throw new ArgumentException($"MaxDegreeOfParallelism must be −1 or ≥ 1, got {MaxDegreeOfParallelism}.", nameof(MaxDegreeOfParallelism));
    }
}

/// <summary>Outcome of <see cref="ComparisonData"/>.</summary>
/// <param name="Count">Number of factors retained (≥ 1).</param>
/// <param name="MeanRmsr">Fit curve: entry k − 1 is the mean, over the samples, of the root mean squared difference
/// between the sample eigenvalues of the k-factor comparison population and the observed eigenvalues, for every k
/// that was tried (k = 1 .. <c>MeanRmsr.Length</c>).</param>
/// <param name="PValues">Entry k − 1 is the one-sided Mann–Whitney p-value of "k factors fit better than k − 1" for
/// k ≥ 2 (entry 0 is NaN); same length as <paramref name="MeanRmsr"/>.</param>
/// <param name="Samples">Samples per comparison population.</param>
/// <param name="Alpha">Significance level used.</param>
public sealed record ComparisonDataResult(int Count, double[] MeanRmsr, double[] PValues, int Samples, double Alpha);

/// <summary>
/// Comparison data: Ruscio, J., &amp; Roche, B. (2012). Determining the number of factors to retain in an exploratory
/// factor analysis using comparison data of known factorial structure. Psychological Assessment, 24(2), 282–292.
/// For k = 1, 2, …: build a comparison population with exactly k common factors that reproduces the observed
/// correlation matrix as well as k factors can, draw samples of the observed size from it, and measure how far each
/// sample's eigenvalues lie from the observed eigenvalues (root mean squared residual over all p eigenvalues). Stop at
/// the first k whose fit is not significantly better than that of k − 1 (one-sided Mann–Whitney U test at α = .30)
/// and retain k − 1.
/// <para>
/// Our fast path (a deliberate difference from the paper, checked in the simulation study under
/// <c>benchmarks/dimensions-study</c>): Ruscio &amp; Roche generate a finite population of 10,000 cases with the
/// observed items' marginal distributions and resample it. Here the k-factor population is the multivariate normal
/// N(0, Σ_k), Σ_k = ΛΛᵀ + Ψ with Λ the k-factor minimum-residual loadings of the observed matrix
/// (<see cref="MinimumResidual"/>) and Ψ = I − diag(ΛΛᵀ), and a sample correlation matrix of n respondents is drawn
/// directly as a scaled Wishart(Σ_k, n − 1) matrix (<see cref="BartlettWishartSampler"/>), so a sample costs O(p³)
/// whatever n is. With polychoric correlations, Σ_k is the latent (normal) correlation structure; the sampling spread
/// of polychoric estimates is somewhat larger than this (see the study).
/// </para>
/// </summary>
public static class ComparisonData
{
    internal const ulong Purpose = 0x434F4D50; // "COMP"

    /// <summary>Communalities of the comparison population are capped here so that Σ_k stays positive definite.</summary>
    internal const double MaxCommunality = 0.995;

    /// <summary>Runs the procedure on the observed correlation matrix <paramref name="correlation"/> (p × p, positive
    /// definite) and its descending <paramref name="eigenvalues"/>, for <paramref name="respondents"/> respondents.</summary>
    /// <exception cref="ArgumentException">p &lt; 3, respondents ≤ p, mismatched lengths or invalid options.</exception>
    public static ComparisonDataResult Run(double[,] correlation, IReadOnlyList<double> eigenvalues, int respondents, ComparisonDataOptions options)
        => Run(correlation, eigenvalues, respondents, options, null);

    /// <summary>As the public overload; <paramref name="loadings"/> supplies the k-factor minimum-residual loadings of
    /// <paramref name="correlation"/> (shared with other rules), or null to fit them here.</summary>
    internal static ComparisonDataResult Run(double[,] correlation, IReadOnlyList<double> eigenvalues, int respondents, ComparisonDataOptions options,
        Func<int, MathNet.Numerics.LinearAlgebra.Matrix<double>>? loadings)
    {
        ArgumentNullException.ThrowIfNull(correlation);
        ArgumentNullException.ThrowIfNull(eigenvalues);
        ArgumentNullException.ThrowIfNull(options);
        options.Validate();
        int p = correlation.GetLength(0);
        if (p < 3) throw new DataConditionException($"Comparison data needs at least 3 items, got {p}.", nameof(correlation));
        if (eigenvalues.Count != p) throw new ArgumentException($"Expected {p} eigenvalues, got {eigenvalues.Count}.", nameof(eigenvalues));
        if (respondents <= p) throw new DataConditionException($"Comparison data needs more respondents than items; got n = {respondents}, p = {p}.", nameof(respondents));

        var observed = eigenvalues.ToArray();
        int maxK = MaxFactors(p);
        var rmsr = new List<double[]>();
        var means = new List<double>();
        var pValues = new List<double>();
        loadings ??= new MinimumResidualFits(correlation).Loadings;
        for (int k = 1; k <= maxK; k++)
        {
            var chol = PopulationFactor(loadings(k), p);
            var fit = SampleFit(chol, p, respondents - 1, observed, k, options);
            rmsr.Add(fit);
            means.Add(fit.Average());
            if (k == 1) { pValues.Add(double.NaN); continue; }
            double pv = MannWhitneyUTest.PValueLess(fit, rmsr[k - 2]);
            pValues.Add(pv);
            if (pv >= options.Alpha)
                return new ComparisonDataResult(k - 1, [.. means], [.. pValues], options.Samples, options.Alpha);
        }
        return new ComparisonDataResult(maxK, [.. means], [.. pValues], options.Samples, options.Alpha);
    }

    /// <summary>Largest k tried: below p, and with a positive count of degrees of freedom of the k-factor model,
    /// ((p − k)² − (p + k))/2 &gt; 0 (the Ledermann bound), and at least 1.</summary>
    internal static int MaxFactors(int p)
    {
        int k = 1;
        while (k + 1 < p && (p - (k + 1)) * (p - (k + 1)) - (p + k + 1) > 0) k++;
        return k;
    }

    /// <summary>Σ_k of the k-factor comparison population (unit diagonal), as a full p × p array.</summary>
    internal static double[,] Population(MathNet.Numerics.LinearAlgebra.Matrix<double> r, int k) =>
        Population(MinimumResidual.Extract(r, k, new FactoringOptions()).Loadings);

    /// <summary>Σ = ΛΛᵀ with unit diagonal from p × k loadings (communalities capped at <see cref="MaxCommunality"/>).</summary>
    internal static double[,] Population(MathNet.Numerics.LinearAlgebra.Matrix<double> lambda)
    {
        int p = lambda.RowCount, k = lambda.ColumnCount;
        var sigma = new double[p, p];
        var scale = new double[p];
        for (int j = 0; j < p; j++)
        {
            double h2 = 0;
            for (int f = 0; f < k; f++) h2 += lambda[j, f] * lambda[j, f];
            scale[j] = h2 > MaxCommunality ? Math.Sqrt(MaxCommunality / h2) : 1.0;
        }
        for (int i = 0; i < p; i++)
        {
            for (int j = 0; j < i; j++)
            {
                double s = 0;
                for (int f = 0; f < k; f++) s += lambda[i, f] * lambda[j, f];
                sigma[i, j] = sigma[j, i] = s * scale[i] * scale[j];
            }
            sigma[i, i] = 1;
        }
        return sigma;
    }

    /// <summary>Lower Cholesky factor (row-major) of Σ_k from its loadings.</summary>
    private static double[] PopulationFactor(MathNet.Numerics.LinearAlgebra.Matrix<double> lambda, int p)
    {
        var c = MatrixChecks.ToRowMajor(Population(lambda));
        CholeskyDecomposition.FactorInPlace(c, p);
        return c;
    }

    /// <summary>RMSR between each sample's eigenvalues and the observed ones, one value per sample.</summary>
    private static double[] SampleFit(double[] chol, int p, int df, double[] observed, int k, ComparisonDataOptions o)
    {
        var fit = new double[o.Samples];
        var po = new ParallelOptions { MaxDegreeOfParallelism = o.MaxDegreeOfParallelism };
        long first = (long)(k - 1) * o.Samples;
        Parallel.For(0, o.Samples, po, () => new Buffers(p), (s, _, b) =>
        {
            var rng = RandomStream.ForTask(o.Seed, first + s, Purpose);
            BartlettWishartSampler.SampleCorrelationInto(p, df, chol, rng, b.L, b.A, b.W);
            var e = SymmetricEigensolver.EigenvaluesInPlace(b.W, p, b.D, b.E, b.Tri);
            fit[s] = Rmsr(e, observed);
            return b;
        }, _ => { });
        return fit;
    }

    /// <summary>Root mean squared difference of two equally long eigenvalue vectors.</summary>
    internal static double Rmsr(IReadOnlyList<double> a, IReadOnlyList<double> b)
    {
        double s = 0;
        for (int j = 0; j < a.Count; j++) { double d = a[j] - b[j]; s += d * d; }
        return Math.Sqrt(s / a.Count);
    }

    private sealed class Buffers(int p)
    {
        public double[] L { get; } = new double[p * p];
        public double[] A { get; } = new double[p * p];
        public double[] W { get; } = new double[p * p];
        public double[] D { get; } = new double[p];
        public double[] E { get; } = new double[p];
        public double[] Tri { get; } = new double[SymmetricEigensolver.EigenvaluesWorkLength(p)];
    }
}

/// <summary>k-factor minimum-residual loadings of one correlation matrix, each k fitted once on first request.</summary>
internal sealed class MinimumResidualFits(double[,] correlation)
{
    private readonly MathNet.Numerics.LinearAlgebra.Matrix<double> _r = MatrixHelpers.ToMatrix(correlation);
    private readonly Dictionary<int, MathNet.Numerics.LinearAlgebra.Matrix<double>> _fits = [];

    /// <summary>Unrotated p × k loadings (<see cref="MinimumResidual"/>, default options).</summary>
    public MathNet.Numerics.LinearAlgebra.Matrix<double> Loadings(int k)
    {
        if (!_fits.TryGetValue(k, out var l)) _fits[k] = l = MinimumResidual.Extract(_r, k, new FactoringOptions()).Loadings;
        return l;
    }
}
