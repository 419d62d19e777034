using MathNet.Numerics;

namespace ItemReduce.Core.Confirmatory;

/// <summary>
/// Distribution function of the noncentral χ² as the Poisson mixture of central χ² distributions,
/// F(x; ν, λ) = Σ_j e^{−λ/2} (λ/2)^j / j! · P(χ²_{ν+2j} ≤ x) (Johnson, N. L., Kotz, S., &amp; Balakrishnan, N., 1995,
/// Continuous Univariate Distributions, Vol. 2, 2nd ed., ch. 29, eq. 29.2), summed outwards from the largest Poisson
/// weight until the remaining weight is below 1e−17; the central terms are Math.NET's regularised incomplete gamma
/// function. Used for the RMSEA interval (<see cref="RmseaInterval"/>).
/// </summary>
internal static class NoncentralChiSquare
{
    private const int MaxTerms = 100_000;

    /// <summary>P(X ≤ x) for X ~ χ²(ν, λ); λ ≥ 0, ν &gt; 0.</summary>
    public static double Cdf(double x, double df, double noncentrality)
    {
        if (x <= 0) return 0;
        double h = noncentrality / 2;
        if (h == 0) return SpecialFunctions.GammaLowerRegularized(df / 2, x / 2);
        int mode = (int)Math.Floor(h);
        double Weight(int j) => Math.Exp(-h + j * Math.Log(h) - SpecialFunctions.GammaLn(j + 1.0));
        double sum = 0, weightSum = 0;
        for (int j = mode; j <= mode + MaxTerms; j++)
        {
            double w = Weight(j);
            sum += w * SpecialFunctions.GammaLowerRegularized(df / 2 + j, x / 2);
            weightSum += w;
            if (w < 1e-17 && j > h) break;
        }
        for (int j = mode - 1; j >= 0; j--)
        {
            double w = Weight(j);
            sum += w * SpecialFunctions.GammaLowerRegularized(df / 2 + j, x / 2);
            weightSum += w;
            if (w < 1e-17) break;
        }
        return Math.Clamp(sum, 0, 1);
    }

    /// <summary>The noncentrality λ ≥ 0 with F(x; ν, λ) = <paramref name="probability"/> (F decreases in λ); 0 when
    /// F(x; ν, 0) is already at or below it. A bracket found by doubling, then regula falsi with the Illinois
    /// modification (Dowell and Jarratt 1971, "A modified regula falsi method for computing the root of an
    /// equation", BIT 11, 168–174), which keeps the root bracketed and converges superlinearly, to 1e−12 relative.</summary>
    public static double NoncentralityFor(double x, double df, double probability)
    {
        double fLo = Cdf(x, df, 0) - probability;
        if (fLo <= 0) return 0;
        double lo = 0, hi = Math.Max(1, x);
        double fHi = Cdf(x, df, hi) - probability;
        while (fHi > 0) { (lo, fLo) = (hi, fHi); hi *= 2; if (hi > 1e9) return double.NaN; fHi = Cdf(x, df, hi) - probability; }
        int side = 0;
        for (int it = 0; it < 200 && hi - lo > 1e-12 * Math.Max(1, hi); it++)
        {
            // The secant point, kept strictly inside the bracket; bisection if rounding puts it on an end.
            double mid = fLo - fHi > 0 ? lo + (hi - lo) * fLo / (fLo - fHi) : 0.5 * (lo + hi);
            if (!(mid > lo && mid < hi)) mid = 0.5 * (lo + hi);
            double fMid = Cdf(x, df, mid) - probability;
            if (fMid > 0)
            {
                (lo, fLo) = (mid, fMid);
                if (side == -1) fHi *= 0.5;
                side = -1;
            }
            else
            {
                (hi, fHi) = (mid, fMid);
                if (side == 1) fLo *= 0.5;
                side = 1;
            }
            if (fMid == 0) return mid;
        }
        return 0.5 * (lo + hi);
    }
}

/// <summary>
/// The 90% confidence interval of the RMSEA from the noncentral χ² (Steiger, J. H., &amp; Lind, J. C., 1980, "Statistically
/// based tests for the number of common factors", Psychometric Society meeting, Iowa City; Browne, M. W., &amp; Cudeck, R.,
/// 1993, "Alternative ways of assessing model fit", in K. A. Bollen &amp; J. S. Long (Eds.), Testing Structural Equation
/// Models, pp. 136–162, Sage): λ_L solves F(χ²; df, λ_L) = 0.95 and λ_U solves F(χ²; df, λ_U) = 0.05 (each 0 when the
/// central F is already below), and the bounds are √(λ / (df · N)), matching RMSEA = √(max(χ² − df, 0) / (df · N)).
/// </summary>
internal static class RmseaInterval
{
    /// <summary>Point estimate and 90% bounds; NaN for df ≤ 0.</summary>
    public static (double Rmsea, double Low, double High) Compute(double chi2, double df, int respondents)
    {
        if (!(df > 0) || !double.IsFinite(chi2)) return (double.NaN, double.NaN, double.NaN);
        double n = respondents;
        double point = Math.Sqrt(Math.Max(chi2 - df, 0) / (df * n));
        double low = NoncentralChiSquare.NoncentralityFor(chi2, df, 0.95);
        double high = NoncentralChiSquare.NoncentralityFor(chi2, df, 0.05);
        return (point, Math.Sqrt(low / (df * n)), Math.Sqrt(high / (df * n)));
    }
}
