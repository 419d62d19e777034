using System.Runtime.CompilerServices;
using System.Text;
using nietras.SeparatedValues;

namespace ItemReduce.IO;

/// <summary>
/// Streams RFC 4180 records from a delimited text file with the 1-based line number on which each
/// record starts (quoted fields may span lines). Blank lines are skipped. Parsing is done by Sep (span-based, no string
/// per field); fields are read as spans with <see cref="Field"/>, or as strings with <see cref="Fields"/>.
/// A field that holds a double quote must be quoted as a whole with inner quotes doubled (RFC 4180 §2.5–2.7); anything
/// else is refused on the record's line.
/// </summary>
internal sealed class CsvRecordReader : IDisposable
{
    /// <summary>Most fields a record may have (a 300-item survey with ids and extra columns needs far fewer).</summary>
    public const int MaxFields = 10_000;

    private readonly string _path;
    private readonly SurveyTextReader _reader;
    private readonly SepReader _sep;
    private long _nextLine = 1;
    private int _count;
    // Unescaped text of the quoted fields of the current record (null when the record holds no quote).
    private string?[]? _unquoted;

    public CsvRecordReader(string path, char delimiter)
    {
        _path = path;
        Delimiter = delimiter;
        // A quoted field may span lines, but no record may run past the line limit inside quotes (bounded memory).
        _reader = new SurveyTextReader(path, boundQuotedRecords: true);
        try
        {
            _sep = Sep.New(delimiter).Reader(o => o with { HasHeader = false, DisableColCountCheck = true, Unescape = false })
                .From(_reader);
        }
        catch
        {
            _reader.Dispose();
            throw;
        }
    }

    public char Delimiter { get; }

    /// <summary>Line on which the current record starts.</summary>
    public long Line { get; private set; }

    /// <summary>Number of fields of the current record.</summary>
    public int FieldCount => _count;

    /// <summary>Field <paramref name="i"/> of the current record (quotes removed), valid until the next <see cref="Read"/>.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public ReadOnlySpan<char> Field(int i)
    {
        if (_unquoted is not null && _unquoted[i] is { } s) return s;
        return _sep.Current[i].Span;
    }

    /// <summary>Fields of the current record as new strings.</summary>
    public string[] Fields
    {
        get
        {
            var f = new string[_count];
            for (int i = 0; i < f.Length; i++) f[i] = Field(i).ToString();
            return f;
        }
    }

    /// <summary>Advances to the next non-blank record; false at end of file.</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public bool Read()
    {
        while (true)
        {
            if (!_sep.MoveNext()) return false;
            var row = _sep.Current;
            // Sep's line numbers: the end of each record is exact; the first record starts on line 1.
            Line = _nextLine;
            _nextLine = row.LineNumberToExcl;
            var raw = row.Span;
            if (raw.Length == 0) continue; // blank line
            _count = row.ColCount;
            _unquoted = null;
            if (raw.Contains('"')) Unquote(row);
            if (_count > MaxFields) throw InputErrors.TooManyFields(_path, Line, _count, MaxFields);
            return true;
        }
    }

    /// <summary>Checks and unescapes the fields of a record that holds a double quote.</summary>
    private void Unquote(SepReader.Row row)
    {
        _unquoted = new string?[_count];
        for (int i = 0; i < _count; i++)
        {
            var f = row[i].Span;
            int q = f.IndexOf('"');
            if (q < 0) continue;
            if (q > 0 || f.Length < 2 || f[^1] != '"') throw StrayQuote(f, q);
            var inner = f[1..^1];
            var sb = new StringBuilder(inner.Length);
            for (int k = 0; k < inner.Length; k++)
            {
                if (inner[k] != '"') { sb.Append(inner[k]); continue; }
                if (k + 1 < inner.Length && inner[k + 1] == '"') { sb.Append('"'); k++; continue; }
                throw StrayQuote(f, q);
            }
            _unquoted[i] = sb.ToString();
        }
    }

    /// <summary>A quote inside an unquoted field, or text after a closing quote. The value shown ends at the first
    /// delimiter or line break after the quote (the parser, seeing a quote, may have run on past them).</summary>
    private SurveyInputException StrayQuote(ReadOnlySpan<char> field, int quote)
    {
        int end = field[(quote + 1)..].IndexOfAny(Delimiter, '\n', '\r');
        var shown = end < 0 ? field : field[..(quote + 1 + end)];
        return InputErrors.At(_path, Line, null,
            $"a double quote appears inside an unquoted field ({InputErrors.Show(shown.ToString())})",
            "quote the whole field and double any quote inside it (\"\"), as in RFC 4180");
    }

    public void Dispose()
    {
        _sep.Dispose();
        _reader.Dispose();
    }
}
