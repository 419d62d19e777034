using System.Runtime.CompilerServices;
namespace ItemReduce.Core.Data;

/// <summary>
/// Respondents × items response matrix; <see cref="double.NaN"/> marks a missing answer. Row <c>i</c> is
/// respondent <c>i</c> in input order, column <c>j</c> is <see cref="Items"/>[j].
/// <para>
/// Storage is either dense (row-major doubles) or compact: one byte per cell holding the code
/// <c>x − min</c> of an integer-valued answer on an integer-bounded scale with at most 255 categories
/// (<see cref="MissingCode"/> = missing). Compact cells are decoded through a 256-entry table per column, so
/// decoded values are exactly the doubles that were stored. Reverse scoring, <see cref="SelectItems"/> and
/// <see cref="SelectRespondents"/> return views that share the storage (a new decoding table, a column map or
/// a row map), never a copy of the cells. Readers decode rows with <see cref="CopyRow"/> or in blocks with
/// <see cref="Rows"/>; the indexer decodes one cell.
/// </para>
/// </summary>
public sealed class ResponseMatrix
{
    /// <summary>Code of a missing answer in compact storage.</summary>
    internal const byte MissingCode = 255;

    /// <summary>Entries per column of a decoding table.</summary>
    internal const int TableSize = 256;

    private readonly double[]? _values;   // dense cells, physical row-major with stride _stride
    private readonly byte[]? _codes;      // compact cells, physical row-major with stride _stride
    private readonly int _stride;         // physical columns
    private readonly int[]? _rowMap;      // logical row → physical row; null = identity
    private readonly int[] _colMap;       // logical column → physical column
    private readonly bool _identityColumns;
    private readonly double[]? _decode;   // compact: table of logical column k at [k·256, k·256 + 256)

    /// <param name="respondentIds">One id per row.</param>
    /// <param name="items">One definition per column.</param>
    /// <param name="values">Row-major values, length rows × columns; NaN = missing. The array is owned by the matrix.</param>
    public ResponseMatrix(IReadOnlyList<string> respondentIds, IReadOnlyList<ItemDefinition> items, double[] values)
    {
        ArgumentNullException.ThrowIfNull(respondentIds);
        ArgumentNullException.ThrowIfNull(items);
        ArgumentNullException.ThrowIfNull(values);
        if (values.Length != (long)respondentIds.Count * items.Count)
            throw new ArgumentException($"Expected {respondentIds.Count}×{items.Count} values, got {values.Length}.", nameof(values));
        RespondentIds = respondentIds;
        Items = items;
        _values = values;
        _stride = items.Count;
        _colMap = Identity(items.Count);
        _identityColumns = true;
    }

    private ResponseMatrix(IReadOnlyList<string> ids, IReadOnlyList<ItemDefinition> items, double[]? values, byte[]? codes,
        int stride, int[]? rowMap, int[] colMap, double[]? decode)
    {
        RespondentIds = ids;
        Items = items;
        _values = values;
        _codes = codes;
        _stride = stride;
        _rowMap = rowMap;
        _colMap = colMap;
        _decode = decode;
        _identityColumns = colMap.Length == stride && colMap.AsSpan().SequenceEqual(Identity(stride));
    }

    /// <summary>A compact matrix over <paramref name="codes"/> (row-major, one byte per cell, code = x − min,
    /// <see cref="MissingCode"/> = missing; entries past rows × columns are spare capacity and never read). Every item
    /// must satisfy <see cref="ResponseMatrixBuilder.CanStoreCompact"/>.</summary>
    internal static ResponseMatrix FromCodes(IReadOnlyList<string> ids, IReadOnlyList<ItemDefinition> items, byte[] codes)
    {
        if (codes.Length < (long)ids.Count * items.Count)
            throw new ArgumentException($"Expected at least {ids.Count}×{items.Count} codes, got {codes.Length}.", nameof(codes));
        int p = items.Count;
        var decode = new double[p * TableSize];
        for (int j = 0; j < p; j++)
        {
            double min = items[j].Min;
            for (int c = 0; c < MissingCode; c++) decode[j * TableSize + c] = min + c;
            decode[j * TableSize + MissingCode] = double.NaN;
        }
        return new ResponseMatrix(ids, items, null, codes, p, null, Identity(p), decode);
    }

    /// <summary>Number of respondents (rows), n.</summary>
    public int RespondentCount => RespondentIds.Count;

    /// <summary>Number of items (columns), p.</summary>
    public int ItemCount => Items.Count;

