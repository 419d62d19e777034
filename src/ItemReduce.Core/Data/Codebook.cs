namespace ItemReduce.Core.Data;

/// <summary>The list of analysed items in codebook order.</summary>
public sealed class Codebook
{
    private readonly Dictionary<string, int> _index;

    public Codebook(IReadOnlyList<ItemDefinition> items)
    {
        ArgumentNullException.ThrowIfNull(items);
        Items = items;
        _index = new Dictionary<string, int>(StringComparer.Ordinal);
        for (int i = 0; i < items.Count; i++)
        {
            if (!_index.TryAdd(items[i].Name, i))
                throw new ArgumentException($"Item '{items[i].Name}' appears twice in the codebook.", nameof(items));
        }
    }

    /// <summary>Items in codebook order.</summary>
    public IReadOnlyList<ItemDefinition> Items { get; }

    /// <summary>Number of items.</summary>
    public int Count => Items.Count;

    /// <summary>Distinct non-empty subscale names in order of first appearance.</summary>
    public IReadOnlyList<string> Subscales =>
        Items.Select(i => i.Subscale).Where(s => !string.IsNullOrEmpty(s)).Select(s => s!).Distinct(StringComparer.Ordinal).ToList();

    /// <summary>Index of the item named <paramref name="name"/>, or −1.</summary>
    public int IndexOf(string name) => _index.TryGetValue(name, out int i) ? i : -1;

    /// <summary>A codebook holding only the items at <paramref name="indices"/>, in that order.</summary>
    public Codebook Select(IReadOnlyList<int> indices) => new(indices.Select(i => Items[i]).ToList());
}
