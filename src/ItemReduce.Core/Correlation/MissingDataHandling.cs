namespace ItemReduce.Core.Correlation;

/// <summary>How missing answers are handled when correlating items.</summary>
public enum MissingDataHandling
{
    /// <summary>Each pair of items uses every respondent who answered both (pairwise-complete; default).</summary>
    Pairwise,
    /// <summary>Only respondents who answered every item are used (listwise deletion).</summary>
    Listwise,
}
