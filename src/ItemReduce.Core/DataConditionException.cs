namespace ItemReduce.Core;

/// <summary>
/// The data (not the program) rule out a computation: too few respondents for the items, an undefined correlation, a
/// correlation matrix that is not positive definite where a method needs one. <see cref="Exception.Message"/> is one
/// plain sentence for the person running the analysis, without parameter names; the pipeline turns it into a stop
/// reason or a warning as it is. It derives from <see cref="ArgumentException"/> because the offending data arrive as
/// an argument; <see cref="ArgumentException.ParamName"/> still names that argument for programmers.
/// </summary>
internal sealed class DataConditionException : ArgumentException
{
    private readonly string _reason;

    /// <summary>A data condition described by <paramref name="reason"/> (a plain sentence), for the argument named
    /// <paramref name="paramName"/>.</summary>
    public DataConditionException(string reason, string? paramName = null) : base(reason, paramName) => _reason = reason;

    /// <summary>The plain reason, without the parameter-name suffix <see cref="ArgumentException"/> adds.</summary>
    public override string Message => _reason;
}
