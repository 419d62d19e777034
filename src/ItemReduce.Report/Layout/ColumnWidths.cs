namespace ItemReduce.Report.Layout;

/// <summary>Column widths of a table from the widths its contents need.</summary>
internal static class ColumnWidths
{
    /// <summary>
    /// Returns the natural widths when they fit into <paramref name="available"/>. Otherwise columns
    /// narrower than an equal share keep their natural width and the remaining width is divided among the
    /// wider columns in proportion to their natural widths (their text is then wrapped).
    /// The result always sums to at most <paramref name="available"/> (up to rounding).
    /// </summary>
    /// <param name="natural">Width each column needs without wrapping (text plus padding), all positive.</param>
    /// <param name="available">Width of the text area.</param>
    public static float[] Fit(IReadOnlyList<float> natural, float available)
    {
        int n = natural.Count;
        var widths = natural.ToArray();
        if (widths.Sum() <= available) return widths;

        var capped = new bool[n]; // true: column is wider than its share and will be shrunk
        for (int i = 0; i < n; i++) capped[i] = true;
        // Repeatedly release columns that fit within an equal share of what is left.
        while (true)
        {
            float fixedWidth = 0;
            int open = 0;
            for (int i = 0; i < n; i++)
            {
                if (capped[i]) open++; else fixedWidth += widths[i];
            }
            float share = (available - fixedWidth) / open;
            bool changed = false;
            for (int i = 0; i < n; i++)
            {
                if (capped[i] && natural[i] <= share)
                {
                    capped[i] = false;
                    changed = true;
                }
            }
            if (!changed || open == 0) break;
        }

        float rest = available;
        float cappedNatural = 0;
        for (int i = 0; i < n; i++)
        {
            if (capped[i]) cappedNatural += natural[i]; else rest -= natural[i];
        }
        for (int i = 0; i < n; i++)
        {
            widths[i] = capped[i] ? rest * natural[i] / cappedNatural : natural[i];
        }
        return widths;
    }
}
