using System.Globalization;
using System.Runtime.CompilerServices;
using System.Text;

namespace ItemReduce.IO;

/// <summary>
/// Reads an input text file for the CSV parser with bounded memory and exact error locations:
/// <list type="bullet">
/// <item>encoding from the byte-order mark (UTF-8, UTF-16 LE/BE, UTF-32 LE/BE), UTF-8 without one; text that looks like
/// UTF-16/32 without a byte-order mark (many NUL bytes) is refused with a message that says so;</item>
/// <item>invalid bytes are reported on their true 1-based line: the file is decoded in whole characters per block
/// without running ahead of the line count, and the characters before a bad byte are still delivered, so the error is
/// raised only when the parser reaches it (an earlier error in the file is reported first);</item>
/// <item>a line longer than <see cref="MaxLineChars"/> characters stops the read at that line, before the parser
/// buffers it; with <c>boundQuotedRecords</c>, so does a CSV record that runs on inside double quotes over many lines
/// for more than that many characters (a quote opened and never closed), reported on the line where it starts.</item>
/// </list>
/// Lines end at <c>\n</c>, <c>\r\n</c> or a lone <c>\r</c>.
/// </summary>
public sealed class SurveyTextReader : TextReader
{
    /// <summary>Longest line accepted, in characters (1 Mi; a 300-item row needs about 2,000).</summary>
    public const int MaxLineChars = 1 << 20;

    private const int Block = 1 << 16;
    private static readonly string InvalidFix = "save the file as UTF-8 (or UTF-16 with a byte-order mark)";

    private readonly string _path;
    private readonly Stream _stream;
    private readonly Encoding _encoding;
    private readonly int _unit; // bytes per code unit: 1, 2 or 4
    private readonly byte[] _bytes = new byte[2 * Block + 8];
    private int _carry; // undecoded bytes at the start of _bytes (an incomplete character)
    private readonly char[] _chars = new char[2 * Block + 8];
    private int _charPos, _charLen;
    private long _line = 1; // line of the next character to be decoded
    private int _lineLength;
    private bool _lastWasCr;
    private bool _eof;
    private SurveyInputException? _pending; // raised once the characters before it are consumed
    private readonly bool _boundRecords;
    private bool _inQuotes; // CSV quote parity (every double quote toggles it, as the parser counts them)
    private long _recordLength; // characters of the current CSV record decoded so far (line breaks inside quotes included)
    private long _recordLine = 1; // line on which the current CSV record starts

    /// <param name="path">The file.</param>
    /// <param name="boundQuotedRecords">Also bound CSV records that continue over line breaks inside double quotes.</param>
    public SurveyTextReader(string path, bool boundQuotedRecords = false)
    {
        _path = path;
        _boundRecords = boundQuotedRecords;
        _stream = new FileStream(path, FileMode.Open, FileAccess.Read, FileShare.Read, 1 << 16, FileOptions.SequentialScan);
        try
        {
            int n = ReadFully(_bytes, 0, Block);
            (_encoding, int bom) = Detect(_bytes, n);
            _unit = _encoding is UTF32Encoding ? 4 : _encoding is UnicodeEncoding ? 2 : 1;
            if (bom == 0 && LooksLikeWideText(_bytes, n))
                _pending = InputErrors.At(path, 1, null,
                    "the file holds many NUL bytes: it looks like UTF-16 or UTF-32 text without a byte-order mark (or is not a text file)",
                    InvalidFix);
            Buffer.BlockCopy(_bytes, bom, _bytes, 0, n - bom);
            _carry = n - bom;
            if (n < Block) _eof = true;
        }
        catch
        {
            _stream.Dispose();
            throw;
        }
    }

    /// <summary>Encoding in use (from the byte-order mark; UTF-8 by default).</summary>
    public Encoding Encoding => _encoding;

    public override int Peek() => Fill() ? _chars[_charPos] : -1;

    public override int Read() => Fill() ? _chars[_charPos++] : -1;

    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public override int Read(char[] buffer, int index, int count) => Read(buffer.AsSpan(index, count));

    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public override int Read(Span<char> buffer)
    {
        if (buffer.Length == 0 || !Fill()) return 0;
        int n = Math.Min(buffer.Length, _charLen - _charPos);
        _chars.AsSpan(_charPos, n).CopyTo(buffer);
        _charPos += n;
        return n;
    }

