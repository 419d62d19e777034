namespace ItemReduce.Report.Layout;

/// <summary>A piece of text in one weight.</summary>
internal readonly record struct TextRun(string Text, bool Bold);

/// <summary>Parses the only inline markup we support: <c>**bold**</c>. An unpaired <c>**</c> is kept literally.</summary>
internal static class InlineText
{
    public static IReadOnlyList<TextRun> Parse(string text)
    {
        var parts = text.Split("**");
        var runs = new List<TextRun>();
        // n parts means n-1 markers; with an odd marker count the last one is unpaired and stays literal.
        int pairedParts = parts.Length % 2 == 1 ? parts.Length : parts.Length - 1;
        for (int i = 0; i < pairedParts; i++)
        {
            if (parts[i].Length > 0) runs.Add(new TextRun(parts[i], Bold: i % 2 == 1));
        }
        if (pairedParts < parts.Length)
            runs.Add(new TextRun("**" + parts[^1], Bold: false));
        return runs;
    }
}
