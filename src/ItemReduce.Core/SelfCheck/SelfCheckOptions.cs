namespace ItemReduce.Core.SelfCheck;

/// <summary>Options of the design-matched self-check (<see cref="DesignSelfCheck"/>).</summary>
public sealed record SelfCheckOptions
{
    /// <summary>Default number of simulated surveys (chosen so that <c>run</c> on the bundled sample survey takes at most
    /// about twice as long as without the self-check; see README "Self-check").</summary>
    public const int DefaultSurveys = 3;

    /// <summary>Largest number of simulated surveys accepted.</summary>
    public const int MaxSurveys = 10_000;

    /// <summary>Share of respondents planted as each careless kind (random, straight-line, alternating): 1 % each, at
    /// least one respondent of each kind.</summary>
    public const double PlantedShareEach = 0.01;

    /// <summary>Largest survey (respondents × analysed items) the self-check runs on when its count was not chosen by the
    /// user: beyond it each simulated survey costs about as much as the whole analysis, so the default is skipped with a
    /// warning.</summary>
    public const long MaxDefaultCells = 2_000_000;

    /// <summary>Simulated surveys; 0 turns the self-check off.</summary>
    public int Surveys { get; init; } = DefaultSurveys;

    /// <summary>True when <see cref="Surveys"/> is the default rather than the user's choice: the self-check is then
    /// skipped, with a warning, on surveys above <see cref="MaxDefaultCells"/>.</summary>
    public bool IsDefault { get; init; } = true;

    /// <summary>Throws <see cref="ArgumentOutOfRangeException"/> for a count outside 0..<see cref="MaxSurveys"/>.</summary>
    public void Validate()
    {
        if (Surveys is < 0 or > MaxSurveys)
            throw new ArgumentOutOfRangeException(nameof(Surveys), Surveys, $"simulated surveys must be 0 to {MaxSurveys}");
    }
}
