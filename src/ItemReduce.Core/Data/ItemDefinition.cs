namespace ItemReduce.Core.Data;

/// <summary>
/// One codebook entry: an item (a column of the responses file) with its hypothesised subscale,
/// keying and response-scale bounds.
/// </summary>
/// <param name="Name">Column name in the responses file.</param>
/// <param name="Subscale">Hypothesised subscale, or <c>null</c> when the codebook leaves it empty.</param>
/// <param name="Reverse">True when the item is reverse-keyed; it is rescored as <c>Min + Max − x</c>.</param>
/// <param name="Min">Lowest valid response (inclusive).</param>
/// <param name="Max">Highest valid response (inclusive); <c>Max ≥ Min</c>.</param>
/// <param name="Text">Item wording, or <c>null</c>.</param>
public sealed record ItemDefinition(string Name, string? Subscale, bool Reverse, double Min, double Max, string? Text)
{
    /// <summary>True when <paramref name="value"/> lies within [Min, Max].</summary>
    public bool InRange(double value) => value >= Min && value <= Max;
}
