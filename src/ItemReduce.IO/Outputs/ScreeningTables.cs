using System.Globalization;
using System.Runtime.CompilerServices;
using ItemReduce.Core.Screening;
using static ItemReduce.IO.SafeCsvWriter;

namespace ItemReduce.IO.Outputs;

/// <summary>CSV tables of the screening stage.</summary>
public static class ScreeningTables
{
    private const int Decimals = 6;

    /// <summary>
    /// <c>respondent-flags.csv</c>: one row per respondent in input order: respondent, items_answered, d2,
    /// robust_d2, cutoff, p_value, long_string, irv, missing_share, flagged, reasons (then robust_p_value, even_odd,
    /// alternating_run, person_total, synonyms, antonyms, random_answer_llr, and sample when <paramref name="samples"/> is given).
    /// </summary>
    public static string RespondentFlags(ScreeningResult screening, IReadOnlyList<string>? samples = null)
    {
        using var bytes = new MemoryStream();
        WriteRespondentFlags(screening, bytes, samples);
        return Utf8NoBom.GetString(bytes.GetBuffer(), 0, (int)bytes.Length);
    }

    private static readonly System.Text.UTF8Encoding Utf8NoBom = new(false);

    /// <summary>Streams <c>respondent-flags.csv</c> as UTF-8 (no BOM; same text as <see cref="RespondentFlags"/>) to
    /// <paramref name="sink"/> block by block, so a large panel never becomes one string in memory.</summary>
    /// <param name="screening">Screening result.</param>
    /// <param name="sink">Destination.</param>
    /// <param name="samples">Optional: one sample label per respondent (<see cref="Core.Pipeline.RespondentSamples"/>), written as
    /// the last column <c>sample</c>.</param>
    public static void WriteRespondentFlags(ScreeningResult screening, Stream sink, IReadOnlyList<string>? samples = null)
    {
        ArgumentNullException.ThrowIfNull(screening);
        ArgumentNullException.ThrowIfNull(sink);
        var header = new SafeCsvWriter(["respondent", "items_answered", "d2", "robust_d2", "cutoff", "p_value", "long_string", "irv",
            "missing_share", "flagged", "reasons", "robust_p_value", "even_odd", "alternating_run", "person_total", "synonyms", "antonyms",
            "random_answer_llr", .. samples is null ? Array.Empty<string>() : ["sample"]]);
        var sampleCells = samples?.Distinct().ToDictionary(x => x, x => Utf8NoBom.GetBytes("," + Text(x)));
        sink.Write(Utf8NoBom.GetBytes(header.ToString()));
        // Rows are formatted straight into reused UTF-8 buffers with the same cell rules as SafeCsvWriter (Text, Integer,
        // Number, Bool), so no per-cell strings are made; reason cells are cached per reason list. Blocks of rows are
        // formatted in parallel and written in input order.
        var reasonCells = new System.Collections.Concurrent.ConcurrentDictionary<IReadOnlyList<string>, byte[]>(ReferenceEqualityComparer.Instance);
        var rows = screening.Respondents;
        int n = rows.Count, blocks = Math.Max(1, Environment.ProcessorCount) * 2;
        var buffers = new RowBuffer[blocks];
        for (int b = 0; b < blocks; b++) buffers[b] = new RowBuffer();
        for (int start = 0; start < n; start += blocks * FormatBlockRows)
        {
            int first = start;
            Parallel.For(0, blocks, [MethodImpl(MethodImplOptions.AggressiveOptimization)] (b) =>
            {
                var line = buffers[b];
                line.Clear();
                int end = (int)Math.Min(n, first + (long)(b + 1) * FormatBlockRows);
                for (int i = first + b * FormatBlockRows; i < end; i++)
                {
                    var x = rows[i];
                    byte[] reasons = reasonCells.GetOrAdd(x.Reasons, list => Utf8NoBom.GetBytes(Text(string.Join(';', list))));
                    line.Text(Text(x.RespondentId)).Sep().Integer(x.ItemsAnswered).Sep().Rounded(x.D2).Sep().Rounded(x.RobustD2).Sep()
                        .Rounded(x.Cutoff).Sep().Number(x.PValue).Sep().Integer(x.LongString).Sep().Rounded(x.Irv).Sep().Rounded(x.MissingShare).Sep()
                        .Bytes(x.Flagged ? True : False).Sep().Bytes(reasons).Sep().Number(x.RobustPValue).Sep().Rounded(x.EvenOdd)
                        .Sep().Integer(x.AlternatingRun).Sep().Rounded(x.PersonTotal).Sep().Rounded(x.Synonyms).Sep().Rounded(x.Antonyms)
                        .Sep().Rounded(x.RandomAnswering);
                    if (samples is not null) line.Bytes(sampleCells![samples[i]]);
                    line.Bytes("\n"u8);
                }
            });
            foreach (var line in buffers) sink.Write(line.Span);
        }
    }

    private static readonly byte[] True = Utf8NoBom.GetBytes(Bool(true)), False = Utf8NoBom.GetBytes(Bool(false));

