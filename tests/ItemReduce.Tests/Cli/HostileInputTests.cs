using System.Security.Cryptography;
using ItemReduce.Tests.Support;

namespace ItemReduce.Tests.Cli;

/// <summary>
/// The hostile-input corpus (ReferenceData/Hostile, built by make_corpus.py): every case either stops with
/// exit 2 and one located line, or recovers as documented (exit 0, recorded in summary.json); never a stack
/// trace, never partial outputs, inputs untouched, spreadsheet formulas neutralised.
/// </summary>
public class HostileInputTests
{
    public static TheoryData<string> Cases()
    {
        var data = new TheoryData<string>();
        foreach (string d in Directory.GetDirectories(ReferenceData.PathOf("Hostile")).Order(StringComparer.Ordinal))
            data.Add(Path.GetFileName(d));
        return data;
    }

    private static string Hash(string path) => Convert.ToHexString(SHA256.HashData(File.ReadAllBytes(path)));

    [Theory]
    [MemberData(nameof(Cases))]
    public void Case_behaves_as_expected(string name)
    {
        string src = ReferenceData.PathOf("Hostile", name);
        var expect = File.ReadAllLines(Path.Combine(src, "expect.txt")).Where(l => l.Length > 0).ToArray();
        int code = int.Parse(expect[0], System.Globalization.CultureInfo.InvariantCulture);
        using var t = new TempSurvey();
        File.Copy(Path.Combine(src, "responses.csv"), t.Responses);
        File.Copy(Path.Combine(src, "codebook.csv"), t.Codebook);
        string before = Hash(t.Responses) + Hash(t.Codebook);

        var r = t.Run("--replicates", "50", "--no-pdf");

        Assert.True(r.Code == code, $"{name}: exit {r.Code}, expected {code}; stderr: {r.Err}");
        Assert.DoesNotContain("   at ", r.Err);
        Assert.Equal(before, Hash(t.Responses) + Hash(t.Codebook));
        if (code == 2)
        {
            Assert.Single(r.Err.TrimEnd('\n').Split('\n'));
            foreach (string fragment in expect.Skip(1)) Assert.Contains(fragment, r.Err);
            Assert.Empty(Directory.GetDirectories(t.Folder));
        }
        else
        {
            string summary = File.ReadAllText(Path.Combine(t.Out, "summary.json"));
            foreach (string fragment in expect.Skip(1))
                Assert.True(summary.Contains(fragment, StringComparison.Ordinal) || r.Err.Contains(fragment, StringComparison.Ordinal),
                    $"{name}: '{fragment}' not in summary.json");
            foreach (string line in File.ReadLines(Path.Combine(t.Out, "respondent-flags.csv")))
                Assert.False(line.StartsWith('=') || line.Contains(",=", StringComparison.Ordinal) || line.StartsWith("\"=", StringComparison.Ordinal), line);
            Assert.Equal([t.Out], Directory.GetDirectories(t.Folder));
            AssertOutputsAreSafe(t);
        }
    }

    /// <summary>Checks every successful run of the corpus: no CSV output carries a raw control character (one record per
    /// line), tables.md holds no active HTML or link syntax, and short-form-codebook.csv is accepted back by
    /// <c>check</c> as the codebook of the same responses.</summary>
    private static void AssertOutputsAreSafe(TempSurvey t)
    {
        foreach (string csv in Directory.GetFiles(t.Out, "*.csv"))
        {
            string text = File.ReadAllText(csv);
            Assert.False(text.Any(ch => char.IsControl(ch) && ch != '\n'), $"{Path.GetFileName(csv)} holds a raw control character");
        }
        string md = File.ReadAllText(Path.Combine(t.Out, "tables.md"));
        Assert.DoesNotContain('<', md);
        Assert.DoesNotContain('>', md);
        Assert.DoesNotMatch(@"(?<!\\)\]\(", md); // a link needs an unescaped "]("
        Assert.DoesNotMatch(@"(?<!\\)`", md);
        if (File.ReadAllText(t.Codebook).Contains("<script>", StringComparison.Ordinal))
        {
            // The codebook's hostile names are in the tables, shown as written but inert.
            Assert.Contains("&lt;script&gt;alert(1)&lt;/script&gt;", md, StringComparison.Ordinal);
            Assert.Contains("\\[x\\](javascript:alert(1))", md, StringComparison.Ordinal);
            Assert.Contains("\\*star\\*", md, StringComparison.Ordinal);
        }
        string shortCodebook = Path.Combine(t.Out, "short-form-codebook.csv");
        if (File.Exists(shortCodebook))
        {
            var back = TempSurvey.Cli("check", "--responses", t.Responses, "--codebook", shortCodebook);
            Assert.True(back.Code == 0, "short-form-codebook.csv read back: " + back.Err);
        }
    }
}