    public IReadOnlyList<string> RespondentIds { get; }

    public IReadOnlyList<ItemDefinition> Items { get; }

    /// <summary>True when cells are stored one byte each (see the type summary).</summary>
    public bool IsCompact => _codes is not null;

    /// <summary>Bytes held by the cell storage this matrix refers to (shared with views), for diagnostics.</summary>
    public long StorageBytes => _codes?.LongLength ?? (_values!.LongLength * sizeof(double));

    /// <summary>
    /// Compact storage only, views included (null for dense storage): for each item how many respondents hold
    /// each code (p × <see cref="TableSize"/>, item-major), the decoding table (same layout; NaN = missing), and the
    /// numbers of rows with no answer and with every item answered. One pass over the bytes, no decoding.
    /// </summary>
    internal (long[] CodeCounts, double[] Decode, int NoAnswers, int Complete)? CodeHistogram()
    {
        if (_codes is null) return null;
        // The matrix is immutable, so the histogram is computed once (the summary and the item moments both use it).
        return _histogram ??= ComputeHistogram();
    }

    private (long[] CodeCounts, double[] Decode, int NoAnswers, int Complete)? _histogram;

    private (long[] CodeCounts, double[] Decode, int NoAnswers, int Complete) ComputeHistogram()
    {
        int n = RespondentCount, p = ItemCount;
        var decode = _decode!;
        var missing = new bool[p * TableSize];
        for (int t = 0; t < missing.Length; t++) missing[t] = double.IsNaN(decode[t]);
        var counts = new long[p * TableSize];
        int none = 0, complete = 0;
        var gate = new Lock();
        // Fixed row segments counted in parallel and added up: integer counts, so the result does not depend on the order.
        const int segmentRows = 1 << 16;
        Parallel.For(0, (n + segmentRows - 1) / segmentRows, [MethodImpl(MethodImplOptions.AggressiveOptimization)] (s) =>
        {
            var local = new long[p * TableSize];
            int localNone = 0, localComplete = 0;
            int end = Math.Min(n, (s + 1) * segmentRows);
            var columns = _colMap.AsSpan();
            for (int i = s * segmentRows; i < end; i++)
            {
                var row = _codes.AsSpan((int)((long)Physical(i) * _stride), _stride);
                int skipped = 0;
                for (int k = 0, o = 0; k < columns.Length; k++, o += TableSize)
                {
                    int t = o + row[columns[k]];
                    local[t]++;
                    if (missing[t]) skipped++;
                }
                if (skipped == p) localNone++;
                if (skipped == 0) localComplete++;
            }
            lock (gate)
            {
                for (int t = 0; t < local.Length; t++) counts[t] += local[t];
                none += localNone;
                complete += localComplete;
            }
        });
        return (counts, decode, none, complete);
    }

    /// <summary>
    /// For compact storage whose decoded answers are all integers: the largest absolute value any valid answer can
    /// take (from the decoding tables over each item's [min, max]); null otherwise (dense storage, or a reverse-keyed
    /// item with non-integer bounds).
    /// </summary>
    internal double? IntegerMagnitudeBound()
    {
        if (_decode is null) return null;
        double bound = 0;
        for (int k = 0; k < ItemCount; k++)
        {
            var it = Items[k];
            int top = (int)Math.Min(MissingCode - 1, Math.Floor(it.Max - it.Min));
            for (int c = 0; c <= top; c++)
            {
                double v = _decode[k * TableSize + c];
                if (Math.Floor(v) != v) return null;
                bound = Math.Max(bound, Math.Abs(v));
            }
        }
        return bound;
    }

    private int Physical(int row) => _rowMap is null ? row : _rowMap[row];

    /// <summary>Value of respondent <paramref name="row"/> on item <paramref name="column"/> (NaN = missing).</summary>
    public double this[int row, int column]
    {
        get
        {
            if ((uint)column >= (uint)ItemCount) throw new ArgumentOutOfRangeException(nameof(column), column, $"column must lie in [0, {ItemCount - 1}]");
            long o = (long)Physical(row) * _stride + _colMap[column];
            return _codes is null ? _values![o] : _decode![column * TableSize + _codes[o]];
        }
    }

