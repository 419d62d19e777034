namespace ItemReduce.Core.Correlation;

/// <summary>
/// One-dimensional minimisation without derivatives by golden-section search with parabolic interpolation:
/// Brent (1973), Algorithms for Minimization without Derivatives, Prentice-Hall, Chapter 5 (procedure
/// "localmin"). Finds a local minimum of f on [a, b] to within tol + 2·eps·|x|; at most 200 evaluations
/// (bounded by the golden-section rate, so the cap is never reached for tol ≥ 1e-12 on a unit interval).
/// </summary>
internal static class BrentMinimizer
{
    public static double Minimise(Func<double, double> f, double a, double b, double tol)
    {
        const double golden = 0.3819660112501051; // (3 − √5) / 2
        const double eps = 1.4901161193847656e-8; // sqrt(2^-52)
        double x = a + golden * (b - a), w = x, v = x;
        double fx = f(x), fw = fx, fv = fx;
        double d = 0, e = 0;
        for (int iter = 0; iter < 200; iter++)
        {
            double m = 0.5 * (a + b);
            double tol1 = eps * Math.Abs(x) + tol / 3, tol2 = 2 * tol1;
            if (Math.Abs(x - m) <= tol2 - 0.5 * (b - a)) break;
            bool goldenStep = true;
            if (Math.Abs(e) > tol1)
            {
                // Fit a parabola through x, v, w.
                double r = (x - w) * (fx - fv);
                double q = (x - v) * (fx - fw);
                double p = (x - v) * q - (x - w) * r;
                q = 2 * (q - r);
                if (q > 0) p = -p; else q = -q;
                double etemp = e;
                e = d;
                if (Math.Abs(p) < Math.Abs(0.5 * q * etemp) && p > q * (a - x) && p < q * (b - x))
                {
                    d = p / q;
                    double u0 = x + d;
                    if (u0 - a < tol2 || b - u0 < tol2) d = x < m ? tol1 : -tol1;
                    goldenStep = false;
                }
            }
            if (goldenStep)
            {
                e = (x < m ? b : a) - x;
                d = golden * e;
            }
            double u = Math.Abs(d) >= tol1 ? x + d : x + (d > 0 ? tol1 : -tol1);
            double fu = f(u);
            if (fu <= fx)
            {
                if (u < x) b = x; else a = x;
                v = w; fv = fw; w = x; fw = fx; x = u; fx = fu;
            }
            else
            {
                if (u < x) a = u; else b = u;
                if (fu <= fw || w == x) { v = w; fv = fw; w = u; fw = fu; }
                else if (fu <= fv || v == x || v == w) { v = u; fv = fu; }
            }
        }
        return x;
    }
}
