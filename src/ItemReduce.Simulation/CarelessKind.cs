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
}