    /// <summary>Decodes the answers of respondent <paramref name="row"/> into <paramref name="destination"/> (length ≥ p).</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public void CopyRow(int row, Span<double> destination)
    {
        int p = ItemCount;
        if (destination.Length < p) throw new ArgumentException($"Destination holds {destination.Length} values; {p} are needed.", nameof(destination));
        long o = (long)Physical(row) * _stride;
        if (_codes is null)
        {
            if (_identityColumns) { _values.AsSpan((int)o, p).CopyTo(destination); return; }
            for (int k = 0; k < p; k++) destination[k] = _values![o + _colMap[k]];
            return;
        }
        var src = _codes.AsSpan((int)o, _stride);
        var table = _decode!;
        if (_identityColumns)
            for (int k = 0; k < p; k++) destination[k] = table[k * TableSize + src[k]];
        else
            for (int k = 0; k < p; k++) destination[k] = table[k * TableSize + src[_colMap[k]]];
    }

    /// <summary>
    /// Rows <paramref name="first"/> .. first + count − 1 as a row-major block (count × p). Returns a slice of
    /// the storage when it is dense and unmapped, otherwise decodes into <paramref name="scratch"/> (length ≥ count × p)
    /// and returns that. The result must be treated as read-only.
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public ReadOnlySpan<double> Rows(int first, int count, Span<double> scratch)
    {
        int p = ItemCount;
        if ((uint)first > (uint)RespondentCount || count < 0 || first + count > RespondentCount)
            throw new ArgumentOutOfRangeException(nameof(count), $"rows {first}..{first + count - 1} are outside [0, {RespondentCount - 1}]");
        if (_codes is null && _rowMap is null && _identityColumns)
            return _values.AsSpan(first * p, count * p);
        for (int r = 0; r < count; r++) CopyRow(first + r, scratch.Slice(r * p, p));
        return scratch[..(count * p)];
    }

    /// <summary>Calls <paramref name="action"/> on consecutive row-major blocks of at most
    /// <paramref name="blockRows"/> rows, in row order (decoded into one reused scratch block when needed).</summary>
    internal void ForEachBlock(int blockRows, RowBlockAction action)
    {
        int n = RespondentCount;
        var scratch = new double[Math.Min(blockRows, Math.Max(n, 1)) * ItemCount];
        for (int i0 = 0; i0 < n; i0 += blockRows)
        {
            int rows = Math.Min(blockRows, n - i0);
            action(Rows(i0, rows, scratch), rows);
        }
    }

    /// <summary>All values as a new row-major array (n × p).</summary>
    public double[] ToArray()
    {
        int n = RespondentCount, p = ItemCount;
        var v = new double[(long)n * p];
        for (int i = 0; i < n; i++) CopyRow(i, v.AsSpan(i * p, p));
        return v;
    }

    /// <summary>A copy of one item's column.</summary>
    public double[] Column(int column)
    {
        var c = new double[RespondentCount];
        for (int i = 0; i < c.Length; i++) c[i] = this[i, column];
        return c;
    }

    /// <summary>Compact storage only: the codes of one column, in row order (n bytes).</summary>
    internal byte[] ColumnCodes(int column)
    {
        if (_codes is null) throw new InvalidOperationException("The matrix is not stored compactly.");
        var c = new byte[RespondentCount];
        int physical = _colMap[column];
        for (int i = 0; i < c.Length; i++) c[i] = _codes[(long)Physical(i) * _stride + physical];
        return c;
    }

    /// <summary>Compact storage only: a matrix with the same respondents, items and decoding tables over other
    /// row-major codes (n × p, in this matrix's column order).</summary>
    internal ResponseMatrix WithCodes(byte[] codes)
    {
        if (_decode is null) throw new InvalidOperationException("The matrix is not stored compactly.");
        if (codes.Length < (long)RespondentCount * ItemCount)
            throw new ArgumentException($"Expected at least {RespondentCount}×{ItemCount} codes, got {codes.Length}.", nameof(codes));
        return new ResponseMatrix(RespondentIds, Items, null, codes, ItemCount, null, Identity(ItemCount), _decode);
    }

    /// <summary>True when any cell is missing.</summary>
    public bool HasMissing()
    {
        int n = RespondentCount, p = ItemCount;
        if (_rowMap is null && _identityColumns)
        {
            if (_codes is not null) return _codes.AsSpan(0, n * _stride).Contains(MissingCode);
            foreach (double x in _values!) if (double.IsNaN(x)) return true;
            return false;
        }
        for (int i = 0; i < n; i++)
        {
            long o = (long)Physical(i) * _stride;
            for (int k = 0; k < p; k++)
            {
                long c = o + _colMap[k];
                if (_codes is null ? double.IsNaN(_values![c]) : _codes[c] == MissingCode) return true;
            }
        }
        return false;
    }

