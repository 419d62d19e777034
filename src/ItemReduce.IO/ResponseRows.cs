using System.Globalization;
using System.Runtime.CompilerServices;
using ItemReduce.Core.Data;

namespace ItemReduce.IO;

/// <summary>
/// The row loop of <see cref="ResponseReader"/>: fields are read as spans and validated in the order missing code →
/// finite number → codebook range; a cell becomes a string only when it is an id or in an error. While every item fits
/// in one byte per answer, answers go straight to byte codes (a one-digit answer through a table per item); otherwise,
/// and from the first answer that does not fit, as doubles.
/// <para>Respondent ids are checked for duplicates on a second thread, in row order, a batch of rows at a time. The
/// error reported is still the first one in the file: before any other error is raised the ids up to that row are
/// checked, and a duplicate on an earlier line (or on the same row, whose id comes first) wins.</para>
/// </summary>
internal sealed class ResponseRows
{
    private const int Batch = 4096;
    private const short OutOfScale = -1;

    private readonly CsvRecordReader _csv;
    private readonly string _path;
    private readonly string[] _header;
    private readonly int[] _itemCol;
    private readonly int _idCol;
    private readonly double[] _min, _max;
    private readonly HashSet<string>.AlternateLookup<ReadOnlySpan<char>> _missingSpan;
    private readonly short[] _digitCode; // [j * 10 + digit]: byte code, MissingCode, or OutOfScale
    private readonly bool[] _digitMissing;
    private readonly ResponseMatrixBuilder _builder;
    private readonly Func<string, long> _firstLineOf;
    private readonly double[] _row;
    private readonly byte[] _codes;

    // Duplicate-id check (second thread).
    private readonly HashSet<string> _seenIds;
    private string[] _batchIds = new string[Batch];
    private long[] _batchLines = new long[Batch];
    private int _batchCount;
    private Task _idTask = Task.CompletedTask;
    private volatile bool _duplicateFound;
    private (long Line, string Id)? _duplicate;

    public ResponseRows(CsvRecordReader csv, string path, string[] header, int[] itemCol, int idCol, ItemDefinition[] items,
        HashSet<string> missing, ResponseMatrixBuilder builder, int expectedRows, Func<string, long> firstLineOf)
    {
        _csv = csv;
        _path = path;
        _header = header;
        _itemCol = itemCol;
        _idCol = idCol;
        _min = items.Select(i => i.Min).ToArray();
        _max = items.Select(i => i.Max).ToArray();
        _missingSpan = missing.GetAlternateLookup<ReadOnlySpan<char>>();
        _builder = builder;
        _firstLineOf = firstLineOf;
        _seenIds = new HashSet<string>(expectedRows, StringComparer.Ordinal);
        int p = items.Length;
        _row = new double[p];
        _codes = new byte[p];
        _digitMissing = new bool[10];
        for (int d = 0; d < 10; d++) _digitMissing[d] = missing.Contains(((char)('0' + d)).ToString());
        _digitCode = new short[p * 10];
        for (int j = 0; j < p; j++)
            for (int d = 0; d < 10; d++)
                _digitCode[j * 10 + d] = _digitMissing[d] ? ResponseMatrixBuilder.MissingCode
                    : d >= _min[j] && d <= _max[j] ? (short)(d - _min[j]) : OutOfScale; // ItemDefinition.InRange
    }

    /// <summary>Reads every remaining row into the builder; throws the first error in the file.</summary>
    public void ReadAll(Action<int>? progress, int progressEvery)
    {
        try
        {
            ReadRows(progress, progressEvery);
        }
        catch (SurveyInputException)
        {
            ThrowDuplicateBefore(_csv.Line);
            throw;
        }
        ThrowDuplicateBefore(long.MaxValue);
    }

    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private void ReadRows(Action<int>? progress, int progressEvery)
    {
        var csv = _csv;
        int p = _itemCol.Length, width = _header.Length;
        while (csv.Read())
        {
            if (csv.FieldCount != width) throw InputErrors.Ragged(_path, csv.Line, width, csv.FieldCount);
            string id;
            if (_idCol >= 0)
            {
                var idSpan = csv.Field(_idCol).Trim();
                if (idSpan.Length == 0) throw InputErrors.EmptyId(_path, csv.Line, _header[_idCol]);
                id = idSpan.ToString();
            }
            else id = csv.Line.ToString(CultureInfo.InvariantCulture);
            AddId(id, csv.Line);
            if (_builder.IsCompact && ReadCodes(p)) _builder.AddCodes(id, _codes);
            else
            {
                ReadValues(p);
                _builder.Add(id, _row); // switches the builder to doubles when a value does not fit a byte code
            }
            if (progress is not null && _builder.Count % progressEvery == 0) progress(_builder.Count);
        }
    }

