using System.Globalization;
using System.Text.Json;
using ItemReduce.IO;

namespace ItemReduce.Application.Settings;

/// <summary>One key of a plan file, with its 1-based line and its value in the forms a setting may take.</summary>
/// <param name="Key">The key (a setting name).</param>
/// <param name="Line">1-based line of the key in the plan.</param>
/// <param name="Text">Scalar value as text (strings as written, numbers in their JSON spelling, true/false), or null for
/// a list or an object.</param>
/// <param name="Items">Elements of a JSON list, as text; null otherwise.</param>
/// <param name="Pairs">Members of a JSON object (name, value text); null otherwise.</param>
/// <param name="Display">The value as written in the plan (JSON), for messages.</param>
public sealed record PlanEntry(string Key, long Line, string? Text, IReadOnlyList<string>? Items,
    IReadOnlyList<KeyValuePair<string, string>>? Pairs, string Display);

/// <summary>A plan file read: its entries in file order and the SHA-256 of its bytes.</summary>
public sealed record PlanContents(string Path, IReadOnlyList<PlanEntry> Entries, string Sha256);

/// <summary>
/// A plan file: a JSON object whose keys are the long option names without dashes
/// (e.g. <c>"responses"</c>, <c>"cutoff-p"</c>, <c>"replicates"</c>) and whose values are strings,
/// numbers, booleans, lists or (for name=value settings) objects. Comments and trailing commas are allowed.
/// Values are typed against their settings by <see cref="Settings.SettingParser"/>; this reader only keeps each key's
/// line so that messages can point at it.
/// Relative paths are resolved against the plan file's folder. Command-line options override the plan.
/// </summary>
public static class PlanFile
{
    /// <summary>Largest plan file read (1 MiB; a plan is a few hundred bytes).</summary>
    public const int MaxBytes = 1 << 20;

    /// <summary>Keys whose values are file or folder paths.</summary>
    public static readonly IReadOnlySet<string> PathKeys =
        Settings.SettingsCatalog.All.Where(s => s.Kind == Settings.SettingKind.Path).Select(s => s.Name).ToHashSet(StringComparer.Ordinal);

    /// <summary>Reads the plan's entries in file order; throws <see cref="SurveyInputException"/> on problems.</summary>
    public static PlanContents Read(string path, IReadOnlySet<string> knownKeys)
    {
        DelimitedText.CheckInputFile(path, "plan", "--plan");
        if (new FileInfo(path).Length > MaxBytes)
            throw InputErrors.At(path, null, null, $"the plan is larger than {MaxBytes / 1024} KiB",
                "a plan holds a few settings; check that --plan names the plan file and not the data");
        string text;
        try
        {
            using var reader = new SurveyTextReader(path);
            var buffer = new char[MaxBytes + 1];
            int n = reader.ReadBlock(buffer, 0, buffer.Length);
            if (n > MaxBytes)
                throw InputErrors.At(path, null, null, $"the plan is larger than {MaxBytes / 1024} KiB", "check that --plan names the plan file");
            text = new string(buffer, 0, n);
        }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException) { throw InputErrors.Unreadable(path, e.Message); }
        JsonDocument doc;
        try
        {
            doc = JsonDocument.Parse(text, new JsonDocumentOptions { CommentHandling = JsonCommentHandling.Skip, AllowTrailingCommas = true });
        }
        catch (JsonException e)
        {
            long line = (e.LineNumber ?? 0) + 1;
            throw InputErrors.At(path, line, null, "the plan is not valid JSON (" + (e.Message.Split('.')[0]) + ")",
                "write the plan as a JSON object such as { \"responses\": \"responses.csv\", \"seed\": 42 }");
        }
        using (doc)
        {
            if (doc.RootElement.ValueKind != JsonValueKind.Object)
                throw InputErrors.At(path, 1, null, "the plan must be a JSON object", "wrap the settings in { ... }");
            string baseDir = Path.GetDirectoryName(Path.GetFullPath(path)) ?? ".";
            var lines = KeyLines(text);
            var result = new List<PlanEntry>();
            int index = 0;
            foreach (var prop in doc.RootElement.EnumerateObject())
            {
                string key = prop.Name;
                long line = index < lines.Count ? lines[index] : 1;
                index++;
                if (!knownKeys.Contains(key))
                    throw new SurveyInputException($"{Settings.SettingErrors.InPlan(path, line, key)}: unknown setting. Fix: use one of: " +
                        string.Join(", ", knownKeys.Order(StringComparer.Ordinal)) + ".");
                if (result.FirstOrDefault(r => r.Key == key) is { } first)
                    throw new SurveyInputException($"{Settings.SettingErrors.InPlan(path, line, key)}: given twice (also on line " +
                        $"{first.Line.ToString(System.Globalization.CultureInfo.InvariantCulture)}). Fix: keep one of them.");
                var v = prop.Value;
                if (v.ValueKind == JsonValueKind.Null) continue;
                string? scalar = v.ValueKind switch
                {
                    JsonValueKind.String => v.GetString(),
                    JsonValueKind.Number => v.GetRawText(),
                    JsonValueKind.True => "true",
                    JsonValueKind.False => "false",
                    _ => null,
                };
                IReadOnlyList<string>? items = v.ValueKind == JsonValueKind.Array ? v.EnumerateArray().Select(Scalar).ToList() : null;
                IReadOnlyList<KeyValuePair<string, string>>? pairs = v.ValueKind == JsonValueKind.Object
                    ? v.EnumerateObject().Select(m => KeyValuePair.Create(m.Name, Scalar(m.Value))).ToList() : null;
                if (scalar is not null && PathKeys.Contains(key) && scalar.Trim().Length == 0)
                    throw new SurveyInputException($"{Settings.SettingErrors.InPlan(path, line, key)}: the path is empty. " +
                        "Fix: give a file or folder name, or remove the setting.");
                if (scalar is not null && PathKeys.Contains(key) && !Path.IsPathRooted(scalar)) scalar = Path.GetFullPath(Path.Combine(baseDir, scalar));
                result.Add(new PlanEntry(key, line, scalar, items, pairs, v.GetRawText()));
            }
            return new PlanContents(path, result, FileFingerprint.Sha256(path));
        }

        string Scalar(JsonElement e) => e.ValueKind switch
        {
            JsonValueKind.String => e.GetString() ?? "",
            JsonValueKind.Number => e.GetRawText(),
            _ => e.ToString(),
        };
    }

    /// <summary>1-based lines of the root object's keys, in order.</summary>
    private static List<long> KeyLines(string text)
    {
        var bytes = System.Text.Encoding.UTF8.GetBytes(text);
        var reader = new Utf8JsonReader(bytes, new JsonReaderOptions { CommentHandling = JsonCommentHandling.Skip, AllowTrailingCommas = true });
        var lines = new List<long>();
        long line = 1;
        long scanned = 0;
        while (reader.Read())
        {
            if (reader.TokenType != JsonTokenType.PropertyName || reader.CurrentDepth != 1) continue;
            long at = reader.TokenStartIndex;
            for (long i = scanned; i < at; i++) if (bytes[i] == (byte)'\n') line++;
            scanned = at;
            lines.Add(line);
        }
        return lines;
    }

    /// <summary>Formats a plan number for the command line (invariant).</summary>
    public static string Invariant(double v) => v.ToString("R", CultureInfo.InvariantCulture);
}
