using ItemReduce.Application.Settings;
using ItemReduce.IO;

namespace ItemReduce.Tests.IO;

/// <summary>Unit tests of the codebook and plan readers on small hand-written files (expected values by hand from the
/// files' text; the file formats are the project's own, documented in the README).</summary>
public sealed class FileReaderTests : IDisposable
{
    private readonly string _dir = Directory.CreateTempSubdirectory("itemreduce-readers-").FullName;

    public void Dispose() => Directory.Delete(_dir, recursive: true);

    private string Write(string name, string text)
    {
        string path = Path.Combine(_dir, name);
        File.WriteAllText(path, text);
        return path;
    }

    private static readonly IReadOnlySet<string> Known = new HashSet<string>(StringComparer.Ordinal) { "responses", "codebook", "seed", "missing", "scale-targets", "out" };

    [Fact]
    public void Codebook_columns_in_any_order_and_case_with_optional_text_and_formula_safe_names()
    {
        string path = Write("cb.csv", "MAX,Item,reverse,min,subscale,text\n5,q1,false,1,Comfort,Seats are clean\n7,q2,TRUE,1,,'=odd text\n5,'-q3,0,1,Comfort,\"a, b\"\n");
        var (cb, lines) = CodebookReader.Read(path);
        Assert.Equal(3, cb.Count);
        Assert.Equal([2L, 3L, 4L], lines);
        var q1 = cb.Items[0];
        Assert.Equal(("q1", "Comfort", false, 1.0, 5.0, "Seats are clean"), (q1.Name, q1.Subscale, q1.Reverse, q1.Min, q1.Max, q1.Text));
        Assert.True(cb.Items[1].Reverse);
        Assert.Equal(7.0, cb.Items[1].Max);
        Assert.Equal("=odd text", cb.Items[1].Text); // the apostrophe written by our own CSV writer is removed
        Assert.Equal("-q3", cb.Items[2].Name);
        Assert.Equal("a, b", cb.Items[2].Text);
        Assert.Equal(2, cb.IndexOf("-q3"));
    }

    [Fact]
    public void Codebook_errors_name_the_file_line_and_column_and_say_the_fix()
    {
        var e = Assert.Throws<SurveyInputException>(() => CodebookReader.Read(Write("dup.csv", "item,subscale,reverse,min,max\nq1,A,false,1,5\nq1,A,false,1,5\n")));
        Assert.Contains("dup.csv", e.Message, StringComparison.Ordinal);
        Assert.Contains("line 3", e.Message, StringComparison.Ordinal);
        Assert.Contains("first on line 2", e.Message, StringComparison.Ordinal);
        Assert.Contains("Fix:", e.Message, StringComparison.Ordinal);

        e = Assert.Throws<SurveyInputException>(() => CodebookReader.Read(Write("bounds.csv", "item,subscale,reverse,min,max\nq1,A,false,5,1\n")));
        Assert.Contains("line 2", e.Message, StringComparison.Ordinal);
        Assert.Contains("min", e.Message, StringComparison.Ordinal);

        e = Assert.Throws<SurveyInputException>(() => CodebookReader.Read(Write("nohead.csv", "item,subscale,min,max\nq1,A,1,5\n")));
        Assert.Contains("reverse", e.Message, StringComparison.Ordinal);

        e = Assert.Throws<SurveyInputException>(() => CodebookReader.Read(Write("ragged.csv", "item,subscale,reverse,min,max\nq1,A,false,1\n")));
        Assert.Contains("line 2", e.Message, StringComparison.Ordinal);

        Assert.Throws<SurveyInputException>(() => CodebookReader.Read(Write("empty.csv", "")));
    }

    [Fact]
    public void Plan_keeps_key_lines_types_values_and_resolves_paths_against_its_folder()
    {
        string path = Write("plan.json", "{\n  // comment\n  \"responses\": \"data/r.csv\",\n  \"seed\": 42,\n  \"missing\": [\"\", \"NA\"],\n  \"scale-targets\": { \"A\": 3, \"B\": 4 },\n  \"codebook\": null,\n}\n");
        var plan = PlanFile.Read(path, Known);
        Assert.Equal(["responses", "seed", "missing", "scale-targets"], plan.Entries.Select(e => e.Key).ToArray()); // null = not set
        Assert.Equal([3L, 4L, 5L, 6L], plan.Entries.Select(e => e.Line).ToArray());
        Assert.Equal(Path.Combine(_dir, "data", "r.csv"), plan.Entries[0].Text);
        Assert.Equal("42", plan.Entries[1].Text);
        Assert.Equal(["", "NA"], plan.Entries[2].Items);
        Assert.Equal([KeyValuePair.Create("A", "3"), KeyValuePair.Create("B", "4")], plan.Entries[3].Pairs);
        Assert.Equal(64, plan.Sha256.Length);
    }

    [Fact]
    public void Plan_errors_point_at_the_line()
    {
        var e = Assert.Throws<SurveyInputException>(() => PlanFile.Read(Write("unknown.json", "{\n \"seed\": 1,\n \"sede\": 2\n}"), Known));
        Assert.Contains("line 3", e.Message, StringComparison.Ordinal);
        Assert.Contains("unknown setting", e.Message, StringComparison.Ordinal);

        e = Assert.Throws<SurveyInputException>(() => PlanFile.Read(Write("twice.json", "{\n \"seed\": 1,\n \"seed\": 2\n}"), Known));
        Assert.Contains("also on line 2", e.Message, StringComparison.Ordinal);

        e = Assert.Throws<SurveyInputException>(() => PlanFile.Read(Write("bad.json", "{\n \"seed\": 1\n \"out\": 2\n}"), Known));
        Assert.Contains("not valid JSON", e.Message, StringComparison.Ordinal);

        e = Assert.Throws<SurveyInputException>(() => PlanFile.Read(Write("list.json", "[1, 2]"), Known));
        Assert.Contains("JSON object", e.Message, StringComparison.Ordinal);

        e = Assert.Throws<SurveyInputException>(() => PlanFile.Read(Write("emptypath.json", "{ \"out\": \"  \" }"), Known));
        Assert.Contains("the path is empty", e.Message, StringComparison.Ordinal);
    }
}
