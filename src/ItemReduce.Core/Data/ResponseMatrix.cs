namespace ItemReduce.Core.Data;

/// <summary>
/// Respondents × items response matrix. Values are stored row-major in double precision;
/// <see cref="double.NaN"/> marks a missing answer. Row <c>i</c> is respondent <c>i</c> in input order,
/// column <c>j</c> is <see cref="Items"/>[j].
/// </summary>
public sealed class ResponseMatrix
{
    private readonly double[] _values;

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
    }

    /// <summary>Number of respondents (rows), n.</summary>
    public int RespondentCount => RespondentIds.Count;

    /// <summary>Number of items (columns), p.</summary>
    public int ItemCount => Items.Count;

    public IReadOnlyList<string> RespondentIds { get; }

    public IReadOnlyList<ItemDefinition> Items { get; }

    /// <summary>Row-major storage (n × p), NaN = missing. Callers must not write to it.</summary>
    internal double[] Storage => _values;

    /// <summary>All values, row-major.</summary>
    public ReadOnlySpan<double> Values => _values;

    /// <summary>Value of respondent <paramref name="row"/> on item <paramref name="column"/> (NaN = missing).</summary>
    public double this[int row, int column] => _values[(long)row * ItemCount + column];

    /// <summary>The answers of one respondent.</summary>
    public ReadOnlySpan<double> Row(int row) => new(_values, row * ItemCount, ItemCount);

    /// <summary>A copy of one item's column.</summary>
    public double[] Column(int column)
    {
        var c = new double[RespondentCount];
        for (int i = 0; i < c.Length; i++) c[i] = _values[(long)i * ItemCount + column];
        return c;
    }

    /// <summary>True when any cell is missing.</summary>
    public bool HasMissing()
    {
        foreach (double v in _values) if (double.IsNaN(v)) return true;
        return false;
    }

    /// <summary>A new matrix holding the given rows (in the given order).</summary>
    public ResponseMatrix SelectRespondents(IReadOnlyList<int> rows)
    {
        int p = ItemCount;
        var v = new double[(long)rows.Count * p];
        var ids = new string[rows.Count];
        for (int r = 0; r < rows.Count; r++)
        {
            Array.Copy(_values, (long)rows[r] * p, v, (long)r * p, p);
            ids[r] = RespondentIds[rows[r]];
        }
        return new ResponseMatrix(ids, Items, v);
    }

    /// <summary>A new matrix holding the given columns (in the given order).</summary>
    public ResponseMatrix SelectItems(IReadOnlyList<int> columns)
    {
        int n = RespondentCount, p = ItemCount, q = columns.Count;
        var v = new double[(long)n * q];
        for (int i = 0; i < n; i++)
            for (int k = 0; k < q; k++)
                v[(long)i * q + k] = _values[(long)i * p + columns[k]];
        return new ResponseMatrix(RespondentIds, columns.Select(c => Items[c]).ToList(), v);
    }

    /// <summary>A new matrix with the same ids and items and the given values.</summary>
    public ResponseMatrix WithValues(double[] values) => new(RespondentIds, Items, values);
}
