namespace ItemReduce.Core.Factoring;

/// <summary>
/// Thrown when a factoring step that has no meaningful partial result (for example a singular rotation
/// matrix) fails. Ordinary iteration caps do not throw: they return a result flagged
/// <see cref="FactorSolution.Converged"/> = false with a warning.
/// </summary>
internal sealed class FactorNonConvergenceException : Exception
{
    public FactorNonConvergenceException(string message) : base(message) { }
    public FactorNonConvergenceException(string message, Exception inner) : base(message, inner) { }
}
