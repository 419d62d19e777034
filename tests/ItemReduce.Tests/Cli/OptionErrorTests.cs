using System.Text.Json;
using ItemReduce.Tests.Support;

namespace ItemReduce.Tests.Cli;

/// <summary>Option errors: exit 2 before any response is read (the responses file given does not exist, so reaching it
/// would give a different message), naming the option or the plan's key and line, the value and the allowed values in
/// plain words — never a program type name.</summary>
public class OptionErrorTests
{
    private static (int Code, string Out, string Err) Run(TempSurvey s, params string[] extra) =>
        TempSurvey.Cli(["run", "--responses", Path.Combine(s.Folder, "not-there.csv"), "--codebook", s.Codebook, "--out", s.Out, .. extra]);

    private static void AssertOptionError((int Code, string Out, string Err) r, params string[] expected)
    {
        Assert.Equal(2, r.Code);
        Assert.Single(r.Err.Trim().Split('\n'));
        Assert.DoesNotContain("not-there", r.Err);
        Assert.DoesNotContain("System.", r.Err);
        Assert.DoesNotContain("Nullable", r.Err);
        foreach (string e in expected) Assert.Contains(e, r.Err);
    }

    [Theory]
    [InlineData("--seed", "-1", "a whole number from 0 to 18446744073709551615")]
    [InlineData("--seed", "abc", "a whole number from 0 to")]
    [InlineData("--replicates", "1000000", "a whole number from 10 to 100000")] // Core's ParallelAnalysisOptions range
    [InlineData("--replicates", "9", "a whole number from 10 to 100000")]
    [InlineData("--items-per-factor", "1000", "a whole number from 2 to 100")] // Core's ShortFormOptions range
    [InlineData("--items-per-factor", "1", "a whole number from 2 to 100")]
    [InlineData("--cutoff-p", "0.5", "a number above 0 and below 0.5")]
    [InlineData("--percentile", "100", "a number above 0 and below 100")]
    [InlineData("--holdout", "0.95", "a number from 0 to 0.9")]
    [InlineData("--correlation", "spearman", "one of pearson, polychoric")]
    [InlineData("--missing-data", "none", "one of pairwise, listwise")]
    [InlineData("--scale-targets", "S1=1", "each length a whole number from 2 to 100")]
    [InlineData("--no-pdf", "maybe", "true or false")]
    public void Command_line_values_out_of_range_name_the_option_value_and_allowed_values(string option, string value, string allowed)
    {
        using var s = new TempSurvey().WithCodebook();
        AssertOptionError(Run(s, option, value), option, $"\"{value}\"", allowed);
    }

    [Theory]
    [InlineData("\"seed\": \"abc\"", "\"seed\"", "a whole number from 0 to")]
    [InlineData("\"seed\": -1", "\"seed\"", "a whole number from 0 to")]
    [InlineData("\"no-pdf\": \"maybe\"", "\"no-pdf\"", "true or false")]
    [InlineData("\"replicates\": 1000000", "\"replicates\"", "from 10 to 100000")]
    [InlineData("\"scale-targets\": { \"S1\": 1 }", "\"scale-targets\"", "from 2 to 100")]
    [InlineData("\"missing\": { \"a\": 1 }", "\"missing\"", "a comma-separated list")]
    public void Plan_values_out_of_range_name_the_plan_line_key_and_allowed_values(string entry, string key, string allowed)
    {
        using var s = new TempSurvey().WithCodebook();
        string plan = Path.Combine(s.Folder, "my-plan.json");
        File.WriteAllText(plan, "{\n  // settings\n  \"holdout\": 0,\n  " + entry + "\n}\n");
        var r = Run(s, "--plan", plan);
        AssertOptionError(r, "my-plan.json, line 4", key, allowed);
    }

    [Fact]
    public void A_key_given_twice_in_a_plan_names_both_lines()
    {
        using var s = new TempSurvey().WithCodebook();
        string plan = Path.Combine(s.Folder, "twice.json");
        File.WriteAllText(plan, "{\n  \"seed\": 3,\n  \"replicates\": 20,\n  \"seed\": 4\n}\n");
        AssertOptionError(Run(s, "--plan", plan), "twice.json, line 4, \"seed\": given twice (also on line 2)");
    }

    [Theory]
    [InlineData("wellbeeing=3")]
    [InlineData("S1=2,S9=3")]
    public void Scale_targets_naming_no_codebook_subscale_list_the_subscales(string targets)
    {
        using var s = new TempSurvey().WithCodebook(); // subscales S1, S2
        var r = Run(s, "--scale-targets", targets);
        AssertOptionError(r, "--scale-targets", "is not a subscale of codebook.csv", "S1, S2");
    }

    [Fact]
    public void A_fixed_factor_count_not_below_the_codebook_items_is_an_option_error()
    {
        using var s = new TempSurvey().WithCodebook(); // 4 items
        AssertOptionError(Run(s, "--factors", "4"), "--factors", "\"4\"", "a whole number from 1 to 3");
    }

