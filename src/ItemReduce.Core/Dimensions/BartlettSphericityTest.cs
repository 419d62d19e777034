using ItemReduce.Core.LinearAlgebra;
using MathNet.Numerics;

namespace ItemReduce.Core.Dimensions;

/// <summary>Bartlett's test of sphericity.</summary>
/// <param name="ChiSquare">Test statistic.</param>
/// <param name="DegreesOfFreedom">p(p − 1)/2.</param>
/// <param name="P">Upper-tail probability of χ²(df) at the statistic.</param>
public sealed record BartlettSphericityResult(double ChiSquare, int DegreesOfFreedom, double P);

/// <summary>
/// Test that the population correlation matrix is the identity: Bartlett (1950), "Tests of significance in
/// factor analysis", British Journal of Psychology (Statistical Section) 3(2), 77–85:
/// χ² = −(n − 1 − (2p + 5)/6) ln|R| with df = p(p − 1)/2. ln|R| from a Cholesky factorisation (R must be
/// positive definite); the p-value is the regularised upper incomplete gamma Q(df/2, χ²/2), computed directly
/// so that very small p-values keep their precision.
/// </summary>
internal static class BartlettSphericityTest
{
    /// <summary>Statistic, df and p-value for correlation matrix <paramref name="correlation"/> from
    /// <paramref name="respondents"/> respondents.</summary>
    public static BartlettSphericityResult Compute(double[,] correlation, int respondents)
    {
        MatrixChecks.SymmetricFinite(correlation, nameof(correlation));
        int p = correlation.GetLength(0);
        if (p < 2) throw new DataConditionException($"The sphericity test needs at least 2 items, got {p}.", nameof(correlation));
        double factor = respondents - 1 - (2.0 * p + 5) / 6;
        if (!(factor > 0))
            throw new DataConditionException($"The sphericity test needs n − 1 − (2p + 5)/6 > 0; got n = {respondents}, p = {p}.", nameof(respondents));
        double chi = -factor * CholeskyDecomposition.LogDeterminant(correlation);
        int df = p * (p - 1) / 2;
        double pValue = SpecialFunctions.GammaUpperRegularized(df / 2.0, chi / 2);
        return new BartlettSphericityResult(chi, df, pValue);
    }
}
