using ItemReduce.Core.Data;

namespace ItemReduce.IO;

/// <summary>Raw responses as read: codebook items in codebook order, NaN = missing, not yet reverse-scored.</summary>
/// <param name="Responses">The matrix.</param>
/// <param name="IdColumn">Name of the id column used, or null when ids are line numbers.</param>
/// <param name="Delimiter">Delimiter used.</param>
/// <param name="IgnoredColumns">Columns that are neither the id nor an item.</param>
public sealed record ResponseIntake(ResponseMatrix Responses, string? IdColumn, char Delimiter, IReadOnlyList<string> IgnoredColumns);

/// <summary>
/// Reads the responses CSV against a codebook in one streaming pass, validating every cell:
/// missing codes first, then "is a finite number", then the codebook range.
/// </summary>
public static class ResponseReader
{
    /// <summary>Rows between calls of the progress callback.</summary>
    private const int ProgressEveryRows = 1 << 16;

    /// <summary>Reads and validates; throws <see cref="SurveyInputException"/> naming line and column on any problem.</summary>
    /// <param name="path">Responses CSV.</param>
    /// <param name="codebook">Items to read, in codebook order.</param>
    /// <param name="codebookLines">1-based codebook line of each item (for messages).</param>
    /// <param name="codebookPath">Codebook file (for messages).</param>
    /// <param name="options">Delimiter, missing codes and id column.</param>
    /// <param name="progress">Optional callback given the number of rows read so far, every 65,536 rows.</param>
    public static ResponseIntake Read(string path, Codebook codebook, IReadOnlyList<long> codebookLines, string codebookPath, IntakeOptions options,
        Action<int>? progress = null)
    {
        ArgumentNullException.ThrowIfNull(codebook);
        ArgumentNullException.ThrowIfNull(options);
        DelimitedText.CheckInputFile(path, "responses", "--responses");
        string? first = DelimitedText.FirstLine(path);
        if (first is null || first.Trim().Length == 0) throw InputErrors.EmptyFile(path);
        char delimiter = options.Delimiter ?? DelimitedText.Detect(first);

        using var csv = new CsvRecordReader(path, delimiter);
        if (!csv.Read()) throw InputErrors.EmptyFile(path);
        var header = csv.Fields.Select(h => h.Trim()).ToArray();
        var position = new Dictionary<string, int>(StringComparer.Ordinal);
        for (int c = 0; c < header.Length; c++)
        {
            if (header[c].Length == 0) throw InputErrors.EmptyColumnName(path, c + 1);
            if (!position.TryAdd(header[c], c)) throw InputErrors.DuplicateColumn(path, header[c], position[header[c]] + 1, c + 1);
        }

        int p = codebook.Count;
        var itemCol = new int[p];
        for (int j = 0; j < p; j++)
        {
            if (!position.TryGetValue(codebook.Items[j].Name, out itemCol[j]))
                throw InputErrors.ItemNotInResponses(codebookPath, codebookLines[j], codebook.Items[j].Name, path);
        }
        int idCol = ChooseIdColumn(path, header, position, codebook, options.IdColumn);
        var ignored = header.Where((h, c) => c != idCol && codebook.IndexOf(h) < 0).ToList();

        for (int skipped = 0; skipped < options.SkipRows; skipped++)
            if (!csv.Read()) throw InputErrors.OnlySkippedRows(path, options.SkipRows);

        var missing = new HashSet<string>(options.EffectiveMissingCodes.Select(m => m.Trim()), StringComparer.Ordinal) { "" };
        // Rows expected: the file's length over the header's (rows are usually shorter than the header, so this rarely
        // overshoots); it only sizes the first allocations.
        int expectedRows = (int)Math.Min(1 << 24, new FileInfo(path).Length / Math.Max(16, first.Length + 1));
        var builder = new ResponseMatrixBuilder(codebook.Items, expectedRows);
        var rows = new ResponseRows(csv, path, header, itemCol, idCol, codebook.Items.ToArray(), missing, builder, expectedRows,
            id => FirstLineOf(path, delimiter, idCol, id, options.SkipRows));
        rows.ReadAll(progress, ProgressEveryRows);
        if (builder.Count == 0) throw InputErrors.HeaderOnly(path);
        var matrix = builder.Build();
        return new ResponseIntake(matrix, idCol >= 0 ? header[idCol] : null, delimiter, ignored);
    }

    /// <summary>Line of the first record whose id is <paramref name="id"/> (re-reads the file; error path only: every
    /// record before the duplicate was valid, so the first match is the first occurrence).</summary>
    private static long FirstLineOf(string path, char delimiter, int idCol, string id, int skipRows)
    {
        using var csv = new CsvRecordReader(path, delimiter);
        for (int r = 0; r <= skipRows; r++) csv.Read(); // header and skipped rows
        while (csv.Read())
            if (csv.Fields.Length > idCol && csv.Fields[idCol].Trim() == id) return csv.Line;
        return 0;
    }

    private static int ChooseIdColumn(string path, string[] header, Dictionary<string, int> position, Codebook codebook, string? requested)
    {
        if (requested is not null)
        {
            if (!position.TryGetValue(requested, out int c)) throw InputErrors.IdColumnMissing(path, requested);
            if (codebook.IndexOf(requested) >= 0) throw InputErrors.IdColumnIsItem(path, requested);
            return c;
        }
        if (position.TryGetValue("respondent", out int r) && codebook.IndexOf("respondent") < 0) return r;
        for (int c = 0; c < header.Length; c++) if (codebook.IndexOf(header[c]) < 0) return c;
        return -1;
    }
}
