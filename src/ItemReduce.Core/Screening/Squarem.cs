namespace ItemReduce.Core.Screening;

/// <summary>
/// The squared extrapolation step of SQUAREM (Varadhan, R., &amp; Roland, C. (2008), "Simple and globally convergent
/// methods for accelerating the convergence of any EM algorithm", Scandinavian Journal of Statistics 35(2), 335–353),
/// scheme SqS3, for a fixed-point map F on a parameter vector θ. One cycle from θ₀ takes two plain steps
/// θ₁ = F(θ₀), θ₂ = F(θ₁), forms <c>r = θ₁ − θ₀</c> and <c>v = θ₂ − 2θ₁ + θ₀</c>, and jumps to
/// <c>θ′ = θ₀ + 2a r + a² v</c> with step length <c>a = ‖r‖ / ‖v‖</c> (the paper writes the step as
/// α = −a; a = 1 gives θ′ = θ₂, the two plain steps). The caller then applies F once more to θ′ (the stabilising
/// step) and keeps the result, or falls back to θ₂ when a safeguard fails.
/// Written from memory of the paper and of the authors' software; what is ours: a is kept within [1, a_max], a_max
/// starts at 1, is multiplied by 4 each time a step reaches it and divided by 4 (not below 1) after a rejected
/// extrapolation. The safeguards (positive definiteness, monotone objective, stable kept set) belong to the caller
/// (<see cref="ErAlgorithm"/>).
/// </summary>
internal sealed class Squarem
{
    /// <summary>Factor by which the step-length bound grows after a step at the bound and shrinks after a rejection.</summary>
    internal const double BoundFactor = 4;

    private double _maxStep = 1;

    /// <summary>Current upper bound a_max of the step length.</summary>
    public double MaxStep => _maxStep;

    /// <summary>
    /// The extrapolated point <c>θ₀ + 2a r + a² v</c> of the cycle θ₀ → θ₁ → θ₂, with a = ‖r‖ / ‖v‖ kept within
    /// [1, a_max]; null when ‖v‖ = 0 or a is not finite (no extrapolation possible: the caller keeps θ₂).
    /// </summary>
    /// <param name="theta0">Start of the cycle.</param>
    /// <param name="theta1">F(θ₀).</param>
    /// <param name="theta2">F(θ₁).</param>
    /// <param name="step">The step length a used.</param>
    public double[]? Extrapolate(double[] theta0, double[] theta1, double[] theta2, out double step)
    {
        ArgumentNullException.ThrowIfNull(theta0);
        ArgumentNullException.ThrowIfNull(theta1);
        ArgumentNullException.ThrowIfNull(theta2);
        if (theta1.Length != theta0.Length || theta2.Length != theta0.Length)
            throw new ArgumentException($"The three points must have the same length ({theta0.Length}).", nameof(theta1));
        double rr = 0, vv = 0;
        for (int t = 0; t < theta0.Length; t++)
        {
            double r = theta1[t] - theta0[t], v = theta2[t] - 2 * theta1[t] + theta0[t];
            rr += r * r;
            vv += v * v;
        }
        step = Math.Sqrt(rr / vv);
        if (!(vv > 0) || !double.IsFinite(step)) return null;
        step = Math.Clamp(step, 1, _maxStep);
        var next = new double[theta0.Length];
        for (int t = 0; t < next.Length; t++)
        {
            double r = theta1[t] - theta0[t], v = theta2[t] - 2 * theta1[t] + theta0[t];
            next[t] = theta0[t] + 2 * step * r + step * step * v;
        }
        return next;
    }

    /// <summary>Records an accepted extrapolation with step length <paramref name="step"/>: a step at the bound raises it.</summary>
    public void Accepted(double step)
    {
        if (step >= _maxStep) _maxStep *= BoundFactor;
    }

    /// <summary>Records a rejected extrapolation: the bound shrinks (not below 1, the plain double step).</summary>
    public void Rejected() => _maxStep = Math.Max(1, _maxStep / BoundFactor);
}
