using System.Globalization;
using System.Text.Json;
using ItemReduce.Application.Settings;
using ItemReduce.Application.Summary;
using ItemReduce.Cli;
using ItemReduce.Tests.Support;
using Spectre.Console;

namespace ItemReduce.Tests.Cli;

/// <summary>What a person sees: the end-of-command summary, --json, help and --version, and reading a
/// survey-platform export with --skip-rows.</summary>
public class PresentationTests
{
    internal static string Root()
    {
        string d = AppContext.BaseDirectory;
        while (!File.Exists(Path.Combine(d, "ItemReduce.sln"))) d = Path.GetDirectoryName(d) ?? throw new DirectoryNotFoundException("repository root");
        return d;
    }

    private static string Sample(string file) => Path.Combine(Root(), "sample-surveys", "ferry-riders", file);

    /// <summary>One run of the bundled sample survey (no PDF), shared by the summary tests.</summary>
    public sealed class SampleRun : IDisposable
    {
        public SampleRun()
        {
            Folder = Path.Combine(Path.GetTempPath(), "itemreduce-tests", Guid.NewGuid().ToString("N"));
            Directory.CreateDirectory(Folder);
            Result = TempSurvey.Cli("run", "--plan", Sample("plan.json"), "--out", Path.Combine(Folder, "results"), "--no-pdf");
            Summary = JsonDocument.Parse(File.ReadAllText(Path.Combine(Folder, "results", "summary.json"))).RootElement;
        }

        public string Folder { get; }
        public (int Code, string Out, string Err) Result { get; }
        public JsonElement Summary { get; }

        public void Dispose()
        {
            try { Directory.Delete(Folder, true); } catch (IOException) { }
        }
    }

    public class Summary(SampleRun run) : IClassFixture<SampleRun>
    {
        [Fact]
        public void Plain_summary_gives_counts_rules_decision_scales_and_where_to_look()
        {
            Assert.True(run.Result.Code == 0, run.Result.Err);
            string text = run.Result.Out;
            var sum = run.Summary;
            Assert.DoesNotContain('\u001b', text); // no colour codes when stdout is not a terminal
            var lines = text.Split('\n');
            // Respondents: read, flagged (by reason), analysed; numbers as in summary.json.
            var resp = sum.GetProperty("respondents");
            Assert.Contains(lines, l => l.StartsWith("  read ", StringComparison.Ordinal) && l.EndsWith(" " + resp.GetProperty("total").GetInt32(), StringComparison.Ordinal));
            Assert.Contains(lines, l => l.StartsWith("  flagged for review ", StringComparison.Ordinal) && l.EndsWith(" " + resp.GetProperty("flagged").GetInt32(), StringComparison.Ordinal));
            Assert.Contains(lines, l => l.StartsWith("  analysed ", StringComparison.Ordinal) && l.EndsWith(" " + resp.GetProperty("analysed").GetInt32(), StringComparison.Ordinal));
            foreach (var reason in resp.GetProperty("reasons").EnumerateObject().Where(r => r.Value.GetInt32() > 0))
                Assert.Contains(lines, l => l.TrimStart().StartsWith(reason.Name + " ", StringComparison.Ordinal) && l.EndsWith(" " + reason.Value.GetInt32(), StringComparison.Ordinal));
            // Numbers right-aligned in one column: all count cells of the respondents block end at the same position.
            var block = lines.SkipWhile(l => l != "Respondents").Skip(1).TakeWhile(l => !l.StartsWith("  Items", StringComparison.Ordinal)).ToList();
            Assert.Single(block.Select(l => l.Length).Distinct());
            // Every rule's count and the decision with its reason.
            foreach (var rule in sum.GetProperty("factors").GetProperty("byRule").EnumerateObject())
            {
                // Shown in the command line's spelling (kebab-case), e.g. parallelReduced → parallel-reduced.
                string label = string.Concat(rule.Name.Select(c => char.IsUpper(c) ? "-" + char.ToLowerInvariant(c) : c.ToString()));
                Assert.Contains(lines, l => l.StartsWith("  " + label + " ", StringComparison.Ordinal) && l.EndsWith(" " + rule.Value.GetInt32(), StringComparison.Ordinal));
            }
            Assert.Contains(lines, l => l.StartsWith("  parallel-reduced ", StringComparison.Ordinal)); // a choice of --factors-rule, as typed
            Assert.Contains($"Decision: {sum.GetProperty("factors").GetProperty("retained").GetInt32()} factor(s) by the {sum.GetProperty("factors").GetProperty("rule").GetString()} rule.", text);
            Assert.Contains(sum.GetProperty("factors").GetProperty("reason").GetString()!, text);
            // Per scale: kept items, α and ω full → short, two decimals of summary.json's values.
            Assert.Contains("α (full → short)", text);
            var rel = sum.GetProperty("shortForm").GetProperty("reliability").EnumerateArray().ToList();
            foreach (var scale in sum.GetProperty("shortForm").GetProperty("scales").EnumerateArray())
            {
                string name = scale.GetProperty("scale").GetString()!;
                string items = string.Join(", ", scale.GetProperty("items").EnumerateArray().Select(i => i.GetString()));
                string A(string form, string key) => rel.Single(x => x.GetProperty("scale").GetString() == name && x.GetProperty("form").GetString() == form)
                    .GetProperty(key).GetDouble().ToString("F2", CultureInfo.InvariantCulture);
                var row = lines.Single(l => l.StartsWith("  " + name + " ", StringComparison.Ordinal));
                Assert.Contains(items, row);
                Assert.Contains($"{A("full", "alpha")} → {A("short", "alpha")}", row);
                Assert.Contains($"{A("full", "omega")} → {A("short", "omega")}", row);
            }
            // The planted weak items (rel6 .35, cmf7 .30) and the cross-loader (val5) of the sample's generating model
            // (sample-surveys/ferry-riders/README.md) are not among the kept items.
            foreach (string weak in new[] { "rel6", "cmf7", "val5" }) Assert.DoesNotContain(weak, text);
            Assert.Contains("Results folder: " + Path.Combine(run.Folder, "results"), text);
            Assert.Contains("Open first: tables.md", text);
            // Warnings stay on stderr, numbered.
            Assert.Contains("itemreduce: warning 1 of ", run.Result.Err);
            Assert.DoesNotContain("warning", text);
        }

