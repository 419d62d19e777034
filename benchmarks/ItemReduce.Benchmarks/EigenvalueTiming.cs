using System.Diagnostics;
using System.Globalization;
using ItemReduce.Core.Dimensions;
using ItemReduce.Core.LinearAlgebra;
using ItemReduce.Core.Randomness;

namespace ItemReduce.Benchmarks;

/// <summary>
/// Where one parallel-analysis replicate and one comparison-data sample spend their CPU at p items and n respondents:
/// best-of-R CPU time per call (one thread; each timing covers calls until a quarter second of CPU has passed) of the
/// Wishart correlation draw (identity and general scale), the squared multiple correlations, the tridiagonal reduction,
/// the tridiagonal eigenvalue step and the whole eigenvalue call. Prints one line per part:
/// <c>part p best_cpu_ms</c>. Not a BenchmarkDotNet job: it is meant to be run beside other work and read as ratios.
/// </summary>
internal static class EigenvalueTiming
{
    public static void Run(int[] ps, int respondents, int repeats)
    {
        foreach (int p in ps)
        {
            int df = respondents - 1;
            var rng = new RandomStream(7);
            var l = new double[p * p];
            var a = new double[p * p];
            var r = new double[p * p];
            BartlettWishartSampler.SampleCorrelationInto(p, df, rng, l, r);
            var chol = PopulationFactor(p);
            var scratch = new double[p * p];
            var work = new double[p * p];
            var smc = new double[p];
            var d = new double[p];
            var e = new double[p];
            var tri = new double[SymmetricEigensolver.EigenvaluesWorkLength(p)];
            var d0 = new double[p];
            var e0 = new double[p];
            Array.Copy(r, scratch, r.Length);
            SymmetricEigensolver.HouseholderTridiagonalize(scratch, p, d0, e0, null, tri);

            Report("draw-normal", p, repeats, () => BartlettWishartSampler.SampleCorrelationInto(p, df, rng, l, a));
            Report("draw-comparison", p, repeats, () => BartlettWishartSampler.SampleCorrelationInto(p, df, chol, rng, l, a, work));
            Report("copy", p, repeats, () => Array.Copy(r, scratch, r.Length));
            Report("smc", p, repeats, () =>
            {
                Array.Copy(r, scratch, r.Length);
                SquaredMultipleCorrelation.FromRowMajor(scratch, p, work, smc);
            });
            Report("tridiagonal-reduction", p, repeats, () =>
            {
                Array.Copy(r, scratch, r.Length);
                SymmetricEigensolver.HouseholderTridiagonalize(scratch, p, d, e, null, tri);
            });
            Report("tridiagonal-reduction-blocked", p, repeats, () =>
            {
                Array.Copy(r, scratch, r.Length);
                BlockedHouseholderTridiagonalization.Reduce(scratch, p, d, e, tri);
            });
            var uvec = new double[p];
            var yvec = new double[p];
            for (int k = 0; k < p; k++) uvec[k] = 1.0 / (k + 1);
            Report("matrix-vector-sweep", p, repeats, () =>
            {
                for (int m = p - 1; m >= 1; m--) BlockedHouseholderTridiagonalization.SymmetricLowerTimesVector(r, p, m, uvec, yvec);
            });
            var wpanel = new double[BlockedHouseholderTridiagonalization.PanelWidth * p];
            Report("rank-2k-sweep", p, repeats, () =>
            {
                Array.Copy(r, scratch, r.Length);
                int nb = BlockedHouseholderTridiagonalization.PanelWidth;
                for (int m = p - nb; m >= nb; m -= nb)
                    BlockedHouseholderTridiagonalization.SymmetricRank2kLower(scratch, p, m, wpanel, wpanel, nb);
            });
            Report("tridiagonal-eigenvalues-root-free", p, repeats, () =>
            {
                Array.Copy(d0, d, p);
                Array.Copy(e0, e, p);
                PalWalkerKahanQl.Eigenvalues(d, e, p);
            });
            Report("tridiagonal-eigenvalues", p, repeats, () =>
            {
                Array.Copy(d0, d, p);
                Array.Copy(e0, e, p);
                SymmetricEigensolver.ImplicitQl(d, e, null, p);
            });
            Report("eigenvalues", p, repeats, () =>
            {
                Array.Copy(r, scratch, r.Length);
                SymmetricEigensolver.EigenvaluesInPlace(scratch, p, d, e, tri);
            });
        }
    }

    /// <summary>Lower Cholesky factor of a 12-factor population correlation matrix (loadings 0.4–0.8, invented).</summary>
    private static double[] PopulationFactor(int p)
    {
        var c = new double[p * p];
        for (int i = 0; i < p; i++)
            for (int j = 0; j < p; j++)
            {
                double li = 0.4 + 0.4 * (i % 7) / 6.0, lj = 0.4 + 0.4 * (j % 7) / 6.0;
                c[i * p + j] = i == j ? 1 : (i % 12 == j % 12 ? li * lj : 0.05 * li * lj);
            }
        CholeskyDecomposition.FactorInPlace(c, p);
        return c;
    }

    private static void Report(string part, int p, int repeats, Action call)
    {
        call();
        double best = double.PositiveInfinity;
        using var process = Process.GetCurrentProcess();
        for (int rep = 0; rep < repeats; rep++)
        {
            process.Refresh();
            var cpu = process.TotalProcessorTime;
            int calls = 0;
            double used;
            do
            {
                call();
                calls++;
                process.Refresh();
                used = (process.TotalProcessorTime - cpu).TotalSeconds;
            } while (used < 0.25);
            best = Math.Min(best, used / calls);
        }
        Console.WriteLine(string.Create(CultureInfo.InvariantCulture, $"{part} {p} {best * 1e3:0.000}"));
    }
}
