namespace ItemReduce.Report.Layout;

/// <summary>A run placed on a line, <see cref="Offset"/> points from the line's left edge.</summary>
internal readonly record struct PlacedRun(float Offset, string Text, bool Bold, float Width);

/// <summary>One output line of <see cref="LineBreaker"/>.</summary>
internal sealed record TextLine(IReadOnlyList<PlacedRun> Runs)
{
    public float Width => Runs.Count == 0 ? 0f : Runs[^1].Offset + Runs[^1].Width;

    public string PlainText => string.Concat(Runs.Select(r => r.Text));
}

/// <summary>
/// Greedy word wrapping: words (separated by white space) are put on a line while they fit; a word longer
/// than a whole line is split between characters. Line breaks in the input (<c>\n</c>) are kept.
/// The first line may have a different width from the rest (hanging indents, bullets).
/// </summary>
internal static class LineBreaker
{
    /// <param name="runs">Text in reading order.</param>
    /// <param name="firstWidth">Available width of the first line (pt).</param>
    /// <param name="otherWidth">Available width of every following line (pt).</param>
    /// <param name="measure">Width of a string in the given weight (pt).</param>
    public static List<TextLine> Break(IReadOnlyList<TextRun> runs, float firstWidth, float otherWidth, Func<string, bool, float> measure)
    {
        var lines = new List<TextLine>();
        var current = new List<PlacedRun>();
        float x = 0;
        bool pendingSpace = false;

        float Available() => lines.Count == 0 ? firstWidth : otherWidth;

        void EndLine()
        {
            lines.Add(new TextLine(current.ToArray()));
            current.Clear();
            x = 0;
            pendingSpace = false;
        }

        void Place(string word, bool bold, float width, bool withSpace)
        {
            string text = withSpace ? " " + word : word;
            float w = withSpace ? measure(text, bold) : width;
            // Merge with the previous run of the same weight: fewer drawing calls, cleaner text extraction.
            if (current.Count > 0 && current[^1].Bold == bold)
            {
                var last = current[^1];
                string merged = last.Text + text;
                current[^1] = last with { Text = merged, Width = measure(merged, bold) };
                x = last.Offset + current[^1].Width;
            }
            else
            {
                current.Add(new PlacedRun(x, text, bold, w));
                x += w;
            }
        }

        foreach (var run in runs)
        {
            var paragraphs = run.Text.Replace("\r\n", "\n", StringComparison.Ordinal).Split('\n');
            for (int p = 0; p < paragraphs.Length; p++)
            {
                if (p > 0) EndLine();
                string segment = paragraphs[p];
                if (segment.Length > 0 && char.IsWhiteSpace(segment[0]) && current.Count > 0) pendingSpace = true;
                foreach (string word in segment.Split((char[]?)null, StringSplitOptions.RemoveEmptyEntries))
                {
                    PlaceWord(word, run.Bold);
                    pendingSpace = true;
                }
                if (segment.Length > 0 && !char.IsWhiteSpace(segment[^1])) pendingSpace = false;
            }
        }

        void PlaceWord(string word, bool bold)
        {
            float width = measure(word, bold);
            bool withSpace = pendingSpace && current.Count > 0;
            float needed = withSpace ? measure(" " + word, bold) : width;
            if (x + needed <= Available() + 0.01f)
            {
                Place(word, bold, width, withSpace);
                return;
            }
            if (current.Count > 0 && width <= otherWidth + 0.01f)
            {
                EndLine();
                Place(word, bold, width, false);
                return;
            }
            // Word longer than a line: split between characters.
            if (current.Count > 0) EndLine();
            string rest = word;
            while (rest.Length > 0)
            {
                int take = LongestPrefixThatFits(rest, bold, Available(), measure);
                string piece = rest[..take];
                Place(piece, bold, measure(piece, bold), false);
                rest = rest[take..];
                if (rest.Length > 0) EndLine();
            }
        }

        if (current.Count > 0 || lines.Count == 0) EndLine();
        return lines;
    }

    private static int LongestPrefixThatFits(string word, bool bold, float width, Func<string, bool, float> measure)
    {
        int lo = 1, hi = word.Length; // at least one character per line, even if it does not fit
        while (lo < hi)
        {
            int mid = (lo + hi + 1) / 2;
            if (measure(word[..mid], bold) <= width + 0.01f) lo = mid; else hi = mid - 1;
        }
        // Do not cut a surrogate pair.
        if (lo < word.Length && char.IsHighSurrogate(word[lo - 1])) lo = lo > 1 ? lo - 1 : lo + 1;
        return lo;
    }
}
