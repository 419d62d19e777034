using System.Globalization;
using ItemReduce.Core.Data;

namespace ItemReduce.IO;

/// <summary>
/// Reads a codebook CSV with header <c>item,subscale,reverse,min,max,text</c> (any column order,
/// case-insensitive; <c>subscale</c> and <c>text</c> may be empty; <c>text</c> may be absent).
/// A text cell that starts with an apostrophe followed by <c>=</c>, <c>+</c>, <c>-</c> or <c>@</c> is read without the
/// apostrophe: that is how ItemReduce's CSV outputs keep spreadsheets from running such names as formulas, and it lets
/// <c>short-form-codebook.csv</c> serve as the codebook for the next data collection.
/// </summary>
public static class CodebookReader
{
    private static readonly string[] Required = ["item", "subscale", "reverse", "min", "max"];

    /// <summary>Reads and validates the codebook; throws <see cref="SurveyInputException"/> on any problem.</summary>
    public static (Codebook Codebook, IReadOnlyList<long> Lines) Read(string path, char? delimiter = null)
    {
        DelimitedText.CheckInputFile(path, "codebook", "--codebook");
        string? first = DelimitedText.FirstLine(path);
        if (string.IsNullOrWhiteSpace(first)) throw InputErrors.EmptyFile(path);
        using var csv = new CsvRecordReader(path, delimiter ?? DelimitedText.Detect(first));
        if (!csv.Read()) throw InputErrors.EmptyFile(path);
        var header = csv.Fields.Select(h => h.Trim()).ToArray();
        var col = new Dictionary<string, int>(StringComparer.OrdinalIgnoreCase);
        for (int c = 0; c < header.Length; c++)
        {
            if (!col.TryAdd(header[c], c)) throw InputErrors.DuplicateColumn(path, header[c], col[header[c]] + 1, c + 1);
        }
        foreach (string r in Required)
        {
            if (!col.ContainsKey(r))
                throw InputErrors.At(path, 1, r, "the codebook header lacks this column",
                    "use the header item,subscale,reverse,min,max,text");
        }
        col.TryGetValue("text", out int textCol);
        bool hasText = col.ContainsKey("text");

        var items = new List<ItemDefinition>();
        var lines = new List<long>();
        var seen = new Dictionary<string, long>(StringComparer.Ordinal);
        while (csv.Read())
        {
            var f = csv.Fields;
            if (f.Length != header.Length) throw InputErrors.Ragged(path, csv.Line, header.Length, f.Length);
            // Text cells are read back from ItemReduce's own formula-safe CSV (short-form-codebook.csv) unchanged.
            string name = SafeCsvWriter.Unneutralise(f[col["item"]].Trim());
            if (name.Length == 0)
                throw InputErrors.At(path, csv.Line, "item", "the item name is empty", "give the item the name of its column in the responses file");
            if (seen.TryGetValue(name, out long firstLine))
                throw InputErrors.At(path, csv.Line, "item", $"item {InputErrors.Show(name)} is listed twice (first on line {firstLine})",
                    "list every item once");
            seen[name] = csv.Line;
            string subscale = SafeCsvWriter.Unneutralise(f[col["subscale"]].Trim());
            bool reverse = ParseFlag(path, csv.Line, f[col["reverse"]]);
            double min = ParseBound(path, csv.Line, "min", f[col["min"]]);
            double max = ParseBound(path, csv.Line, "max", f[col["max"]]);
            if (!(max > min))
                throw InputErrors.At(path, csv.Line, min > max ? "min" : "max",
                    $"min ({f[col["min"]].Trim()}) must be below max ({f[col["max"]].Trim()}) for item {InputErrors.Show(name)}",
                    "swap or correct the bounds of the response scale");
            string? text = hasText ? SafeCsvWriter.Unneutralise(f[textCol].Trim()) : null;
            items.Add(new ItemDefinition(name, subscale.Length == 0 ? null : subscale, reverse, min, max,
                string.IsNullOrEmpty(text) ? null : text));
            lines.Add(csv.Line);
        }
        if (items.Count == 0) throw InputErrors.HeaderOnly(path);
        return (new Codebook(items), lines);
    }

    /// <summary>Accepts true/false, yes/no, 1/0 (any case); empty means false.</summary>
    internal static bool ParseFlag(string path, long line, string raw)
    {
        switch (raw.Trim().ToLowerInvariant())
        {
            case "true": case "yes": case "1": case "y": case "t": return true;
            case "false": case "no": case "0": case "n": case "f": case "": return false;
            default:
                throw InputErrors.At(path, line, "reverse", $"{InputErrors.Show(raw)} is not a yes/no value",
                    "write true or false (yes/no and 1/0 are also accepted)");
        }
    }

    private static double ParseBound(string path, long line, string column, string raw)
    {
        if (!double.TryParse(raw.Trim(), NumberStyles.Float, CultureInfo.InvariantCulture, out double v) || !double.IsFinite(v))
            throw InputErrors.At(path, line, column, $"{InputErrors.Show(raw)} is not a finite number",
                "write the lowest (min) and highest (max) response option as numbers, e.g. 1 and 5");
        return v;
    }
}
