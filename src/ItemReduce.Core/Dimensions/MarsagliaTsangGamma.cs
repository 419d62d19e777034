using ItemReduce.Core.Randomness;

namespace ItemReduce.Core.Dimensions;

/// <summary>
/// Gamma(shape, 1) and chi-square variates by Marsaglia &amp; Tsang (2000), "A simple method for generating
/// gamma variables", ACM Transactions on Mathematical Software 26(3), 363–372: for shape a ≥ 1,
/// d = a − 1/3, c = 1/sqrt(9d); draw x ~ N(0,1), v = (1 + cx)³ until v &gt; 0 and
/// u &lt; 1 − 0.0331 x⁴ (squeeze) or ln u &lt; x²/2 + d(1 − v + ln v); return d·v. For a &lt; 1 the paper's
/// boost Gamma(a) = Gamma(a + 1)·U^{1/a} is used. χ²(ν) = 2·Gamma(ν/2, 1).
/// </summary>
internal static class MarsagliaTsangGamma
{
    /// <summary>Gamma(<paramref name="shape"/>, 1), shape &gt; 0 (unchecked).</summary>
    public static double Sample(RandomStream rng, double shape)
    {
        if (shape < 1)
            return Sample(rng, shape + 1) * Math.Pow(rng.NextOpenDouble(), 1 / shape);
        double d = shape - 1.0 / 3.0, c = 1 / Math.Sqrt(9 * d);
        while (true)
        {
            double x, v;
            do
            {
                x = rng.NextGaussian();
                v = 1 + c * x;
            } while (v <= 0);
            v = v * v * v;
            double u = rng.NextOpenDouble();
            double x2 = x * x;
            if (u < 1 - 0.0331 * x2 * x2) return d * v;
            if (Math.Log(u) < 0.5 * x2 + d * (1 - v + Math.Log(v))) return d * v;
        }
    }

    /// <summary>χ²(<paramref name="df"/>) = 2·Gamma(df/2, 1), df &gt; 0 (unchecked).</summary>
    public static double ChiSquare(RandomStream rng, double df) => 2 * Sample(rng, df / 2);
}
