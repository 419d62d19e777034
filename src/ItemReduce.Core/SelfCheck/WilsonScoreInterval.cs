namespace ItemReduce.Core.SelfCheck;

/// <summary>
/// Score interval for a binomial proportion: Wilson, E. B. (1927). Probable inference, the law of succession, and
/// statistical inference. Journal of the American Statistical Association, 22(158), 209–212. For x successes in n
/// trials, p̂ = x/n and normal quantile z, the interval is
/// <c>(p̂ + z²/2n ± z·sqrt(p̂(1 − p̂)/n + z²/4n²)) / (1 + z²/n)</c>; it stays inside [0, 1] and is not degenerate at
/// x = 0 or x = n.
/// </summary>
internal static class WilsonScoreInterval
{
    /// <summary>Two-sided 95 % normal quantile z(0.975).</summary>
    public const double Z95 = 1.959963984540054;

    /// <summary>The interval of <paramref name="successes"/> out of <paramref name="trials"/> at normal quantile
    /// <paramref name="z"/> (default <see cref="Z95"/>); (NaN, NaN) when there are no trials.</summary>
    public static (double Low, double High) Compute(long successes, long trials, double z = Z95)
    {
        if (trials < 0 || successes < 0 || successes > trials)
            throw new ArgumentOutOfRangeException(nameof(successes), successes, $"need 0 ≤ successes ≤ trials, got {successes} of {trials}");
        if (!(z > 0)) throw new ArgumentOutOfRangeException(nameof(z), z, "z must be positive");
        if (trials == 0) return (double.NaN, double.NaN);
        double n = trials, p = successes / n, z2 = z * z;
        double centre = p + z2 / (2 * n);
        double half = z * Math.Sqrt(p * (1 - p) / n + z2 / (4 * n * n));
        double d = 1 + z2 / n;
        return (Math.Max(0, (centre - half) / d), Math.Min(1, (centre + half) / d));
    }
}