        [Fact]
        public void Screening_rules_are_numbered_one_two_three_without_gaps()
        {
            // The sample has 5 subscales, too few for the even-odd rule to flag, so that rule is left out of the list.
            string rule = run.Summary.GetProperty("screening").GetProperty("ruleDescription").GetString()!;
            var numbers = System.Text.RegularExpressions.Regex.Matches(rule, @"\((\d+)\) ").Select(m => int.Parse(m.Groups[1].Value, CultureInfo.InvariantCulture)).ToList();
            Assert.Equal(Enumerable.Range(1, numbers.Count), numbers);
            Assert.True(numbers.Count >= 3);
        }

        [Fact]
        public void Terminal_summary_draws_aligned_tables()
        {
            var blocks = RunSummary.Blocks(JsonSerializer.Deserialize<System.Text.Json.Nodes.JsonObject>(run.Summary.GetRawText())!, "/tmp/x",
                ["appendix.pdf", "summary.json"]);
            var w = new StringWriter();
            var console = AnsiConsole.Create(new AnsiConsoleSettings { Out = new AnsiConsoleOutput(w), Ansi = AnsiSupport.No, ColorSystem = ColorSystemSupport.NoColors });
            console.Profile.Width = 160;
            SummaryConsole.Render(blocks, console);
            string text = w.ToString();
            var scaleRows = text.Split('\n').Where(l => l.Contains("crw1", StringComparison.Ordinal) || l.Contains("cmf1", StringComparison.Ordinal)).ToList();
            Assert.Equal(2, scaleRows.Count);
            // Aligned: the α column starts at the same position in both rows.
            Assert.Equal(scaleRows[0].IndexOf('→'), scaleRows[1].IndexOf('→'));
            Assert.Contains("Open first: appendix.pdf", text);
        }
    }

    [Fact]
    public void Json_option_prints_summary_json_on_stdout()
    {
        using var s = new TempSurvey().WithCodebook(6).WithResponses(TempSurvey.ValidResponses(60, 6));
        var r = s.Run("--json", "--no-pdf");
        Assert.True(r.Code == 0, r.Err);
        Assert.Equal(File.ReadAllText(Path.Combine(s.Out, "summary.json")), r.Out);
        using var doc = JsonDocument.Parse(r.Out);
        Assert.Equal(60, doc.RootElement.GetProperty("respondents").GetProperty("total").GetInt32());
    }

    [Fact]
    public void Version_is_the_one_summary_json_records()
    {
        using var s = new TempSurvey().WithCodebook(6).WithResponses(TempSurvey.ValidResponses(60, 6));
        Assert.Equal(0, s.Run("--no-pdf").Code);
        string recorded = JsonDocument.Parse(File.ReadAllText(Path.Combine(s.Out, "summary.json"))).RootElement.GetProperty("tool").GetProperty("version").GetString()!;
        var v = TempSurvey.Cli("--version");
        Assert.Equal(0, v.Code);
        Assert.Equal("itemreduce " + recorded + "\n", v.Out.ReplaceLineEndings("\n"));
    }

    public static TheoryData<string> CommandNames => new() { "check", "screen", "dimensions", "shorten", "run" };

