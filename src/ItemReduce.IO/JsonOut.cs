using System.Text;
using System.Text.Encodings.Web;
using System.Text.Json;
using System.Text.Json.Nodes;

namespace ItemReduce.IO;

/// <summary>Helpers for writing deterministic JSON (insertion order kept, NaN/∞ as null, "\n" line ends).</summary>
public static class JsonOut
{
    /// <summary>A number node, or null for NaN/infinity.</summary>
    public static JsonNode? Num(double v) => double.IsFinite(v) ? JsonValue.Create(v) : null;

    /// <summary>An array of numbers (NaN → null).</summary>
    public static JsonArray Nums(IEnumerable<double> values) => new(values.Select(Num).ToArray());

    /// <summary>An array of strings.</summary>
    public static JsonArray Strs(IEnumerable<string> values) => new(values.Select(v => (JsonNode?)JsonValue.Create(v)).ToArray());

    /// <summary>Serialises with two-space indentation.</summary>
    public static string Serialize(JsonNode node)
    {
        var options = new JsonWriterOptions { Indented = true, Encoder = JavaScriptEncoder.UnsafeRelaxedJsonEscaping, NewLine = "\n" };
        using var ms = new MemoryStream();
        using (var w = new Utf8JsonWriter(ms, options)) node.WriteTo(w);
        return Encoding.UTF8.GetString(ms.ToArray()) + "\n";
    }
}
