using System.Text;
using System.Text.Json;
using ItemReduce.Tests.Support;

namespace ItemReduce.Tests.Cli;

public class RunCommandTests
{
    private static JsonElement Summary(TempSurvey s) => JsonDocument.Parse(File.ReadAllText(Path.Combine(s.Out, "summary.json"))).RootElement;

    [Fact]
    public void Zero_variance_and_all_missing_items_are_excluded_with_a_warning_and_recorded()
    {
        // Policy (documented in the README): continue, exclude the item, warn, record it in summary.json.
        var lines = TempSurvey.ValidResponses(40, 6).Split('\n', StringSplitOptions.RemoveEmptyEntries).ToList();
        for (int i = 1; i < lines.Count; i++)
        {
            var c = lines[i].Split(',');
            c[5] = "3";   // q5 constant
            c[6] = "NA";  // q6 never answered
            lines[i] = string.Join(',', c);
        }
        using var s = new TempSurvey().WithCodebook(6).WithResponses(string.Join('\n', lines) + "\n");
        var r = s.Run();
        Assert.True(r.Code == 0, r.Err);
        var sum = Summary(s);
        var excluded = sum.GetProperty("excludedItems").EnumerateArray().Select(e => (e.GetProperty("item").GetString(), e.GetProperty("reason").GetString())).ToList();
        Assert.Contains(("q5", "zero-variance"), excluded);
        Assert.Contains(("q6", "all-missing"), excluded);
        Assert.Equal(4, sum.GetProperty("items").GetProperty("analysed").GetInt32());
        Assert.Contains(sum.GetProperty("warnings").EnumerateArray(), w => w.GetProperty("message").GetString()!.Contains("q5"));
    }

    [Theory]
    [InlineData(';')]
    [InlineData('\t')]
    public void Semicolon_and_tab_delimiters_are_detected(char d)
    {
        using var s = new TempSurvey().WithCodebook().WithResponses(TempSurvey.ValidResponses(40, 4, d));
        var r = s.Check();
        Assert.True(r.Code == 0, r.Err);
        Assert.Contains(d == ';' ? "semicolon" : "tab", r.Out);
        Assert.Contains("Respondents: 40", r.Out);
    }

    [Fact]
    public void Default_rule_is_reduced_matrix_parallel_analysis_and_polychoric_gets_the_ordinal_reference()
    {
        // Defaults chosen in issue 14 (README, "Choosing the number of dimensions"); the new rules are reported.
        using var s = new TempSurvey().WithCodebook(6).WithResponses(TempSurvey.ValidResponses(200, 6));
        var r = s.Run("--replicates", "40", "--correlation", "polychoric");
        Assert.True(r.Code == 0, r.Err);
        var sum = Summary(s);
        var factors = sum.GetProperty("factors");
        Assert.Equal("parallel-reduced", factors.GetProperty("rule").GetString());
        foreach (string rule in new[] { "parallelMean", "parallelReducedMean", "empiricalKaiser", "comparisonData", "combined" })
            Assert.Equal(JsonValueKind.Number, factors.GetProperty("byRule").GetProperty(rule).ValueKind);
        Assert.Contains("\"ordinal\"", File.ReadAllText(Path.Combine(s.Out, "summary.json")));
        var header = File.ReadLines(Path.Combine(s.Out, "eigenvalues.csv")).First();
        Assert.EndsWith("empirical_kaiser_reference,comparison_rmsr,comparison_p_value", header);
    }

    [Theory]
    [InlineData("comparison-data", "comparison-data")]
    [InlineData("empirical-kaiser", "empirical-kaiser")]
    [InlineData("parallel", "parallel")]
    [InlineData("combined", "combined")]
    public void Factors_rule_choices_reach_the_decision(string option, string reported)
    {
        using var s = new TempSurvey().WithCodebook(6).WithResponses(TempSurvey.ValidResponses(200, 6));
        var r = s.Run("--replicates", "40", "--factors-rule", option);
        Assert.True(r.Code == 0, r.Err);
        Assert.Equal(reported, Summary(s).GetProperty("factors").GetProperty("rule").GetString());
    }

    [Fact]
    public void Utf8_bom_and_utf16_files_are_read()
    {
        using var a = new TempSurvey().WithCodebook().WithResponses(TempSurvey.ValidResponses(40), new UTF8Encoding(true));
        Assert.Equal(0, a.Check().Code);
        using var b = new TempSurvey().WithCodebook().WithResponses(TempSurvey.ValidResponses(40), new UnicodeEncoding(false, true));
        var r = b.Check();
        Assert.True(r.Code == 0, r.Err);
        Assert.Contains("Respondents: 40", r.Out);
    }