    [Fact]
    public void A_setting_the_command_does_not_use_is_ignored_with_a_notice_from_the_command_line_and_from_a_plan_alike()
    {
        using var s = new TempSurvey().WithCodebook(6).WithResponses(TempSurvey.ValidResponses(60, 6));
        string plan = Path.Combine(s.Folder, "plan.json");
        File.WriteAllText(plan, "{\n  \"distance\": \"classical\"\n}\n");
        var fromPlan = TempSurvey.Cli("shorten", "--responses", s.Responses, "--codebook", s.Codebook, "--out", s.Out, "--plan", plan, "--replicates", "20");
        Assert.True(fromPlan.Code == 0, fromPlan.Err);
        Assert.Contains("itemreduce: note: plan.json, line 2, \"distance\" does not apply to 'shorten' (used by screen, run); ignored.", fromPlan.Err);
        var onLine = TempSurvey.Cli("shorten", "--responses", s.Responses, "--codebook", s.Codebook, "--out", s.Out, "--force", "--distance", "classical", "--replicates", "20");
        Assert.True(onLine.Code == 0, onLine.Err);
        Assert.Contains("itemreduce: note: --distance does not apply to 'shorten' (used by screen, run); ignored.", onLine.Err);
        // A value that is not allowed is still an error, whether or not the command uses the setting.
        var bad = TempSurvey.Cli("shorten", "--responses", s.Responses, "--codebook", s.Codebook, "--out", s.Out, "--distance", "nearest");
        Assert.Equal(2, bad.Code);
        Assert.Contains("one of robust, classical", bad.Err);
    }

    [Fact]
    public void Summary_records_typed_options_and_the_plan_with_its_sha256()
    {
        using var s = new TempSurvey().WithCodebook(6).WithResponses(TempSurvey.ValidResponses(60, 6));
        string plan = Path.Combine(s.Folder, "plan.json");
        File.WriteAllText(plan, "{ \"responses\": \"responses.csv\", \"codebook\": \"codebook.csv\", \"seed\": 42, \"missing\": [\"\", \"NA\", \"-9\"], \"scale-targets\": { \"S1\": 2 } }");
        var r = TempSurvey.Cli("run", "--plan", plan, "--out", s.Out, "--replicates", "20", "--no-pdf", "--holdout", "0");
        Assert.True(r.Code == 0, r.Err);
        var sum = JsonDocument.Parse(File.ReadAllText(Path.Combine(s.Out, "summary.json"))).RootElement;
        var o = sum.GetProperty("options");
        Assert.Equal(JsonValueKind.Number, o.GetProperty("seed").ValueKind);
        Assert.Equal(42ul, o.GetProperty("seed").GetUInt64());
        Assert.Equal(JsonValueKind.Number, o.GetProperty("replicates").ValueKind);
        Assert.Equal(JsonValueKind.True, o.GetProperty("no-pdf").ValueKind);
        Assert.Equal(["", "NA", "-9"], o.GetProperty("missing").EnumerateArray().Select(e => e.GetString()));
        Assert.Equal(2, o.GetProperty("scale-targets").GetProperty("S1").GetInt32());
        Assert.Equal("plan", sum.GetProperty("optionsGiven").GetProperty("seed").GetString());
        Assert.Equal("command line", sum.GetProperty("optionsGiven").GetProperty("replicates").GetString());
        var inputs = sum.GetProperty("inputs");
        Assert.Equal("plan.json", inputs.GetProperty("plan").GetString());
        // SHA-256 of the plan's bytes, computed here with the framework's hash (independent of the tool's FileFingerprint).
        Assert.Equal(Convert.ToHexStringLower(System.Security.Cryptography.SHA256.HashData(File.ReadAllBytes(plan))), inputs.GetProperty("planSha256").GetString());
    }

    [Fact]
    public void Warnings_are_printed_numbered_one_line_each_on_stderr_unless_quiet()
    {
        using var s = new TempSurvey().WithCodebook(6).WithResponses(TempSurvey.ValidResponses(60, 6));
        var r = s.Run("--replicates", "20", "--no-pdf");
        Assert.True(r.Code == 0, r.Err);
        var sum = JsonDocument.Parse(File.ReadAllText(Path.Combine(s.Out, "summary.json"))).RootElement;
        var warnings = sum.GetProperty("warnings").EnumerateArray().ToList();
        Assert.NotEmpty(warnings);
        var lines = r.Err.Split('\n', StringSplitOptions.RemoveEmptyEntries).Where(l => l.StartsWith("itemreduce: warning ", StringComparison.Ordinal)).ToList();
        Assert.Equal(warnings.Count, lines.Count);
        for (int i = 0; i < lines.Count; i++)
        {
            Assert.StartsWith($"itemreduce: warning {i + 1} of {warnings.Count} ({warnings[i].GetProperty("stage").GetString()}, {warnings[i].GetProperty("code").GetString()}): ", lines[i]);
            // A warning that names a setting ends with the option that sets it (summary.json "option").
            var optionElement = warnings[i].GetProperty("option");
            string? option = optionElement.ValueKind == JsonValueKind.String ? optionElement.GetString() : null;
            Assert.EndsWith(warnings[i].GetProperty("message").GetString()! + (option is null ? "" : $" (option --{option})"), lines[i]);
        }
        var quiet = s.Run("--replicates", "20", "--no-pdf", "--force", "--quiet");
        Assert.Equal(0, quiet.Code);
        Assert.Equal("", quiet.Err);
    }
}