    public override string? ReadLine()
    {
        if (!Fill()) return null;
        var sb = new StringBuilder();
        while (Fill())
        {
            var span = _chars.AsSpan(_charPos, _charLen - _charPos);
            int k = span.IndexOfAny('\n', '\r');
            if (k < 0)
            {
                sb.Append(span);
                _charPos = _charLen;
                continue;
            }
            sb.Append(span[..k]);
            _charPos += k + 1;
            if (span[k] == '\r' && Peek() == '\n') _charPos++;
            break;
        }
        return sb.ToString();
    }

    /// <summary>Makes characters available; false at the end of the file; throws a pending error when reached.</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private bool Fill()
    {
        while (_charPos >= _charLen)
        {
            if (_pending is not null) throw _pending;
            if (_eof && _carry == 0) return false;
            DecodeBlock();
        }
        return true;
    }

    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private void DecodeBlock()
    {
        if (!_eof)
        {
            int n = ReadFully(_bytes, _carry, Block);
            if (n < Block) _eof = true;
            _carry += n;
        }
        int whole = _eof ? _carry : CompleteLength(_bytes, _carry);
        if (_eof && whole % _unit != 0) whole -= whole % _unit; // a trailing partial code unit is invalid below
        _charPos = 0;
        try
        {
            _charLen = _encoding.GetChars(_bytes, 0, whole, _chars, 0);
        }
        catch (DecoderFallbackException e)
        {
            int good = Math.Clamp(e.Index, 0, whole);
            good -= good % _unit;
            _charLen = good == 0 ? 0 : _encoding.GetChars(_bytes, 0, good, _chars, 0);
            ScanLines();
            _pending ??= InputErrors.At(_path, _line, null, "the text is not valid " + Name(_encoding), InvalidFix);
            _carry = 0;
            _eof = true;
            return;
        }
        if (_eof && whole < _carry && _pending is null)
        {
            ScanLines();
            _pending = InputErrors.At(_path, _line, null, "the file ends inside a character (" + Name(_encoding) + ")", InvalidFix);
            _carry = 0;
            return;
        }
        Buffer.BlockCopy(_bytes, whole, _bytes, 0, _carry - whole);
        _carry -= whole;
        ScanLines();
    }

    /// <summary>Counts line breaks in the freshly decoded characters and cuts them at an over-long line. A block holds
    /// fewer characters than <see cref="MaxLineChars"/>, so only the line running in from earlier blocks (the block's
    /// first segment) can exceed it; the rest is counted with vectorised passes.</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private void ScanLines()
    {
        var span = _chars.AsSpan(0, _charLen);
        if (span.Length == 0) return;
        int first = span.IndexOfAny('\n', '\r');
        int firstSegment = first < 0 ? span.Length : first;
        if (_lineLength + firstSegment > MaxLineChars)
        {
            _charLen = MaxLineChars - _lineLength;
            _pending ??= InputErrors.At(_path, _line, null,
                $"the line is longer than {MaxLineChars.ToString("N0", CultureInfo.InvariantCulture)} characters",
                "check that this is a CSV file with one respondent per line and no runaway quoted field");
            _carry = 0;
            _eof = true;
            return;
        }
        if (_boundRecords && BoundRecords(span))
        {
            span = span[.._charLen];
            if (span.Length == 0) return;
            first = span.IndexOfAny('\n', '\r');
        }
        if (first < 0)
        {
            _lineLength += span.Length;
            _lastWasCr = false;
            return;
        }
        // Lines end at \n, \r\n or a lone \r: count both characters, then take back each \r\n pair once.
        int lf = span.Count('\n'), cr = span.Count('\r');
        int pairs = 0;
        if (_lastWasCr && span[0] == '\n') pairs++; // the pair straddles the blocks; its \r was counted before
        if (cr > 0)
        {
            for (int at = span.IndexOf("\r\n"); at >= 0;)
            {
                pairs++;
                int next = span[(at + 2)..].IndexOf("\r\n");
                at = next < 0 ? -1 : at + 2 + next;
            }
        }
        _line += lf + cr - pairs;
        if (_recordLine < 0) _recordLine = _line;
        _lineLength = span.Length - 1 - span.LastIndexOfAny('\n', '\r');
        _lastWasCr = span[^1] == '\r';
    }

