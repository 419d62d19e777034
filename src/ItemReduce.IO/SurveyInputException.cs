namespace ItemReduce.IO;

/// <summary>
/// A problem with the user's input that the user can fix. <see cref="Exception.Message"/> is one line
/// naming the file, the 1-based line, the column or item, the offending value and the fix.
/// The command line turns it into exit code 2 without a stack trace.
/// </summary>
public sealed class SurveyInputException(string message) : Exception(message);
