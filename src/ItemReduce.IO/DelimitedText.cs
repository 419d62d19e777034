using System.Text;

namespace ItemReduce.IO;

/// <summary>Opening delimited text files: encoding detection and delimiter detection.</summary>
public static class DelimitedText
{
    /// <summary>Candidate delimiters in order of preference on ties.</summary>
    public static readonly char[] Candidates = [',', ';', '\t'];

    /// <summary>Opens a text reader; UTF-8 (with or without BOM) by default, UTF-16/32 when a BOM says so.</summary>
    public static StreamReader Open(string path) =>
        new(new FileStream(path, FileMode.Open, FileAccess.Read, FileShare.Read, 1 << 16, FileOptions.SequentialScan),
            new UTF8Encoding(false, true), detectEncodingFromByteOrderMarks: true, bufferSize: 1 << 16);

    /// <summary>
    /// Picks the delimiter that occurs most often (outside double quotes) in the header line;
    /// comma when none occurs.
    /// </summary>
    public static char Detect(string headerLine)
    {
        var counts = new int[Candidates.Length];
        bool quoted = false;
        foreach (char ch in headerLine)
        {
            if (ch == '"') { quoted = !quoted; continue; }
            if (quoted) continue;
            int k = Array.IndexOf(Candidates, ch);
            if (k >= 0) counts[k]++;
        }
        int best = 0;
        for (int k = 1; k < counts.Length; k++) if (counts[k] > counts[best]) best = k;
        return counts[best] > 0 ? Candidates[best] : ',';
    }

    /// <summary>Reads the first line of the file (for delimiter detection); null when the file is empty.</summary>
    public static string? FirstLine(string path)
    {
        using var r = Open(path);
        return r.ReadLine();
    }
}
