using MathNet.Numerics;
using MathNet.Numerics.Integration;

namespace ItemReduce.Core.Correlation;

/// <summary>
/// Standard bivariate normal distribution with correlation ρ: CDF Φ₂(h, k; ρ) = P(X ≤ h, Y ≤ k) and density.
/// The CDF follows Genz (2004), "Numerical computation of rectangular bivariate and trivariate normal and t
/// probabilities", Statistics and Computing 14, 251–260, Section 2.2 (his BVND routine), which refines
/// Drezner &amp; Wesolowsky (1990), "On the computation of the bivariate normal integral", Journal of
/// Statistical Computation and Simulation 35, 101–107: for |ρ| &lt; 0.925 Gauss–Legendre quadrature of
/// Sheppard's/Plackett's integral over asin ρ (6, 12 or 20 points for |ρ| &lt; 0.3, &lt; 0.75, else), and for
/// |ρ| ≥ 0.925 the transformed integral around ρ = ±1 with Genz's asymptotic correction terms.
/// Accuracy about 1e-15 absolute (Genz, Table 1). Infinite limits are handled exactly.
/// </summary>
internal static class BivariateNormalDistribution
{
    private static readonly (double[] X, double[] W)[] Rules =
    [
        Rule(6), Rule(12), Rule(20),
    ];

    private static (double[] X, double[] W) Rule(int order)
    {
        var g = new GaussLegendreRule(-1, 1, order);
        return (g.Abscissas, g.Weights);
    }

    /// <summary>Standard normal CDF Φ(x).</summary>
    internal static double Phi(double x) => 0.5 * SpecialFunctions.Erfc(-x / Constants.Sqrt2);

    /// <summary>Φ₂(h, k; ρ) = P(X ≤ h, Y ≤ k), ρ ∈ [−1, 1]; h, k may be ±∞.</summary>
    public static double Cdf(double h, double k, double rho)
    {
        if (double.IsNaN(h) || double.IsNaN(k) || !(rho >= -1 && rho <= 1))
            throw new ArgumentException($"Invalid arguments h = {h}, k = {k}, rho = {rho} (rho must lie in [−1, 1]).");
        if (double.IsNegativeInfinity(h) || double.IsNegativeInfinity(k)) return 0;
        if (double.IsPositiveInfinity(h)) return Phi(k);
        if (double.IsPositiveInfinity(k)) return Phi(h);
        return UpperOrthant(-h, -k, rho);
    }

    /// <summary>Density φ₂(h, k; ρ) = exp(−(h² − 2ρhk + k²) / (2(1 − ρ²))) / (2π sqrt(1 − ρ²)), |ρ| &lt; 1;
    /// it is also ∂Φ₂/∂ρ (Plackett, 1954, Biometrika 41, 351–360, eq. 3).</summary>
    public static double Density(double h, double k, double rho)
    {
        if (double.IsInfinity(h) || double.IsInfinity(k)) return 0;
        double om = 1 - rho * rho;
        return Math.Exp(-(h * h - 2 * rho * h * k + k * k) / (2 * om)) / (2 * Math.PI * Math.Sqrt(om));
    }

    /// <summary>Genz's BVND: P(X &gt; dh, Y &gt; dk) for finite dh, dk.</summary>
    internal static double UpperOrthant(double dh, double dk, double r)
    {
        const double twoPi = 2 * Math.PI;
        var (x, w) = Math.Abs(r) < 0.3 ? Rules[0] : Math.Abs(r) < 0.75 ? Rules[1] : Rules[2];
        double h = dh, k = dk, hk = h * k, bvn = 0;
        if (Math.Abs(r) < 0.925)
        {
            // Integral over θ from 0 to asin r of exp(−(h² + k² − 2hk sin θ) / (2 cos² θ)) / (2π).
            double hs = (h * h + k * k) / 2, asr = Math.Asin(r);
            for (int i = 0; i < x.Length; i++)
            {
                double sn = Math.Sin(asr * (x[i] + 1) / 2);
                bvn += w[i] * Math.Exp((sn * hk - hs) / (1 - sn * sn));
            }
            return bvn * asr / (2 * twoPi) + Phi(-h) * Phi(-k);
        }
        if (r < 0) { k = -k; hk = -hk; }
        if (Math.Abs(r) < 1)
        {
            double ass = (1 - r) * (1 + r), a = Math.Sqrt(ass), bs = (h - k) * (h - k);
            double c = (4 - hk) / 8, d = (12 - hk) / 16;
            bvn = a * Math.Exp(-(bs / ass + hk) / 2) * (1 - c * (bs - ass) * (1 - d * bs / 5) / 3 + c * d * ass * ass / 5);
            if (hk > -160)
            {
                double b = Math.Sqrt(bs);
                bvn -= Math.Exp(-hk / 2) * Math.Sqrt(twoPi) * Phi(-b / a) * b * (1 - c * bs * (1 - d * bs / 5) / 3);
            }
            a /= 2;
            for (int i = 0; i < x.Length; i++)
            {
                double xs = a * (x[i] + 1);
                xs *= xs;
                double rs = Math.Sqrt(1 - xs);
                double asr = -(bs / xs + hk) / 2;
                if (asr > -100)
                    bvn += a * w[i] * Math.Exp(asr) * (Math.Exp(-hk * (1 - rs) / (2 * (1 + rs))) / rs - (1 + c * xs * (1 + d * xs)));
            }
            bvn = -bvn / twoPi;
        }
        if (r > 0) return bvn + Phi(-Math.Max(h, k));
        bvn = -bvn;
        if (k > h) bvn += h < 0 ? Phi(k) - Phi(h) : Phi(-h) - Phi(-k);
        return bvn;
    }
}
