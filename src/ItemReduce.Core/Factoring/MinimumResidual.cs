using ItemReduce.Core.LinearAlgebra;
using MathNet.Numerics.LinearAlgebra;

namespace ItemReduce.Core.Factoring;

/// <summary>
/// Minimum residual (minres) factor extraction: Harman, H. H., &amp; Jones, W. H. (1966). Factor analysis by
/// minimizing residuals (minres). Psychometrika, 31(3), 351–368. Equivalent to unweighted least squares:
/// minimise ½‖R − ΛΛᵀ − Ψ‖²_F. Following the usual concentration of the criterion, for fixed uniquenesses
/// ψ the best Λ is the leading k eigenpairs of A = R − Ψ, leaving
/// F(ψ) = ½ Σ_{i&gt;k} eᵢ(A)² with ∂F/∂ψⱼ = −Σ_{i&gt;k} eᵢ vⱼᵢ² (first-order perturbation of eigenvalues).
/// F is minimised over ψ ∈ [lower bound, 1] (correlation metric) starting from 1 − SMC.
/// <para>
/// Only the leading k eigenpairs are computed (<see cref="SymmetricEigensolver.Leading"/>, Lanczos): since
/// Σᵢ eᵢ² = ‖A‖²_F and Σᵢ eᵢ vⱼᵢ² = A_jj, F(ψ) = ½(‖A‖²_F − Σ_{i≤k} eᵢ²) and ∂F/∂ψⱼ = −(A_jj − Σ_{i≤k} eᵢ vⱼᵢ²).
/// The criterion and gradient at one ψ share one decomposition.
/// </para>
/// </summary>
internal static class MinimumResidual
{
    public static ExtractionResult Extract(Matrix<double> r, int k, FactoringOptions o)
    {
        var cache = new LeadingPairsCache(r);
        return UniquenessSearch.Run(r, k, o,
            (_, psi, kk) => Criterion(cache.At(psi, kk), kk),
            (_, psi, kk) => Gradient(cache.At(psi, kk), kk),
            (_, psi, kk) => Loadings(cache.At(psi, kk), kk));
    }

    internal static double Criterion(Matrix<double> r, double[] psi, int k) => Criterion(new LeadingPairsCache(r).At(psi, k), k);

    internal static double[] Gradient(Matrix<double> r, double[] psi, int k) => Gradient(new LeadingPairsCache(r).At(psi, k), k);

    internal static Matrix<double> LoadingsFor(Matrix<double> r, double[] psi, int k) => Loadings(new LeadingPairsCache(r).At(psi, k), k);

    private static double Criterion(LeadingPairs e, int k)
    {
        double s = e.FrobeniusSquared;
        for (int i = 0; i < k; i++) s -= e.Values[i] * e.Values[i];
        return 0.5 * Math.Max(s, 0);
    }

    private static double[] Gradient(LeadingPairs e, int k)
    {
        int p = e.Diagonal.Length;
        var g = new double[p];
        for (int j = 0; j < p; j++)
        {
            double s = e.Diagonal[j];
            for (int i = 0; i < k; i++) { double v = e.Vectors[i * p + j]; s -= e.Values[i] * v * v; }
            g[j] = -s;
        }
        return g;
    }

    /// <summary>Loadings Vₖ · diag(sqrt(max(eₖ, 0))).</summary>
    private static Matrix<double> Loadings(LeadingPairs e, int k)
    {
        int p = e.Diagonal.Length;
        var l = Matrix<double>.Build.Dense(p, k);
        for (int f = 0; f < k; f++)
        {
            double s = Math.Sqrt(Math.Max(e.Values[f], 0.0));
            for (int j = 0; j < p; j++) l[j, f] = e.Vectors[f * p + j] * s;
        }
        return l;
    }

    /// <summary>Leading eigenpairs of R − Ψ (values descending, vectors as rows), its diagonal and ‖R − Ψ‖²_F.</summary>
    private sealed record LeadingPairs(double[] Values, double[] Vectors, double[] Diagonal, double FrobeniusSquared);

    /// <summary>The decomposition at the last ψ asked for (the optimiser asks for F and ∇F at the same point).</summary>
    private sealed class LeadingPairsCache(Matrix<double> r)
    {
        private readonly double[] _r = r.ToRowMajorArray();
        private readonly int _p = r.RowCount;
        private double[]? _psi;
        private int _k;
        private LeadingPairs? _last;

        public LeadingPairs At(double[] psi, int k)
        {
            if (_last is not null && _k == k && psi.AsSpan().SequenceEqual(_psi)) return _last;
            int p = _p;
            var a = (double[])_r.Clone();
            var diag = new double[p];
            for (int j = 0; j < p; j++) diag[j] = a[j * p + j] -= psi[j];
            var (values, vectors) = SymmetricEigensolver.Leading(a, p, k);
            _psi = (double[])psi.Clone();
            _k = k;
            return _last = new LeadingPairs(values, vectors, diag, VectorKernels.Dot(a, a));
        }
    }
}
