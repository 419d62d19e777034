namespace ItemReduce.IO;

/// <summary>Opening delimited text files: encoding detection and delimiter detection.</summary>
public static class DelimitedText
{
    /// <summary>Candidate delimiters in order of preference on ties.</summary>
    public static readonly char[] Candidates = [',', ';', '\t'];

    /// <summary>Opens a text reader (<see cref="SurveyTextReader"/>): UTF-8 (with or without BOM) by default, UTF-16/32
    /// when a BOM says so; invalid text and over-long lines are errors on their true line.</summary>
    internal static TextReader Open(string path) => new SurveyTextReader(path);

    /// <summary>Checks that an input path names a regular file with data before anything opens it (so a folder, a
    /// device such as /dev/zero, a FIFO or a socket is refused at once instead of blocking or reading forever).</summary>
    /// <param name="path">The path given.</param>
    /// <param name="role">What the file is, for the message ("responses").</param>
    /// <param name="option">The option that names it, for the fix ("--responses").</param>
    public static void CheckInputFile(string path, string role, string option)
    {
        if (Directory.Exists(path))
            throw new SurveyInputException($"{path}: is a folder, not a file. Fix: give the {role} file itself to {option}.");
        if (!File.Exists(path)) throw InputErrors.FileMissing(path, role, option);
        // Devices, FIFOs and sockets report a size of 0, as does an empty file; none of them can be read as a table.
        if (new FileInfo(path).Length == 0) throw InputErrors.EmptyOrNotRegular(path);
    }

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
