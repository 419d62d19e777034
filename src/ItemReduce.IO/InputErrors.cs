using System.Globalization;

namespace ItemReduce.IO;

/// <summary>
/// Every user-facing input error message is built here, so wording and shape stay consistent:
/// <c>FILE, line L, column "C": PROBLEM. Fix: ACTION.</c>
/// </summary>
public static class InputErrors
{
    private const int MaxShownValue = 40;

    /// <summary>Quotes a user value for display on one line (control characters escaped, long values cut).</summary>
    public static string Show(string? value) => Show(value, MaxShownValue);

    /// <summary>Quotes a path for display on one line (control and invisible characters escaped, never cut).</summary>
    public static string ShowPath(string? path) => Show(path, int.MaxValue);

    private static string Show(string? value, int maxShown)
    {
        if (value is null) return "(nothing)";
        var sb = new System.Text.StringBuilder(value.Length + 2);
        sb.Append('"');
        foreach (char ch in value.Length > maxShown ? value[..maxShown] : value)
        {
            sb.Append(ch switch
            {
                '\n' => "\\n",
                '\r' => "\\r",
                '\t' => "\\t",
                '"' => "\\\"",
                _ when IsInvisible(ch) => $"\\u{(int)ch:X4}",
                _ => ch.ToString(),
            });
        }
        if (value.Length > maxShown) sb.Append('…');
        sb.Append('"');
        return sb.ToString();
    }

    /// <summary>Characters that would not show, or show misleadingly, on a terminal: controls (NUL...), format
    /// characters (byte-order mark U+FEFF, zero-width space U+200B...), line/paragraph separators, surrogates,
    /// private-use characters and every space other than the plain space (no-break space...).</summary>
    private static bool IsInvisible(char ch) => char.GetUnicodeCategory(ch) switch
    {
        UnicodeCategory.Control or UnicodeCategory.Format or UnicodeCategory.LineSeparator or UnicodeCategory.ParagraphSeparator
            or UnicodeCategory.Surrogate or UnicodeCategory.PrivateUse or UnicodeCategory.OtherNotAssigned => true,
        UnicodeCategory.SpaceSeparator => ch != ' ',
        _ => false,
    };

    private static string Where(string file, long? line, string? column)
    {
        string s = Path.GetFileName(file);
        if (line is not null) s += $", line {line.Value.ToString(CultureInfo.InvariantCulture)}";
        if (column is not null) s += $", column {Show(column)}";
        return s;
    }

    /// <summary>Generic located error.</summary>
    public static SurveyInputException At(string file, long? line, string? column, string problem, string fix) =>
        new($"{Where(file, line, column)}: {problem}. Fix: {fix}.");

    public static SurveyInputException FileMissing(string file, string role, string option) =>
        new($"{file}: {role} file not found. Fix: check the path given to {option}.");

    public static SurveyInputException Unreadable(string file, string reason) =>
        new($"{file}: cannot be read ({reason}). Fix: check the file's permissions and that it is a text file.");

    public static SurveyInputException EmptyFile(string file) =>
        At(file, 1, null, "the file is empty", "export the data again with a header row and one row per respondent");

    /// <summary>A path whose size is 0: an empty file, or a device, FIFO or socket (which report 0 too).</summary>
    public static SurveyInputException EmptyOrNotRegular(string file) =>
        At(file, 1, null, "the file is empty, or is not a regular file (a device, pipe or socket)",
            "give a saved file; for data, a CSV file with a header row and one row per respondent");

    /// <summary>A record with more fields than any survey export needs.</summary>
    public static SurveyInputException TooManyFields(string file, long line, int fields, int limit) =>
        At(file, line, null, $"the line has {fields.ToString("N0", CultureInfo.InvariantCulture)} fields; ItemReduce reads at most " +
            limit.ToString("N0", CultureInfo.InvariantCulture), "export only the respondent-id column and the item columns");

    public static SurveyInputException HeaderOnly(string file) =>
        At(file, 2, null, "the file has a header but no data rows", "add at least one row per respondent");

    public static SurveyInputException OnlySkippedRows(string file, int skipRows) =>
        At(file, 2, null, $"the file ends within the {skipRows} row(s) after the header that --skip-rows skips",
            "give --skip-rows the number of rows between the header and the first respondent");

    public static SurveyInputException DuplicateColumn(string file, string name, int first, int second) =>
        At(file, 1, name, $"the column name appears twice (columns {first} and {second})", "give every column a unique name");

    public static SurveyInputException EmptyColumnName(string file, int position) =>
        At(file, 1, null, $"column {position} has an empty name", "give every column a name in the header row");

    public static SurveyInputException Ragged(string file, long line, int expected, int actual) =>
        At(file, line, null, $"the row has {actual} fields but the header has {expected}",
            "make every row have one field per header column (check for stray delimiters or quotes)");

    public static SurveyInputException NotANumber(string file, long line, string column, string value) =>
        At(file, line, column, $"the value {Show(value)} is not a finite number",
            "correct the value, or add it to --missing if it is a missing-data code");

    public static SurveyInputException OutOfRange(string file, long line, string column, string value, double min, double max) =>
        At(file, line, column, $"the value {Show(value)} is outside the codebook range {Fmt(min)}–{Fmt(max)}",
            "correct the value, fix min/max in the codebook, or add the code to --missing if it marks missing data");

    public static SurveyInputException DuplicateId(string file, long line, string column, string id, long firstLine) =>
        At(file, line, column, $"respondent id {Show(id)} already appeared on line {firstLine}", "give every respondent a unique id");

    public static SurveyInputException EmptyId(string file, long line, string column) =>
        At(file, line, column, "the respondent id is empty", "fill in the id, or choose another id column with --id-column");

    public static SurveyInputException ItemNotInResponses(string codebookFile, long line, string item, string responsesFile) =>
        At(codebookFile, line, "item", $"item {Show(item)} has no column in {Path.GetFileName(responsesFile)}",
            "correct the item name (names are case-sensitive) or remove the item from the codebook");

    public static SurveyInputException IdColumnMissing(string file, string name) =>
        At(file, 1, name, "the id column given with --id-column is not in the header", "name an existing column");

    public static SurveyInputException IdColumnIsItem(string file, string name) =>
        At(file, 1, name, "the id column is also a codebook item", "choose a column that is not an item with --id-column");

    public static SurveyInputException TooFewRespondents(string file, int have, int need, int items) =>
        new($"{Path.GetFileName(file)}: {have} respondents can be analysed but {items} items need at least {need} " +
            $"(items + 1, so the covariance matrix can be inverted; at least 10 in any case). " +
            "Fix: collect more responses or analyse fewer items.");

    public static SurveyInputException TooFewItems(string file, int usable) =>
        new($"{Path.GetFileName(file)}: only {usable} usable item(s) remain after excluding empty and constant items; at least 3 are needed. " +
            "Fix: add items to the codebook or check the responses file.");

    private static string Fmt(double v) => v.ToString("G", CultureInfo.InvariantCulture);
}
