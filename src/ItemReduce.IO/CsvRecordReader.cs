using System.Globalization;
using CsvHelper;
using CsvHelper.Configuration;

namespace ItemReduce.IO;

/// <summary>
/// Streams RFC 4180 records from a delimited text file with the 1-based line number on which each
/// record starts (quoted fields may span lines). Blank lines are skipped.
/// </summary>
internal sealed class CsvRecordReader : IDisposable
{
    /// <summary>Most fields a record may have (a 300-item survey with ids and extra columns needs far fewer).</summary>
    public const int MaxFields = 10_000;

    private readonly string _path;
    private readonly TextReader _reader;
    private readonly CsvParser _parser;
    private long _linesConsumed;
    private bool _reading;

    private long CurrentRecordLine => _reading ? _linesConsumed + 1 : Line;

    public CsvRecordReader(string path, char delimiter)
    {
        _path = path;
        Delimiter = delimiter;
        _reader = DelimitedText.Open(path);
        var config = new CsvConfiguration(CultureInfo.InvariantCulture)
        {
            Delimiter = delimiter.ToString(),
            HasHeaderRecord = false,
            IgnoreBlankLines = false,
            DetectColumnCountChanges = false,
            TrimOptions = TrimOptions.None,
            // A quoted field may span lines; no field may exceed the line limit either (bounded memory).
            MaxFieldSize = SurveyTextReader.MaxLineChars,
            // CsvHelper may report bad data while reading the record or later, when its fields are
            // accessed; either way it belongs to the record that starts on CurrentRecordLine.
            BadDataFound = args => throw InputErrors.At(_path, CurrentRecordLine, null,
                $"a double quote appears inside an unquoted field ({InputErrors.Show(args.Field)})",
                "quote the whole field and double any quote inside it (\"\"), as in RFC 4180"),
        };
        _parser = new CsvParser(_reader, config);
    }

    public char Delimiter { get; }

    /// <summary>Line on which the current record starts.</summary>
    public long Line { get; private set; }

    /// <summary>Fields of the current record.</summary>
    public string[] Fields { get; private set; } = [];

    /// <summary>Advances to the next non-blank record; false at end of file.</summary>
    public bool Read()
    {
        while (true)
        {
            bool ok;
            try
            {
                _reading = true;
                ok = _parser.Read();
            }
            catch (CsvHelperException e) when (e.InnerException is SurveyInputException inner)
            {
                throw inner;
            }
            catch (MaxFieldSizeException)
            {
                throw InputErrors.At(_path, CurrentRecordLine, null,
                    $"a field is longer than {SurveyTextReader.MaxLineChars:N0} characters",
                    "check for a quote that is opened and never closed");
            }
            finally
            {
                _reading = false;
            }
            if (!ok) return false;
            Line = _linesConsumed + 1;
            _linesConsumed = _parser.RawRow;
            var record = _parser.Record ?? [];
            if (record.Length == 1 && record[0].Length == 0) continue; // blank line
            if (record.Length > MaxFields) throw InputErrors.TooManyFields(_path, Line, record.Length, MaxFields);
            Fields = record;
            return true;
        }
    }

    public void Dispose()
    {
        _parser.Dispose();
        _reader.Dispose();
    }
}
