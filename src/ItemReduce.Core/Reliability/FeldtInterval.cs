using MathNet.Numerics.Distributions;

namespace ItemReduce.Core.Reliability;

/// <summary>
/// Confidence interval for coefficient alpha: Feldt, L. S. (1965). The approximate sampling distribution of
/// Kuder–Richardson reliability coefficient twenty. Psychometrika, 30(3), 357–370. Under the model,
/// (1 − α)/(1 − α̂) follows F with (n − 1) and (n − 1)(k − 1) degrees of freedom, so the two-sided
/// interval with coverage c is [1 − (1 − α̂) F_{(1+c)/2}, 1 − (1 − α̂) F_{(1−c)/2}].
/// </summary>
internal static class FeldtInterval
{
    /// <summary>Interval for alpha <paramref name="alpha"/> from <paramref name="n"/> respondents and
    /// <paramref name="k"/> items at coverage <paramref name="confidence"/> (0 &lt; c &lt; 1, default .95).
    /// (NaN, NaN) when alpha is NaN, n &lt; 2 or k &lt; 2.</summary>
    public static (double Low, double High) Compute(double alpha, int n, int k, double confidence = 0.95)
    {
        if (!(confidence > 0 && confidence < 1))
            throw new ArgumentException($"confidence = {confidence}; allowed (0, 1).", nameof(confidence));
        if (double.IsNaN(alpha) || n < 2 || k < 2) return (double.NaN, double.NaN);
        double d1 = n - 1.0, d2 = (n - 1.0) * (k - 1.0);
        double upperF = FisherSnedecor.InvCDF(d1, d2, (1 + confidence) / 2);
        double lowerF = FisherSnedecor.InvCDF(d1, d2, (1 - confidence) / 2);
        return (1 - (1 - alpha) * upperF, 1 - (1 - alpha) * lowerF);
    }
}
