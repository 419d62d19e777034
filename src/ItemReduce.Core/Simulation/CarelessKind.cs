namespace ItemReduce.Simulation;

/// <summary>Kinds of planted careless responding.</summary>
public enum CarelessKind
{
    /// <summary>An attentive respondent drawn from the factor model.</summary>
    None,
    /// <summary>The same answer to every item.</summary>
    StraightLine,
    /// <summary>Every answer drawn uniformly from the response scale.</summary>
    UniformRandom,
    /// <summary>Alternates between the lowest and the highest category (1-5-1-5 on a five-point scale).</summary>
    WideAlternation,
    /// <summary>Alternates between the categories one below and one above the scale midpoint, rounded outwards
    /// (3-5-3-5 on a seven-point scale, 2-4-2-4 on a five-point scale, 2-3-2-3 on a four-point scale).</summary>
    NarrowAlternation,
    /// <summary>An attentive answer pattern of which only about a quarter of the items are answered (at least one).</summary>
    MostlyUnanswered,
}
