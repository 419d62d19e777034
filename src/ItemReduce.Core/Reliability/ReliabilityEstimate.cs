namespace ItemReduce.Core.Reliability;

/// <summary>
/// Reliability of one scale (a set of items summed with equal weights after reverse scoring).
/// Item-level arrays follow the order of the items given.
/// </summary>
/// <param name="ItemCount">k.</param>
/// <param name="Respondents">Rows used: respondents who answered every item of the scale (listwise).</param>
/// <param name="Alpha">Raw Cronbach's alpha (covariance metric, n − 1 denominators).</param>
/// <param name="AlphaCiLow">Feldt interval lower bound.</param>
/// <param name="AlphaCiHigh">Feldt interval upper bound.</param>
/// <param name="Confidence">Coverage of the interval (e.g. 0.95).</param>
/// <param name="StandardizedAlpha">Alpha of standardized items, k r̄ / (1 + (k − 1) r̄).</param>
/// <param name="Omega">McDonald's omega total from a one-factor minres model on the correlation metric
/// (NaN for k &lt; 3).</param>
/// <param name="OmegaLoadings">Loadings of that one-factor model (length k), or empty.</param>
/// <param name="ItemTotalCorrelations">Corrected item–total correlations (length k).</param>
/// <param name="AlphaIfDeleted">Raw alpha of the other k − 1 items (length k).</param>
/// <param name="Covariance">Item covariance matrix used (k × k).</param>
internal sealed record ReliabilityEstimate(
    int ItemCount, int Respondents, double Alpha, double AlphaCiLow, double AlphaCiHigh, double Confidence,
    double StandardizedAlpha, double Omega, double[] OmegaLoadings, double[] ItemTotalCorrelations,
    double[] AlphaIfDeleted, double[,] Covariance);
