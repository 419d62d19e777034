namespace ItemReduce.Core.Data;

/// <summary>
/// Collects validated rows one at a time into a <see cref="ResponseMatrix"/>, storing them compactly (one byte per
/// cell, see <see cref="ResponseMatrix"/>) while every item's scale allows it and every value is an integer code
/// on it, and switching once to dense doubles otherwise. Values are stored as given: decoding returns exactly the
/// doubles that were added. Storage grows by half its size, so the peak while reading is about 1.5 × the final
/// cells (one byte each in the compact case).
/// </summary>
public sealed class ResponseMatrixBuilder
{
    /// <summary>Byte code of a missing answer in <see cref="AddCodes"/>.</summary>
    public const byte MissingCode = ResponseMatrix.MissingCode;

    private readonly IReadOnlyList<ItemDefinition> _items;
    private readonly int _p;
    private readonly double[] _mins; // item minima, read per cell when encoding
    private readonly List<string> _ids;
    private byte[]? _codes;
    private double[]? _values;
    private long _cells;

    /// <param name="items">Column definitions.</param>
    /// <param name="expectedRows">Capacity hint (rows); 0 = unknown.</param>
    public ResponseMatrixBuilder(IReadOnlyList<ItemDefinition> items, int expectedRows = 0)
    {
        ArgumentNullException.ThrowIfNull(items);
        if (expectedRows < 0) throw new ArgumentException($"expectedRows must be ≥ 0, got {expectedRows}.", nameof(expectedRows));
        _items = items;
        _p = items.Count;
        _mins = items.Select(i => i.Min).ToArray();
        int rows = Math.Max(expectedRows, 1024);
        _ids = new List<string>(rows);
        if (items.All(CanStoreCompact)) _codes = new byte[(long)rows * _p];
        else _values = new double[(long)rows * _p];
    }

    /// <summary>True when the item's answers can be stored as byte codes x − min: finite integer bounds at most
    /// 254 apart (code 255 marks a missing answer).</summary>
    public static bool CanStoreCompact(ItemDefinition item)
    {
        ArgumentNullException.ThrowIfNull(item);
        return double.IsFinite(item.Min) && Math.Abs(item.Min) < 1e15 && Math.Floor(item.Min) == item.Min
               && item.Max - item.Min <= ResponseMatrix.MissingCode - 1;
    }

    /// <summary>Rows added so far.</summary>
    public int Count => _ids.Count;

    /// <summary>True while rows are stored one byte per cell.</summary>
    public bool IsCompact => _codes is not null;

    /// <summary>Adds one respondent; <paramref name="values"/> has one value per item (NaN = missing).</summary>
    public void Add(string id, ReadOnlySpan<double> values)
    {
        ArgumentNullException.ThrowIfNull(id);
        if (values.Length != _p) throw new ArgumentException($"Expected {_p} values, got {values.Length}.", nameof(values));
        Reserve();
        if (_codes is not null && !TryEncode(values, _codes.AsSpan((int)_cells, _p))) SwitchToDense();
        if (_values is not null) values.CopyTo(_values.AsSpan((int)_cells, _p));
        _cells += _p;
        _ids.Add(id);
    }

    /// <summary>Adds one respondent given as byte codes (answer − item minimum; 255 = missing) while
    /// <see cref="IsCompact"/>; every code must lie within its item's scale. The same as <see cref="Add"/> with the
    /// decoded values, without decoding.</summary>
    public void AddCodes(string id, ReadOnlySpan<byte> codes)
    {
        ArgumentNullException.ThrowIfNull(id);
        if (_codes is null) throw new InvalidOperationException("The builder no longer stores byte codes.");
        if (codes.Length != _p) throw new ArgumentException($"Expected {_p} codes, got {codes.Length}.", nameof(codes));
        Reserve();
        codes.CopyTo(_codes.AsSpan((int)_cells, _p));
        _cells += _p;
        _ids.Add(id);
    }

    /// <summary>The matrix; the builder must not be used afterwards.</summary>
    public ResponseMatrix Build()
    {
        if (_codes is not null)
        {
            // The spare capacity (at most half) is kept rather than copied away, to avoid a second copy at peak memory.
            var codes = _codes;
            _codes = null;
            return ResponseMatrix.FromCodes(_ids, _items, codes);
        }
        var values = _values!.Length == _cells ? _values : _values.AsSpan(0, (int)_cells).ToArray();
        _values = null;
        return new ResponseMatrix(_ids, _items, values);
    }

    private bool TryEncode(ReadOnlySpan<double> values, Span<byte> codes)
    {
        for (int j = 0; j < _p; j++)
        {
            double x = values[j];
            if (double.IsNaN(x)) { codes[j] = ResponseMatrix.MissingCode; continue; }
            double min = _mins[j], c = x - min;
            // The code must decode to exactly the same double (this also rejects −0 and non-integers).
            if (!(c >= 0 && c < ResponseMatrix.MissingCode) || Math.Floor(c) != c
                || BitConverter.DoubleToInt64Bits(min + c) != BitConverter.DoubleToInt64Bits(x)) return false;
            codes[j] = (byte)c;
        }
        return true;
    }

    private void Reserve()
    {
        long need = _cells + _p;
        long capacity = _codes?.LongLength ?? _values!.LongLength;
        if (need <= capacity) return;
        long grown = Math.Max(need, capacity + capacity / 2);
        grown = Math.Min(grown, Array.MaxLength);
        if (grown < need) throw new InvalidOperationException($"The response matrix would exceed {Array.MaxLength} cells.");
        if (_codes is not null) Array.Resize(ref _codes, (int)grown);
        else Array.Resize(ref _values, (int)grown);
    }

    private void SwitchToDense()
    {
        var values = new double[Math.Max(_codes!.LongLength, _cells + _p)];
        var partial = ResponseMatrix.FromCodes(_ids, _items, _codes);
        for (int i = 0; i < _ids.Count; i++) partial.CopyRow(i, values.AsSpan(i * _p, _p));
        _codes = null;
        _values = values;
    }
}
