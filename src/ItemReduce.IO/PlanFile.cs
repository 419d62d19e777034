using System.Globalization;
using System.Text.Json;

namespace ItemReduce.IO;

/// <summary>
/// A plan file: a JSON object whose keys are the long option names without dashes
/// (e.g. <c>"responses"</c>, <c>"cutoff-p"</c>, <c>"replicates"</c>) and whose values are strings,
/// numbers, booleans or arrays (joined with commas). Comments and trailing commas are allowed.
/// Relative paths are resolved against the plan file's folder. Command-line options override the plan.
/// </summary>
public static class PlanFile
{
    /// <summary>Largest plan file read (1 MiB; a plan is a few hundred bytes).</summary>
    public const int MaxBytes = 1 << 20;

    /// <summary>Keys whose values are file or folder paths.</summary>
    public static readonly IReadOnlySet<string> PathKeys = new HashSet<string>(StringComparer.Ordinal) { "responses", "codebook", "out" };

    /// <summary>Reads the plan as ordered (key, value text) pairs; throws <see cref="SurveyInputException"/> on problems.</summary>
    public static IReadOnlyList<KeyValuePair<string, string>> Read(string path, IReadOnlySet<string> knownKeys)
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
            var result = new List<KeyValuePair<string, string>>();
            foreach (var prop in doc.RootElement.EnumerateObject())
            {
                string key = prop.Name;
                if (!knownKeys.Contains(key))
                    throw InputErrors.At(path, null, key, "unknown setting",
                        "use one of: " + string.Join(", ", knownKeys.Order(StringComparer.Ordinal)));
                string? value = prop.Value.ValueKind switch
                {
                    JsonValueKind.String => prop.Value.GetString(),
                    JsonValueKind.Number => prop.Value.GetRawText(),
                    JsonValueKind.True => "true",
                    JsonValueKind.False => "false",
                    JsonValueKind.Null => null,
                    JsonValueKind.Array => string.Join(",", prop.Value.EnumerateArray().Select(Scalar)),
                    _ => throw InputErrors.At(path, null, key, "the value must be a string, number, true/false or a list", "simplify the value"),
                };
                if (value is null) continue;
                if (PathKeys.Contains(key) && value.Trim().Length == 0)
                    throw InputErrors.At(path, null, key, "the path is empty", "give a file or folder name, or remove the setting");
                if (PathKeys.Contains(key) && !Path.IsPathRooted(value)) value = Path.GetFullPath(Path.Combine(baseDir, value));
                result.Add(new(key, value));
            }
            return result;
        }

        string Scalar(JsonElement e) => e.ValueKind switch
        {
            JsonValueKind.String => e.GetString() ?? "",
            JsonValueKind.Number => e.GetRawText(),
            _ => e.ToString(),
        };
    }

    /// <summary>Formats a plan number for the command line (invariant).</summary>
    public static string Invariant(double v) => v.ToString("R", CultureInfo.InvariantCulture);
}
