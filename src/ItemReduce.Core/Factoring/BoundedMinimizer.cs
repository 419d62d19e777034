using MathNet.Numerics.LinearAlgebra;
using MathNet.Numerics.Optimization;

namespace ItemReduce.Core.Factoring;

/// <summary>
/// Box-constrained minimisation of the concentrated minres / ML criteria over the uniquenesses.
/// Uses MathNet's limited-memory BFGS-B; if it stops without convergence or fails in its line search, a
/// spectral projected-gradient descent (Birgin, Martínez &amp; Raydan, 2000, "Nonmonotone spectral projected
/// gradient methods on convex sets", SIAM J. Optim. 10(4), 1196–1211; monotone Armijo variant here)
/// continues from the best point found.
/// </summary>
internal static class BoundedMinimizer
{
    public readonly record struct Outcome(double[] Point, double Value, bool Converged, int Iterations);

    public static Outcome Minimize(
        Func<double[], double> f, Func<double[], double[]> gradient,
        double[] start, double lower, double upper, double tolerance, int maxIterations)
    {
        int p = start.Length;
        var x0 = Project(start, lower, upper);
        int used = 0;
        try
        {
            var objective = ObjectiveFunction.Gradient(
                v => f(v.ToArray()),
                v => Vector<double>.Build.DenseOfArray(gradient(v.ToArray())));
            var minimizer = new BfgsBMinimizer(tolerance, 1e-12, 1e-14, maxIterations);
            var result = minimizer.FindMinimum(objective,
                Vector<double>.Build.Dense(p, lower), Vector<double>.Build.Dense(p, upper),
                Vector<double>.Build.DenseOfArray(x0));
            used = result.Iterations;
            var x = Project(result.MinimizingPoint.ToArray(), lower, upper);
            if (ProjectedGradientNorm(x, gradient(x), lower, upper) <= tolerance)
                return new Outcome(x, f(x), true, used);
            if (f(x) <= f(x0)) x0 = x;
        }
        catch (Exception e) when (e is MaximumIterationsException or OptimizationException or ArgumentException)
        {
            // fall through to the projected-gradient method
        }
        var spg = SpectralProjectedGradient(f, gradient, x0, lower, upper, tolerance, Math.Max(1, maxIterations - used) * 5);
        return spg with { Iterations = used + spg.Iterations };
    }

    private static Outcome SpectralProjectedGradient(
        Func<double[], double> f, Func<double[], double[]> gradient,
        double[] x, double lower, double upper, double tolerance, int maxIterations)
    {
        int p = x.Length;
        double fx = f(x);
        var g = gradient(x);
        double step = 1.0;
        for (int it = 1; it <= maxIterations; it++)
        {
            if (ProjectedGradientNorm(x, g, lower, upper) <= tolerance) return new Outcome(x, fx, true, it - 1);
            var d = new double[p];
            double lambda = step;
            double[] xn;
            double fn;
            int backtracks = 0;
            while (true)
            {
                for (int j = 0; j < p; j++) d[j] = Math.Clamp(x[j] - lambda * g[j], lower, upper) - x[j];
                double slope = 0;
                for (int j = 0; j < p; j++) slope += g[j] * d[j];
                xn = new double[p];
                for (int j = 0; j < p; j++) xn[j] = x[j] + d[j];
                fn = f(xn);
                if (fn <= fx + 1e-4 * slope || backtracks++ > 50) break;
                lambda *= 0.5;
            }
            var gn = gradient(xn);
            double ss = 0, sy = 0;
            for (int j = 0; j < p; j++)
            {
                double s = xn[j] - x[j], y = gn[j] - g[j];
                ss += s * s; sy += s * y;
            }
            step = sy > 0 ? Math.Clamp(ss / sy, 1e-10, 1e10) : 1.0; // Barzilai–Borwein step
            bool stalled = Math.Abs(fx - fn) <= 1e-16 * Math.Max(1.0, Math.Abs(fx)) && ss == 0;
            x = xn; fx = fn; g = gn;
            if (stalled) return new Outcome(x, fx, ProjectedGradientNorm(x, g, lower, upper) <= tolerance, it);
        }
        return new Outcome(x, fx, ProjectedGradientNorm(x, g, lower, upper) <= tolerance, maxIterations);
    }

    /// <summary>Infinity norm of the projected gradient, the first-order optimality measure on a box.</summary>
    public static double ProjectedGradientNorm(double[] x, double[] g, double lower, double upper)
    {
        double m = 0;
        for (int j = 0; j < x.Length; j++) m = Math.Max(m, Math.Abs(Math.Clamp(x[j] - g[j], lower, upper) - x[j]));
        return m;
    }

    private static double[] Project(double[] x, double lower, double upper)
    {
        var y = new double[x.Length];
        for (int j = 0; j < x.Length; j++) y[j] = Math.Clamp(x[j], lower, upper);
        return y;
    }
}
