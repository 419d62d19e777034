using System.Reflection;
using System.Text.RegularExpressions;
using ItemReduce.Application.Appendix;

namespace ItemReduce.Tests.Application;

/// <summary>
/// One registry of cited works (<see cref="MethodReferences"/> for the methods the appendix can cite,
/// <see cref="ComputingReferences"/> for the numerical works the code follows): every author–year citation in a code
/// comment under src/ names a registry entry, every entry is cited by the code or used by the appendix, no work is
/// registered twice, and the README's reference list is the one the registry generates
/// (regenerate with ITEMREDUCE_WRITE_README=1).
/// </summary>
public sealed partial class CitationRegistryTests
{
    private sealed record Work(string Field, string Authors, string Year, string Text);

    private static readonly string Root = FindRoot();

    private static string FindRoot()
    {
        string root = AppContext.BaseDirectory;
        while (!File.Exists(Path.Combine(root, "ItemReduce.sln"))) root = Path.GetDirectoryName(root)!;
        return root;
    }

    private static List<Work> Registry(Type type) =>
        type.GetFields(BindingFlags.Public | BindingFlags.Static)
            .Where(f => f.IsLiteral && f.FieldType == typeof(string))
            .Select(f =>
            {
                string text = (string)f.GetRawConstantValue()!;
                var m = EntryPattern().Match(text);
                Assert.True(m.Success, $"{type.Name}.{f.Name}: not in 'Authors (Year). Title…' form: {text}");
                return new Work(f.Name, m.Groups["authors"].Value, m.Groups["year"].Value, text);
            })
            .ToList();

    private static List<Work> AllWorks() => [.. Registry(typeof(MethodReferences)), .. Registry(typeof(ComputingReferences))];

    /// <summary>Source files of the shipped projects (not build output).</summary>
    private static IEnumerable<string> SourceFiles() =>
        Directory.EnumerateFiles(Path.Combine(Root, "src"), "*.cs", SearchOption.AllDirectories)
            .Where(f => !f.Contains($"{Path.DirectorySeparatorChar}obj{Path.DirectorySeparatorChar}", StringComparison.Ordinal)
                        && !f.Contains($"{Path.DirectorySeparatorChar}bin{Path.DirectorySeparatorChar}", StringComparison.Ordinal));

    /// <summary>Author–year citations in comments: (first author's surname, year, where).</summary>
    private static List<(string Surname, string Year, string Where)> CodeCitations()
    {
        var found = new List<(string, string, string)>();
        foreach (string file in SourceFiles())
        {
            int n = 0;
            foreach (string raw in File.ReadLines(file))
            {
                n++;
                int c = raw.IndexOf("//", StringComparison.Ordinal);
                if (c < 0) continue;
                string comment = raw[c..].Replace("&amp;", "&", StringComparison.Ordinal);
                foreach (Match m in CitationPattern().Matches(comment))
                {
                    string surname = m.Groups["first"].Value;
                    if (surname.EndsWith("'s", StringComparison.Ordinal)) surname = surname[..^2];
                    if (NotAuthors.Contains(surname)) continue;
                    found.Add((surname, m.Groups["year"].Value, $"{Path.GetRelativePath(Root, file)}:{n}"));
                }
            }
        }
        return found;
    }

    /// <summary>Capitalised words that precede a year in comments without being a citation.</summary>
    private static readonly HashSet<string> NotAuthors = new(StringComparer.Ordinal)
    {
        "LaTeX", // "UTF-8 input is the default since LaTeX 2018": a software release, not a work.
    };

    [Fact]
    public void Every_citation_in_the_code_names_a_registered_work()
    {
        var works = AllWorks();
        var missing = CodeCitations()
            .Where(c => !works.Any(w => w.Year == c.Year && Regex.IsMatch(w.Authors, $@"(^|[\s,&]){Regex.Escape(c.Surname)}\b")))
            .Select(c => $"{c.Surname} ({c.Year}) at {c.Where}")
            .Distinct()
            .ToList();
        Assert.True(missing.Count == 0, "Cited in code but not in MethodReferences/ComputingReferences:\n" + string.Join("\n", missing));
    }