    [Theory]
    [MemberData(nameof(CommandNames))]
    public void Help_shows_placeholders_required_options_and_examples_that_parse(string command)
    {
        var r = TempSurvey.Cli(command, "--help");
        Assert.Equal(0, r.Code);
        Assert.Contains("--responses <FILE>", r.Out);
        Assert.Contains("[required] Responses CSV", r.Out);
        Assert.Contains("[required] Codebook CSV", r.Out);
        Assert.Contains("--missing <LIST>", r.Out);
        Assert.Contains("--skip-rows <N>", r.Out);
        if (command != "check") Assert.Contains("--out <DIR>", r.Out);
        if (command is "screen" or "run") Assert.Contains("--cutoff-p <P>", r.Out);
        Assert.DoesNotContain("<String>", r.Out, StringComparison.OrdinalIgnoreCase);
        // Examples: two or three, each parses without errors and names files that exist in the repository.
        var examples = r.Out[r.Out.IndexOf("Examples:", StringComparison.Ordinal)..].Split('\n')
            .Where(l => l.StartsWith("  itemreduce ", StringComparison.Ordinal)).Select(l => l["  itemreduce ".Length..].Trim()).ToList();
        Assert.InRange(examples.Count, 2, 3);
        var root = CliApp.Build(TextWriter.Null, TextWriter.Null, false, false);
        foreach (string line in examples)
        {
            var args = line.Split(' ');
            Assert.Equal(command, args[0]);
            var parse = root.Parse(args);
            Assert.Empty(parse.Errors);
            foreach (string file in args.Where(a => a.StartsWith("sample-surveys/", StringComparison.Ordinal)))
                Assert.True(File.Exists(Path.Combine(Root(), file)), file);
        }
    }

    [Fact]
    public void Check_examples_run_from_the_repository_folder()
    {
        foreach (var (_, line) in HelpExamples.Of(Commands.Check))
        {
            var r = CliProcess.Run(Root(), null, line.Split(' '));
            Assert.True(r.Code == 0, line + ": " + r.Err);
            Assert.Contains("Respondents: 960", r.Out);
        }
    }

    [Fact]
    public void Platform_export_with_skip_rows_reads_the_same_answers_as_the_plain_file()
    {
        // The export holds the same answers as responses.csv, two extra header rows and -99 for missing answers
        // (tools/ItemReduce.SampleSurvey writes both from one matrix).
        var plain = TempSurvey.Cli("check", "--responses", Sample("responses.csv"), "--codebook", Sample("codebook.csv"));
        var export = TempSurvey.Cli("check", "--responses", Sample("platform-export.csv"), "--codebook", Sample("codebook.csv"), "--skip-rows", "2", "--missing=-99");
        Assert.True(export.Code == 0, export.Err);
        static IEnumerable<string> Numbers(string s) => s.Split('\n').Where(l => !l.StartsWith("Missing codes", StringComparison.Ordinal)).Where(l => l.Contains("Respondents", StringComparison.Ordinal)
            || l.Contains("issing", StringComparison.Ordinal) || l.Contains("Items", StringComparison.Ordinal));
        Assert.Equal(Numbers(plain.Out), Numbers(export.Out));
        Assert.NotEmpty(Numbers(plain.Out));
    }

    [Fact]
    public void Platform_export_without_skip_rows_fails_on_line_2_with_a_fix()
    {
        var r = TempSurvey.Cli("check", "--responses", Sample("platform-export.csv"), "--codebook", Sample("codebook.csv"), "--missing=-99");
        Assert.Equal(2, r.Code);
        Assert.Contains("line 2", r.Err);
        Assert.Single(r.Err.Trim().Split('\n'));
    }

    [Fact]
    public void Skip_rows_past_the_end_of_the_file_is_one_clear_error()
    {
        using var s = new TempSurvey().WithCodebook().WithResponses("respondent,q1,q2,q3,q4\nquestion,a,b,c,d\n");
        var r = s.Check("--skip-rows", "3");
        Assert.Equal(2, r.Code);
        Assert.Contains("--skip-rows", r.Err);
        var ok = new TempSurvey().WithCodebook().WithResponses("respondent,q1,q2,q3,q4\nquestion,a,b,c,d\n" + string.Join("", TempSurvey.ValidResponses(40).Split('\n').Skip(1).Select(l => l.Length > 0 ? l + "\n" : "")));
        using (ok)
        {
            var c = ok.Check("--skip-rows", "1");
            Assert.True(c.Code == 0, c.Err);
            Assert.Contains("Respondents: 40", c.Out);
        }
    }
}

public class TemplateTests
{
    [Fact]
    public void Codebook_template_is_a_valid_codebook()
    {
        string template = File.ReadAllText(Path.Combine(PresentationTests.Root(), "templates", "codebook-template.csv"));
        var sb = new System.Text.StringBuilder("respondent,q01,q02,q03,q04,q05,q06\n");
        for (int i = 0; i < 40; i++)
            sb.Append('r').Append(i).Append(string.Concat(Enumerable.Range(0, 6).Select(j => "," + ((i * (j + 2) + j * j + i / 3) % 5 + 1)))).Append('\n');
        using var s = new TempSurvey().WithCodebook(6, template).WithResponses(sb.ToString());
        var r = s.Check();
        Assert.True(r.Code == 0, r.Err);
        Assert.Contains("6 in codebook", r.Out);
    }
}
