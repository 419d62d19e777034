using System.Globalization;
using System.Text;

namespace ItemReduce.IO;

/// <summary>
/// Writes CSV tables per RFC 4180 (comma, CRLF-free "\n" line ends, quotes doubled, fields quoted when
/// needed) and neutralises text cells that a spreadsheet would execute as a formula: a text cell that
/// starts with <c>=</c>, <c>+</c>, <c>-</c>, <c>@</c>, tab or carriage return gets a leading apostrophe
/// (OWASP "CSV injection" guidance, common practice). Numbers are written in invariant culture with
/// round-trip precision; NaN and infinities as empty cells.
/// </summary>
internal sealed class SafeCsvWriter
{
    private readonly StringBuilder _sb = new();
    private readonly TextWriter? _sink;
    private readonly int _columns;

    /// <summary>A writer that collects the table in memory (see <see cref="ToString"/>).</summary>
    public SafeCsvWriter(IReadOnlyList<string> header) : this(header, null)
    {
    }

    /// <summary>A writer that streams every row to <paramref name="sink"/> as it is appended (nothing is kept in
    /// memory; <see cref="ToString"/> is then empty). A null sink collects in memory.</summary>
    public SafeCsvWriter(IReadOnlyList<string> header, TextWriter? sink)
    {
        _sink = sink;
        _columns = header.Count;
        AppendRow(header.Select(Text).ToArray());
    }

    /// <summary>A text cell: control characters shown as <c>\uXXXX</c>, neutralised and quoted as needed.</summary>
    public static string Text(string? value) => Quote(Neutralise(EscapeControls(value ?? "")));

    /// <summary>Control characters (NUL, line breaks, tab, ...) in text from the user's files, e.g. a respondent id
    /// holding a line break, are written as the six characters <c>\uXXXX</c>, so no output line carries them raw.</summary>
    internal static string EscapeControls(string value)
    {
        int first = -1;
        for (int i = 0; i < value.Length; i++) if (char.IsControl(value[i])) { first = i; break; }
        if (first < 0) return value;
        var sb = new StringBuilder(value.Length + 8).Append(value, 0, first);
        for (int i = first; i < value.Length; i++)
        {
            char ch = value[i];
            if (char.IsControl(ch)) sb.Append("\\u").Append(((int)ch).ToString("X4", CultureInfo.InvariantCulture));
            else sb.Append(ch);
        }
        return sb.ToString();
    }

    /// <summary>A number cell with round-trip precision; empty for NaN/infinity.</summary>
    public static string Number(double value) =>
        double.IsFinite(value) ? value.ToString("R", CultureInfo.InvariantCulture) : "";

    /// <summary>A number cell rounded to <paramref name="decimals"/> decimals; empty for NaN/infinity.</summary>
    public static string Number(double value, int decimals) =>
        double.IsFinite(value) ? Math.Round(value, decimals).ToString("R", CultureInfo.InvariantCulture) : "";

    public static string Integer(long value) => value.ToString(CultureInfo.InvariantCulture);

    public static string Bool(bool value) => value ? "true" : "false";

    /// <summary>Appends a row of already formatted cells (use <see cref="Text"/>, <see cref="Number(double)"/>...).</summary>
    public void AppendRow(IReadOnlyList<string> cells)
    {
        if (cells.Count != _columns) throw new ArgumentException($"Row has {cells.Count} cells, header has {_columns}.");
        for (int c = 0; c < cells.Count; c++)
        {
            if (c > 0) _sb.Append(',');
            _sb.Append(cells[c]);
        }
        _sb.Append('\n');
        if (_sink is not null)
        {
            _sink.Write(_sb);
            _sb.Clear();
        }
    }

    /// <summary>The CSV text.</summary>
    public override string ToString() => _sb.ToString();

    /// <summary>A text cell that starts with <c>=</c>, <c>+</c>, <c>-</c>, <c>@</c>, tab or carriage return (and is not a
    /// number) gets a leading apostrophe. <see cref="Unneutralise"/> undoes it when ItemReduce reads its own output back.</summary>
    internal static string Neutralise(string value)
    {
        if (value.Length == 0) return value;
        char c0 = value[0];
        if (c0 is '=' or '+' or '-' or '@' or '\t' or '\r')
        {
            if (c0 is '+' or '-' && double.TryParse(value, NumberStyles.Float, CultureInfo.InvariantCulture, out _)) return value;
            return "'" + value;
        }
        return value;
    }

    /// <summary>Undoes <see cref="Neutralise"/>: an apostrophe followed by a formula-starting character is dropped.</summary>
    public static string Unneutralise(string value) =>
        value.Length >= 2 && value[0] == '\'' && value[1] is '=' or '+' or '-' or '@' or '\t' or '\r' ? value[1..] : value;

    private static readonly System.Buffers.SearchValues<char> NeedQuotes = System.Buffers.SearchValues.Create(",\"\n\r");

    internal static string Quote(string value)
    {
        if (value.AsSpan().IndexOfAny(NeedQuotes) < 0) return value;
        return "\"" + value.Replace("\"", "\"\"") + "\"";
    }
}