    /// <summary>
    /// Writes the text <c>Math.Round(v, 6).ToString("R")</c> (v finite) as UTF-8 into <paramref name="destination"/>
    /// (≥ 64 bytes) and returns its length. Fast path: when x = Math.Round(v, 6) is exactly the double nearest to m / 10⁶
    /// for the integer m = round(x · 10⁶) and 10⁻⁴ ≤ |x| &lt; 10⁹, the shortest round-trip text of x is m / 10⁶ in plain
    /// notation without trailing zeros (at most 15 significant digits: no other decimal that short lies within half an
    /// ulp of x), so m is printed directly; otherwise the general formatter is used.
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    internal static int FormatRounded(double v, Span<byte> destination)
    {
        double x = Math.Round(v, Decimals);
        double a = Math.Abs(x);
        if (a >= 1e-4 && a < 1e9)
        {
            long m = (long)Math.Round(x * 1e6);
            if (m / 1e6 == x) return Fixed(m, destination);
        }
        x.TryFormat(destination, out int written, "R", CultureInfo.InvariantCulture);
        return written;
    }

    /// <summary>Writes m / 10⁶ in plain decimal notation without trailing zeros; returns the length.</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private static int Fixed(long m, Span<byte> span)
    {
        int n = 0;
        if (m < 0) { span[n++] = (byte)'-'; m = -m; }
        long whole = m / 1_000_000;
        int frac = (int)(m - whole * 1_000_000);
        whole.TryFormat(span[n..], out int w, default, CultureInfo.InvariantCulture);
        n += w;
        if (frac == 0) return n;
        span[n] = (byte)'.';
        // Six digits from two three-digit groups, then the trailing zeros dropped.
        int high = frac / 1000, low = frac - high * 1000;
        var digits = ThreeDigits.AsSpan();
        digits.Slice(high * 3, 3).CopyTo(span[(n + 1)..]);
        digits.Slice(low * 3, 3).CopyTo(span[(n + 4)..]);
        int end = n + 7;
        while (span[end - 1] == (byte)'0') end--;
        return end;
    }

    /// <summary>"000", "001", … "999" as ASCII.</summary>
    private static readonly byte[] ThreeDigits = Enumerable.Range(0, 1000)
        .SelectMany(v => System.Text.Encoding.ASCII.GetBytes(v.ToString("000", CultureInfo.InvariantCulture))).ToArray();

    /// <summary>Rows formatted per parallel block of <see cref="WriteRespondentFlags"/>.</summary>
    private const int FormatBlockRows = 8192;

    /// <summary>A growable UTF-8 buffer for CSV rows; numbers are formatted as <see cref="SafeCsvWriter.Number(double)"/>
    /// and <see cref="SafeCsvWriter.Number(double, int)"/> with <see cref="Decimals"/> would format them.</summary>
    private sealed class RowBuffer
    {
        private byte[] _bytes = new byte[1 << 20];
        private int _length;

        public ReadOnlySpan<byte> Span => _bytes.AsSpan(0, _length);

        public void Clear() => _length = 0;

        public RowBuffer Sep() => Bytes(","u8);

        public RowBuffer Bytes(ReadOnlySpan<byte> b)
        {
            Ensure(b.Length);
            b.CopyTo(_bytes.AsSpan(_length));
            _length += b.Length;
            return this;
        }

        public RowBuffer Text(string s)
        {
            Ensure(Utf8NoBom.GetMaxByteCount(s.Length));
            _length += Utf8NoBom.GetBytes(s, _bytes.AsSpan(_length));
            return this;
        }

        public RowBuffer Integer(long v) => Format(v);

        /// <summary>As <see cref="SafeCsvWriter.Number(double)"/>: round-trip text, empty for NaN/infinity.</summary>
        public RowBuffer Number(double v) => double.IsFinite(v) ? Format(v) : this;

        /// <summary>As <see cref="SafeCsvWriter.Number(double, int)"/> with <see cref="Decimals"/> decimals (see <see
        /// cref="FormatRounded"/>).</summary>
        public RowBuffer Rounded(double v)
        {
            if (!double.IsFinite(v)) return this;
            Ensure(64);
            _length += FormatRounded(v, _bytes.AsSpan(_length));
            return this;
        }

        private RowBuffer Format<T>(T v) where T : IUtf8SpanFormattable
        {
            while (true)
            {
                Ensure(32);
                if (v.TryFormat(_bytes.AsSpan(_length), out int written, typeof(T) == typeof(double) ? "R" : default, CultureInfo.InvariantCulture))
                {
                    _length += written;
                    return this;
                }
                Array.Resize(ref _bytes, _bytes.Length * 2);
            }
        }

        private void Ensure(int extra)
        {
            if (_length + extra > _bytes.Length) Array.Resize(ref _bytes, Math.Max(_bytes.Length * 2, _length + extra));
        }
    }

    /// <summary>
    /// <c>centre-share-by-items.csv</c>: for k items, the share of a standardized normal sample inside the
    /// half-peak-density region and beyond the chi-square cutoff.
    /// </summary>
    public static string CentreShareByItems(ScreeningResult screening)
    {
        var w = new SafeCsvWriter(["items", "share_inside_half_peak", "share_beyond_cutoff", "cutoff"]);
        foreach (var h in screening.CentreShareByItems)
            w.AppendRow([Integer(h.Items), Number(h.ShareInsideHalfPeak), Number(h.ShareBeyondCutoff), Number(h.Cutoff, Decimals)]);
        return w.ToString();
    }
}
