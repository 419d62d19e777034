using ItemReduce.Core.Correlation;
using ItemReduce.Core.Dimensions;
using ItemReduce.Core.Factoring;
using ItemReduce.Core.LinearAlgebra;
using ItemReduce.Simulation;
using MathNet.Numerics.LinearAlgebra;

namespace ItemReduce.Tests.Core.Dimensions;

/// <summary>
/// The k-factor minimum-residual fits behind comparison data and the Hull method take only the k leading eigenpairs of
/// R − Ψ (Lanczos). These tests refit the same models the way the code did before, from the full eigendecomposition of
/// R − Ψ at every step, and check that the rules decide the same on realistic surveys.
/// </summary>
public class LeadingEigenpairDecisionTests
{
    /// <summary>Minres from the full spectrum: F = ½ Σ_{i&gt;k} eᵢ², ∂F/∂ψⱼ = −Σ_{i&gt;k} eᵢ vⱼᵢ² (Harman &amp; Jones, 1966),
    /// every eigenpair from <see cref="SymmetricEigensolver.Decompose"/>; same optimiser and start as the code.</summary>
    private static Matrix<double> FullSpectrumMinres(Matrix<double> r, int k)
    {
        (double[] E, double[,] V) Decompose(double[] psi)
        {
            var a = r.ToArray();
            for (int j = 0; j < psi.Length; j++) a[j, j] -= psi[j];
            return SymmetricEigensolver.Decompose(a);
        }
        double Criterion(double[] psi)
        {
            var (e, _) = Decompose(psi);
            double s = 0;
            for (int i = k; i < e.Length; i++) s += e[i] * e[i];
            return 0.5 * s;
        }
        double[] Gradient(double[] psi)
        {
            var (e, v) = Decompose(psi);
            var g = new double[psi.Length];
            for (int i = k; i < e.Length; i++)
                for (int j = 0; j < psi.Length; j++) g[j] -= e[i] * v[j, i] * v[j, i];
            return g;
        }
        Matrix<double> Loadings(double[] psi)
        {
            var (e, v) = Decompose(psi);
            return Matrix<double>.Build.Dense(psi.Length, k, (j, f) => v[j, f] * Math.Sqrt(Math.Max(e[f], 0)));
        }
        return UniquenessSearch.Run(r, k, new FactoringOptions(), (_, psi, _) => Criterion(psi), (_, psi, _) => Gradient(psi),
            (_, psi, _) => Loadings(psi)).Loadings;
    }

    public static TheoryData<int, int, double, ulong> Surveys => new()
    {
        // factors, items per factor, factor correlation, seed: ordinal skewed items, 5 % missing answers, careless
        // respondents, n = 5 × items (the project's realistic-data rule).
        { 3, 8, 0.3, 31 },
        { 5, 6, 0.4, 32 },
        { 2, 10, 0.5, 33 },
    };

    [Theory]
    [MemberData(nameof(Surveys))]
    public void Comparison_data_and_Hull_decide_as_with_the_full_spectrum(int factors, int perFactor, double phi, ulong seed)
    {
        int p = factors * perFactor;
        var spec = FactorModelSpec.Simple(factors, perFactor, 0.6, phi, categories: 5) with
        {
            CategoryProbabilities = [0.35, 0.3, 0.2, 0.1, 0.05],
        };
        var data = FactorModelSimulator.Generate(spec,
            new FactorModelSimulator.Settings(5 * p, seed, MissingRate: 0.05, RandomResponders: p / 8, StraightLiners: 2)).Responses;
        var r = NearestCorrelationMatrix.Find(new CorrelationOptions().Compute(data, 1)).Matrix;
        var eigen = SymmetricEigensolver.Eigenvalues(r);
        var rm = Matrix<double>.Build.DenseOfArray(r);
        var full = new Dictionary<int, Matrix<double>>();
        Matrix<double> Full(int k) => full.TryGetValue(k, out var l) ? l : full[k] = FullSpectrumMinres(rm, k);
        var leading = new MinimumResidualFits(r);
        var options = new ComparisonDataOptions { Samples = 60, Seed = seed };

        var cdLeading = ComparisonData.Run(r, eigen, 5 * p, options, leading.Loadings);
        var cdFull = ComparisonData.Run(r, eigen, 5 * p, options, Full);
        Assert.Equal(cdFull.Count, cdLeading.Count);
        Assert.Equal(cdFull.MeanRmsr.Length, cdLeading.MeanRmsr.Length);
        for (int i = 0; i < cdFull.MeanRmsr.Length; i++) Assert.Equal(cdFull.MeanRmsr[i], cdLeading.MeanRmsr[i], 1e-6);

        var hullLeading = HullMethod.Run(r, factors + 3, leading.Loadings);
        var hullFull = HullMethod.Run(r, factors + 3, Full);
        Assert.Equal(hullFull.Count, hullLeading.Count);
        for (int m = 0; m < hullFull.Fit.Length; m++) Assert.Equal(hullFull.Fit[m], hullLeading.Fit[m], 1e-6);

        // The fitted loadings themselves agree within the optimiser's tolerance (1e-6 on the projected gradient).
        for (int k = 1; k <= factors + 1; k++)
        {
            var a = leading.Loadings(k);
            var b = Full(k);
            for (int j = 0; j < p; j++)
                for (int f = 0; f < k; f++) Assert.True(Math.Abs(a[j, f] - b[j, f]) < 1e-4, $"k = {k}: loading [{j},{f}] {a[j, f]} vs {b[j, f]}");
        }
    }
}
