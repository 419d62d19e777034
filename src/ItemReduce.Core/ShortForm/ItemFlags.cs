namespace ItemReduce.Core.ShortForm;

/// <summary>Per-item statistics and flags before any selection (decisions are set by <see cref="ItemSelection"/>).</summary>
internal sealed record ItemFlags(
    int Index, string Scale, int HomeFactor, int PrimaryFactor, double PrimaryLoading, double SecondaryLoading,
    double Communality, double ItemTotal, double AlphaIfDeleted, double ScaleAlpha, List<string> Reasons)
{
    /// <summary>Loading on the scale's home factor.</summary>
    public double HomeLoading { get; init; }
}