    /// <summary>True when respondent <paramref name="row"/> answered every item.</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public bool IsComplete(int row)
    {
        long o = (long)Physical(row) * _stride;
        int p = _colMap.Length;
        if (_codes is not null)
        {
            var cells = _codes.AsSpan((int)o, _stride);
            if (_identityColumns) return !cells[..p].Contains(MissingCode);
            foreach (int c in _colMap) if (cells[c] == MissingCode) return false;
            return true;
        }
        var values = _values.AsSpan((int)o, _stride);
        foreach (int c in _colMap) if (double.IsNaN(values[c])) return false;
        return true;
    }

    /// <summary>A view holding the given rows (in the given order); the cells are shared, not copied.</summary>
    public ResponseMatrix SelectRespondents(IReadOnlyList<int> rows)
    {
        ArgumentNullException.ThrowIfNull(rows);
        var map = new int[rows.Count];
        var ids = new string[rows.Count];
        for (int r = 0; r < map.Length; r++)
        {
            int i = rows[r];
            if ((uint)i >= (uint)RespondentCount) throw new ArgumentOutOfRangeException(nameof(rows), i, $"row must lie in [0, {RespondentCount - 1}]");
            map[r] = Physical(i);
            ids[r] = RespondentIds[i];
        }
        return new ResponseMatrix(ids, Items, _values, _codes, _stride, map, _colMap, _decode) { Selection = (this, rows.ToArray()) };
    }

    /// <summary>For a view made by <see cref="SelectRespondents"/>: the matrix it was selected from and the rows chosen
    /// (so that sums over the view can be derived from the parent's sums minus the rows left out); null otherwise.</summary>
    internal (ResponseMatrix Parent, int[] Rows)? Selection { get; private init; }

    /// <summary>A view holding the given columns (in the given order); the cells are shared, not copied.</summary>
    public ResponseMatrix SelectItems(IReadOnlyList<int> columns)
    {
        ArgumentNullException.ThrowIfNull(columns);
        int q = columns.Count;
        var map = new int[q];
        var items = new ItemDefinition[q];
        double[]? decode = _decode is null ? null : new double[q * TableSize];
        for (int k = 0; k < q; k++)
        {
            int c = columns[k];
            if ((uint)c >= (uint)ItemCount) throw new ArgumentOutOfRangeException(nameof(columns), c, $"column must lie in [0, {ItemCount - 1}]");
            map[k] = _colMap[c];
            items[k] = Items[c];
            if (decode is not null) Array.Copy(_decode!, c * TableSize, decode, k * TableSize, TableSize);
        }
        return new ResponseMatrix(RespondentIds, items, _values, _codes, _stride, _rowMap, map, decode);
    }

    /// <summary>
    /// A matrix with the same respondents and items in which every value x of a column with
    /// <paramref name="reflect"/>[j] set becomes <c>sum[j] − x</c> (missing stays missing). Compact storage
    /// gets a new decoding table (the cells are shared); dense storage is copied.
    /// </summary>
    internal ResponseMatrix Reflect(bool[] reflect, double[] sum)
    {
        int n = RespondentCount, p = ItemCount;
        if (_codes is not null)
        {
            var decode = (double[])_decode!.Clone();
            for (int j = 0; j < p; j++)
            {
                if (!reflect[j]) continue;
                for (int c = 0; c < MissingCode; c++) decode[j * TableSize + c] = sum[j] - _decode![j * TableSize + c];
            }
            return new ResponseMatrix(RespondentIds, Items, null, _codes, _stride, _rowMap, _colMap, decode);
        }
        var v = ToArray();
        for (int j = 0; j < p; j++)
        {
            if (!reflect[j]) continue;
            for (int i = 0; i < n; i++)
            {
                long k = (long)i * p + j;
                if (!double.IsNaN(v[k])) v[k] = sum[j] - v[k];
            }
        }
        return WithValues(v);
    }

    /// <summary>A new dense matrix with the same ids and items and the given row-major values.</summary>
    public ResponseMatrix WithValues(double[] values) => new(RespondentIds, Items, values);

    private static int[] Identity(int p)
    {
        var m = new int[p];
        for (int j = 0; j < p; j++) m[j] = j;
        return m;
    }
}

/// <summary>Receives a row-major block of <paramref name="rows"/> rows (see <see cref="ResponseMatrix.ForEachBlock"/>).</summary>
internal delegate void RowBlockAction(ReadOnlySpan<double> block, int rows);