    /// <summary>The row's answers as byte codes; false (nothing stored) when one does not fit a byte code.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private bool ReadCodes(int p)
    {
        var csv = _csv;
        for (int j = 0; j < p; j++)
        {
            var raw = csv.Field(_itemCol[j]);
            if (raw.Length == 1 && char.IsAsciiDigit(raw[0]))
            {
                short k = _digitCode[j * 10 + (raw[0] - '0')];
                if (k == OutOfScale) throw OutOfRange(j, raw);
                _codes[j] = (byte)k;
                continue;
            }
            if (!Parse(j, raw, out double v)) { _codes[j] = ResponseMatrixBuilder.MissingCode; continue; }
            // The code must decode to exactly the same double (ResponseMatrixBuilder's rule for compact storage).
            double c = v - _min[j];
            if (!(c >= 0 && c < ResponseMatrixBuilder.MissingCode) || Math.Floor(c) != c
                || BitConverter.DoubleToInt64Bits(_min[j] + c) != BitConverter.DoubleToInt64Bits(v)) return false;
            _codes[j] = (byte)c;
        }
        return true;
    }

    /// <summary>The row's answers as doubles (NaN = missing).</summary>
    private void ReadValues(int p)
    {
        for (int j = 0; j < p; j++) _row[j] = Parse(j, _csv.Field(_itemCol[j]), out double v) ? v : double.NaN;
    }

    /// <summary>Missing code → false; else the finite number within the codebook range, or an error.</summary>
    private bool Parse(int j, ReadOnlySpan<char> raw, out double v)
    {
        var cell = raw.Trim();
        // The common one-digit answer: missing codes first, then the digit itself (exactly what double.TryParse gives).
        if (cell.Length == 1 && char.IsAsciiDigit(cell[0]))
        {
            int d = cell[0] - '0';
            v = d;
            if (_digitMissing[d]) return false;
        }
        else if (_missingSpan.Contains(cell)) { v = double.NaN; return false; }
        else if (!double.TryParse(cell, NumberStyles.Float, CultureInfo.InvariantCulture, out v) || !double.IsFinite(v))
            throw InputErrors.NotANumber(_path, _csv.Line, _header[_itemCol[j]], raw.ToString());
        if (!(v >= _min[j] && v <= _max[j])) throw OutOfRange(j, raw); // ItemDefinition.InRange
        return true;
    }

    private SurveyInputException OutOfRange(int j, ReadOnlySpan<char> raw) =>
        InputErrors.OutOfRange(_path, _csv.Line, _header[_itemCol[j]], raw.ToString(), _min[j], _max[j]);

    private void AddId(string id, long line)
    {
        _batchIds[_batchCount] = id;
        _batchLines[_batchCount] = line;
        if (++_batchCount < Batch) return;
        PostBatch();
        if (_duplicateFound) ThrowDuplicateBefore(line);
    }

    private void PostBatch()
    {
        var ids = _batchIds;
        var lines = _batchLines;
        int n = _batchCount;
        _idTask = _idTask.ContinueWith(_ => CheckIds(ids, lines, n), TaskScheduler.Default);
        _batchIds = new string[Batch];
        _batchLines = new long[Batch];
        _batchCount = 0;
    }

    private void CheckIds(string[] ids, long[] lines, int n)
    {
        if (_duplicate is not null) return;
        for (int i = 0; i < n; i++)
        {
            if (_seenIds.Add(ids[i])) continue;
            _duplicate = (lines[i], ids[i]);
            _duplicateFound = true;
            return;
        }
    }

    /// <summary>Checks the ids of every row read so far and throws the duplicate-id error if one lies on or before
    /// <paramref name="line"/>.</summary>
    private void ThrowDuplicateBefore(long line)
    {
        if (_batchCount > 0) PostBatch();
        _idTask.Wait();
        if (_duplicate is { } d && d.Line <= line)
            throw InputErrors.DuplicateId(_path, d.Line, _header[Math.Max(_idCol, 0)], d.Id, _firstLineOf(d.Id));
    }
}