    [Fact]
    public void Plan_file_supplies_options_and_the_command_line_overrides_it()
    {
        using var s = new TempSurvey().WithCodebook().WithResponses(TempSurvey.ValidResponses(40));
        string plan = Path.Combine(s.Folder, "plan.json");
        File.WriteAllText(plan, "{ // comment\n \"responses\": \"responses.csv\", \"codebook\": \"codebook.csv\", \"seed\": 7, \"out\": \"from-plan\", }");
        var r = TempSurvey.Cli("run", "--plan", plan, "--seed", "9");
        Assert.True(r.Code == 0, r.Err);
        var sum = JsonDocument.Parse(File.ReadAllText(Path.Combine(s.Folder, "from-plan", "summary.json"))).RootElement;
        Assert.Equal(9ul, sum.GetProperty("seed").GetUInt64());
    }

    [Fact]
    public void Plan_file_with_an_unknown_key_names_the_key()
    {
        using var s = new TempSurvey().WithCodebook().WithResponses(TempSurvey.ValidResponses(40));
        string plan = Path.Combine(s.Folder, "plan.json");
        File.WriteAllText(plan, "{ \"responses\": \"responses.csv\", \"replicats\": 10 }");
        var r = TempSurvey.Cli("run", "--plan", plan);
        Assert.Equal(2, r.Code);
        Assert.Contains("\"replicats\"", r.Err);
        Assert.Contains("unknown setting", r.Err);
    }

    [Fact]
    public void Id_column_defaults_to_first_non_item_column_and_can_be_overridden()
    {
        string text = "wave,code,q1,q2,q3,q4\n" + string.Join("\n", TempSurvey.ValidResponses(40).Split('\n').Skip(1)
            .Where(l => l.Length > 0).Select((l, i) => $"w1,c{i}," + l[(l.IndexOf(',') + 1)..])) + "\n";
        using var s = new TempSurvey().WithCodebook().WithResponses(text);
        var dup = s.Check(); // "wave" is the default id column and is duplicated
        Assert.Equal(2, dup.Code);
        Assert.Contains("\"wave\"", dup.Err);
        var ok = s.Check("--id-column", "code");
        Assert.True(ok.Code == 0, ok.Err);
        Assert.Contains("id column: code", ok.Out);
    }

    [Fact]
    public void Same_inputs_and_seed_give_byte_identical_summary()
    {
        using var s = new TempSurvey().WithCodebook().WithResponses(TempSurvey.ValidResponses(60));
        Assert.Equal(0, s.Run().Code);
        string first = File.ReadAllText(Path.Combine(s.Out, "summary.json"));
        Assert.Equal(0, s.Run("--force").Code);
        Assert.Equal(first, File.ReadAllText(Path.Combine(s.Out, "summary.json")));
    }

    [Fact]
    public void A_stage_stopping_after_screening_leaves_no_outputs_although_the_flags_table_was_being_written()
    {
        // 11 straight-liners among 14 respondents on 10 items: they are set aside, 3 remain for 10 items (fewer than the
        // 11 needed), so the run stops at the dimensions stage after respondent-flags.csv was started in the background.
        var sb = new System.Text.StringBuilder("respondent," + string.Join(',', Enumerable.Range(1, 10).Select(j => $"q{j}")) + "\n");
        for (int i = 0; i < 11; i++) sb.Append($"s{i}," + string.Join(',', Enumerable.Repeat("3", 10)) + "\n");
        for (int i = 0; i < 3; i++) sb.Append($"v{i}," + string.Join(',', Enumerable.Range(0, 10).Select(j => ((i * 7 + j * 3 + j * j) % 5 + 1).ToString())) + "\n");
        using var t = new TempSurvey().WithCodebook(10).WithResponses(sb.ToString());
        var (code, _, err) = t.Run("--replicates", "20");
        Assert.Equal(2, code);
        Assert.Contains("remain after screening", err);
        Assert.Single(err.Trim().Split('\n'));
        Assert.False(Directory.Exists(t.Out));
        Assert.DoesNotContain(Directory.GetDirectories(t.Folder), d => Path.GetFileName(d).Contains("partial", StringComparison.Ordinal));
    }

    [Fact]
    public void Progress_goes_to_stderr_only_when_asked_and_never_with_quiet()
    {
        using var t = new TempSurvey().WithCodebook(6).WithResponses(TempSurvey.ValidResponses(60, 6));
        // Not a terminal (the test's writer) and no --progress: no progress lines.
        var plain = t.Run("--replicates", "20", "--no-pdf");
        Assert.Equal(0, plain.Code);
        Assert.DoesNotContain("itemreduce: [", plain.Err);
        var asked = t.Run("--replicates", "20", "--no-pdf", "--force", "--progress");
        Assert.Equal(0, asked.Code);
        var lines = asked.Err.Split('\n', StringSplitOptions.RemoveEmptyEntries);
        Assert.Contains(lines, l => l.StartsWith("itemreduce: [", StringComparison.Ordinal) && l.Contains(" s] screening", StringComparison.Ordinal));
        Assert.Contains(lines, l => l.Contains("writing respondent-flags.csv", StringComparison.Ordinal));
        var quiet = t.Run("--replicates", "20", "--no-pdf", "--force", "--progress", "--quiet");
        Assert.Equal(0, quiet.Code);
        Assert.Equal("", quiet.Err);
    }
}