    [Fact]
    public void Every_registered_work_is_cited_once_in_the_registry_and_used()
    {
        var works = AllWorks();
        var duplicates = works.GroupBy(w => w.Text, StringComparer.Ordinal).Where(g => g.Count() > 1).Select(g => g.Key).ToList();
        Assert.True(duplicates.Count == 0, "Registered twice:\n" + string.Join("\n", duplicates));
        var citations = CodeCitations();
        string code = string.Join("\n", SourceFiles().Where(f => !f.EndsWith("MethodReferences.cs", StringComparison.Ordinal)).Select(File.ReadAllText));
        // The README's text (without its reference list) may cite a work too, e.g. in the study discussion.
        string readme = File.ReadAllText(Path.Combine(Root, "README.md")).ReplaceLineEndings("\n");
        int list = readme.IndexOf("<!-- reference list:", StringComparison.Ordinal);
        var readmeCitations = CitationPattern().Matches(list < 0 ? readme : readme[..list])
            .Select(m => (Surname: m.Groups["first"].Value, Year: m.Groups["year"].Value)).ToList();
        bool Cited(Work w, IEnumerable<(string Surname, string Year)> cs) =>
            cs.Any(c => c.Year == w.Year && Regex.IsMatch(w.Authors, $@"(^|[\s,&]){Regex.Escape(c.Surname)}\b"));
        var unused = works
            .Where(w => !code.Contains("References." + w.Field, StringComparison.Ordinal)
                        && !Cited(w, citations.Select(c => (c.Surname, c.Year))) && !Cited(w, readmeCitations))
            .Select(w => w.Field)
            .ToList();
        Assert.True(unused.Count == 0, "Registered but cited neither in a code comment nor in the README text, nor used by the appendix: " + string.Join(", ", unused));
    }

    [Fact]
    public void Readme_reference_list_is_the_one_the_registry_generates()
    {
        string path = Path.Combine(Root, "README.md");
        string readme = File.ReadAllText(path).ReplaceLineEndings("\n");
        const string begin = "<!-- reference list: generated from src/ItemReduce.Application/Appendix/MethodReferences.cs -->\n", end = "<!-- end of reference list -->";
        int a = readme.IndexOf(begin, StringComparison.Ordinal), b = readme.IndexOf(end, StringComparison.Ordinal);
        Assert.True(a >= 0 && b > a, "README lacks the reference-list markers");
        static string List(IEnumerable<Work> works) =>
            string.Concat(works.Select(w => w.Text).Order(StringComparer.Ordinal).Select(t => "- " + t + "\n"));
        string expected =
            "\nMethods the appendix can cite (it lists the ones a run used):\n\n" + List(Registry(typeof(MethodReferences))) +
            "\nNumerical and computing works the code follows:\n\n" + List(Registry(typeof(ComputingReferences))) + "\n";
        if (Environment.GetEnvironmentVariable("ITEMREDUCE_WRITE_README") == "1")
            File.WriteAllText(path, readme[..(a + begin.Length)] + expected + readme[b..]);
        Assert.Equal(expected, readme[(a + begin.Length)..b]);
    }

    [GeneratedRegex(@"^(?<authors>.+?) \((?<year>(?:1[89]|20)\d\d)[a-z]?(?:, [A-Z][a-z]+)?\)\. ")]
    private static partial Regex EntryPattern();

    /// <summary>"Horn (1965)", "Horn, 1965", "Harman &amp; Jones (1966)", "Little, Smith and Jones, 1987", "Smith et al. (1976)",
    /// "Braeken &amp; van Assen (2017)", "Brent's (1973)"; a surname has a lower-case letter (so "OUT_DIR 2000" is not one).</summary>
    [GeneratedRegex(@"(?<first>[A-Z][\p{L}'’\-]*\p{Ll}[\p{L}'’\-]*)(?:(?:,? & |, | and )(?:[a-z]{2,3} )?[A-Z][\p{L}'’\-]+(?: [A-Z][\p{L}'’\-]+)?)*(?: et al\.)?,? \(?(?<year>(?:1[89]|20)\d\d)\b")]
    private static partial Regex CitationPattern();
}