    /// <summary>Tracks the CSV record that the freshly decoded characters continue (records end at a line break outside
    /// double quotes) and cuts them where a record passes <see cref="MaxLineChars"/>; true when it cut. Blocks without
    /// a quote are handled with vectorised searches; only blocks holding a quote are walked character by character.</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private bool BoundRecords(ReadOnlySpan<char> span)
    {
        int cut = -1;
        if (!span.Contains('"'))
        {
            int first = _inQuotes ? -1 : span.IndexOfAny('\n', '\r');
            if (first < 0)
            {
                if (_recordLength + span.Length > MaxLineChars) cut = (int)(MaxLineChars - _recordLength);
                else _recordLength += span.Length;
            }
            else if (_recordLength + first > MaxLineChars) cut = (int)(MaxLineChars - _recordLength);
            else
            {
                _recordLength = span.Length - 1 - span.LastIndexOfAny('\n', '\r');
                _recordLine = -1; // the line after the block's last break: set once the block's lines are counted
            }
        }
        else
        {
            long line = _line;
            bool lastWasCr = _lastWasCr;
            for (int k = 0; k < span.Length; k++)
            {
                char c = span[k];
                if (c == '\n' || c == '\r')
                {
                    if (c == '\r' || !lastWasCr) line++;
                    lastWasCr = c == '\r';
                    if (!_inQuotes) { _recordLength = 0; _recordLine = line; continue; }
                }
                else
                {
                    lastWasCr = false;
                    if (c == '"') _inQuotes = !_inQuotes;
                }
                if (++_recordLength > MaxLineChars) { cut = k; break; }
            }
        }
        if (cut < 0) return false;
        _charLen = cut;
        _pending ??= InputErrors.At(_path, _recordLine, null,
            $"a field is longer than {MaxLineChars.ToString("N0", CultureInfo.InvariantCulture)} characters",
            "check for a quote that is opened and never closed");
        _carry = 0;
        _eof = true;
        return true;
    }

    /// <summary>Length of the prefix that holds whole characters (the rest waits for the next block).</summary>
    private int CompleteLength(byte[] b, int n)
    {
        if (_unit == 4) return n - n % 4;
        if (_unit == 2)
        {
            int m = n - n % 2;
            if (m >= 2)
            {
                bool bigEndian = _encoding.GetPreamble() is [0xFE, 0xFF];
                int unit = bigEndian ? (b[m - 2] << 8) | b[m - 1] : (b[m - 1] << 8) | b[m - 2];
                if (unit is >= 0xD800 and <= 0xDBFF) m -= 2; // high surrogate: its pair is in the next block
            }
            return m;
        }
        // UTF-8: step back over continuation bytes to the last lead byte; keep it back if its sequence is incomplete.
        int j = n - 1, back = 0;
        while (j >= 0 && back < 3 && (b[j] & 0xC0) == 0x80) { j--; back++; }
        if (j < 0) return n;
        int lead = b[j];
        int need = lead < 0x80 ? 1 : (lead & 0xE0) == 0xC0 ? 2 : (lead & 0xF0) == 0xE0 ? 3 : (lead & 0xF8) == 0xF0 ? 4 : 1;
        return n - j >= need ? n : j;
    }

    private int ReadFully(byte[] buffer, int offset, int count)
    {
        int total = 0;
        while (total < count)
        {
            int n = _stream.Read(buffer, offset + total, count - total);
            if (n == 0) break;
            total += n;
        }
        return total;
    }

    private static (Encoding Encoding, int Bom) Detect(byte[] b, int n)
    {
        if (n >= 4 && b[0] == 0xFF && b[1] == 0xFE && b[2] == 0 && b[3] == 0) return (new UTF32Encoding(false, true, true), 4);
        if (n >= 4 && b[0] == 0 && b[1] == 0 && b[2] == 0xFE && b[3] == 0xFF) return (new UTF32Encoding(true, true, true), 4);
        if (n >= 3 && b[0] == 0xEF && b[1] == 0xBB && b[2] == 0xBF) return (new UTF8Encoding(false, true), 3);
        if (n >= 2 && b[0] == 0xFF && b[1] == 0xFE) return (new UnicodeEncoding(false, true, true), 2);
        if (n >= 2 && b[0] == 0xFE && b[1] == 0xFF) return (new UnicodeEncoding(true, true, true), 2);
        return (new UTF8Encoding(false, true), 0);
    }

    /// <summary>True when at least a quarter of the first bytes are NUL, as in ASCII text stored as UTF-16 or UTF-32.</summary>
    private static bool LooksLikeWideText(byte[] b, int n) => n >= 4 && b.AsSpan(0, n).Count((byte)0) * 4 >= n;

    private static string Name(Encoding e) => e switch
    {
        UTF32Encoding => "UTF-32",
        UnicodeEncoding => "UTF-16",
        _ => "UTF-8",
    };

    protected override void Dispose(bool disposing)
    {
        if (disposing) _stream.Dispose();
        base.Dispose(disposing);
    }
}
