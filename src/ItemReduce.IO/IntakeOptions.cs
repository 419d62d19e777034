namespace ItemReduce.IO;

/// <summary>How the responses file is read.</summary>
/// <param name="Delimiter">Field delimiter; null = detect from the header (comma, semicolon or tab).</param>
/// <param name="MissingCodes">Cell texts that mean "missing" (compared after trimming, case-sensitive).
/// An empty cell is always missing. Default: <see cref="DefaultMissingCodes"/>.</param>
/// <param name="IdColumn">Respondent-id column; null = <c>respondent</c> if present, else the first
/// column that is not a codebook item, else the data line number.</param>
/// <param name="SkipRows">Rows right after the header row that are not respondents (e.g. question texts and import codes
/// of a survey-platform export); they are skipped unread. Default 0, at most <see cref="MaxSkipRows"/>.</param>
public sealed record IntakeOptions(char? Delimiter = null, IReadOnlyList<string>? MissingCodes = null, string? IdColumn = null, int SkipRows = 0)
{
    /// <summary>Largest number of rows that can be skipped after the header.</summary>
    public const int MaxSkipRows = 100;

    /// <summary>The default missing codes: empty cell and <c>NA</c>.</summary>
    public static readonly IReadOnlyList<string> DefaultMissingCodes = ["", "NA"];

    /// <summary>Missing codes in effect.</summary>
    public IReadOnlyList<string> EffectiveMissingCodes => MissingCodes ?? DefaultMissingCodes;
}
