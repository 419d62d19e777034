using System.Text.Json;
using ItemReduce.Simulation;
using ItemReduce.Tests.Support;
using UglyToad.PdfPig;

namespace ItemReduce.Tests.Cli;

/// <summary>
/// End-to-end checks of the output contracts (file names, columns, summary.json keys) and of known truth
/// planted by the simulator (three factors; straight-line and random responders).
/// </summary>
public class PipelineContractTests : IClassFixture<PipelineContractTests.RunOnce>
{
    public sealed class RunOnce : IDisposable
    {
        public RunOnce()
        {
            Truth = SimulatedFiles.ThreeFactorSurvey();
            Survey = SimulatedFiles.Write(Truth);
            Result = Survey.Run("--replicates", "200", "--seed", "5", "--holdout", "0.5", "--items-per-factor", "3", "--confirmatory");
        }
        public SimulatedSurvey Truth { get; }
        public TempSurvey Survey { get; }
        public (int Code, string Out, string Err) Result { get; }
        public void Dispose() => Survey.Dispose();
    }

    private readonly RunOnce _run;
    public PipelineContractTests(RunOnce run) => _run = run;

    private string File(string name) => Path.Combine(_run.Survey.Out, name);
    private string[] Lines(string name) => System.IO.File.ReadAllLines(File(name));
    private JsonElement Summary => JsonDocument.Parse(System.IO.File.ReadAllText(File("summary.json"))).RootElement;

    [Fact]
    public void Run_succeeds_and_writes_every_contract_file()
    {
        Assert.True(_run.Result.Code == 0, _run.Result.Err);
        foreach (string f in new[] { "summary.json", "respondent-flags.csv", "eigenvalues.csv", "loadings.csv", "structure-loadings.csv",
                     "factor-correlations.csv", "item-decisions.csv", "reliability.csv", "short-form-codebook.csv", "appendix.pdf", "tables.md", "tables.tex", "tables.docx" })
            Assert.True(System.IO.File.Exists(File(f)), f);
    }

    [Fact]
    public void Csv_headers_follow_the_contracts()
    {
        Assert.StartsWith("component,observed,reference_mean,reference_percentile,retained", Lines("eigenvalues.csv")[0]);
        Assert.StartsWith("respondent,items_answered,d2,robust_d2,cutoff,p_value,long_string,irv,missing_share,flagged,reasons", Lines("respondent-flags.csv")[0]);
        Assert.Equal("item,subscale,F1,F2,F3,communality,decision", Lines("loadings.csv")[0]);
        Assert.StartsWith("item,subscale,decision,reasons,primary_factor,primary_loading,secondary_loading,item_total_r,alpha_if_deleted", Lines("item-decisions.csv")[0]);
        Assert.StartsWith("scale,form,items,alpha,alpha_ci_low,alpha_ci_high,omega", Lines("reliability.csv")[0]);
        Assert.Equal("item,subscale,reverse,min,max,text", Lines("short-form-codebook.csv")[0]);
    }

    [Fact]
    public void Respondent_flags_are_in_input_order_with_one_row_each()
    {
        var ids = Lines("respondent-flags.csv").Skip(1).Select(l => l.Split(',')[0]).ToList();
        Assert.Equal(_run.Truth.Responses.RespondentIds, ids);
    }

    [Fact]
    public void Summary_json_has_the_contract_keys()
    {
        var s = Summary;
        var resp = s.GetProperty("respondents");
        Assert.Equal(500, resp.GetProperty("total").GetInt32());
        Assert.Equal(resp.GetProperty("total").GetInt32() - resp.GetProperty("flagged").GetInt32(), resp.GetProperty("analysed").GetInt32());
        var by = s.GetProperty("factors").GetProperty("byRule");
        foreach (string rule in new[] { "parallel", "map", "mapRevised", "kaiser" }) Assert.Equal(JsonValueKind.Number, by.GetProperty(rule).ValueKind);
        Assert.Equal(15, s.GetProperty("eigenvalues").GetArrayLength());
        Assert.Equal(15, s.GetProperty("parallelThresholds").GetArrayLength());
        Assert.InRange(s.GetProperty("kmo").GetDouble(), 0, 1);
        Assert.Equal(105, s.GetProperty("bartlett").GetProperty("df").GetInt32()); // p(p−1)/2 for p = 15 (Bartlett 1950)
        Assert.Equal("minres", s.GetProperty("extraction").GetString());
        Assert.Equal("oblimin", s.GetProperty("rotation").GetString());
        Assert.Equal(9, s.GetProperty("shortForm").GetProperty("items").GetArrayLength());
        // The random-answering rule's cutoff is reported, and it is the one the flags used: every respondent flagged
        // random-like-answers in respondent-flags.csv has random_answer_llr above it, and nobody else does.
        var random = s.GetProperty("screening").GetProperty("randomAnswering");
        Assert.True(random.GetProperty("computed").GetBoolean());
        Assert.True(random.GetProperty("flags").GetBoolean());
        double cutoff = random.GetProperty("cutoff").GetDouble();
        var header = Lines("respondent-flags.csv")[0].Split(',');
        int llr = Array.IndexOf(header, "random_answer_llr"), reasons = Array.IndexOf(header, "reasons");
        foreach (var row in Lines("respondent-flags.csv").Skip(1).Select(l => l.Split(',')))
            if (double.TryParse(row[llr], System.Globalization.CultureInfo.InvariantCulture, out double t))
                Assert.Equal(t > cutoff, row[reasons].Contains("random-like-answers", StringComparison.Ordinal));
    }

    [Fact]
    public void Planted_three_factor_structure_is_recovered()
    {
        // Known truth: FactorModelSpec.Simple(3 factors × 5 items, loading .7, factor correlation .3).
        Assert.Equal(3, Summary.GetProperty("factors").GetProperty("retained").GetInt32());
        Assert.Equal(3, Summary.GetProperty("factors").GetProperty("byRule").GetProperty("parallel").GetInt32());
    }

    [Fact]
    public void Planted_careless_respondents_are_flagged_or_stand_out()
    {
        // Known truth from the simulator. Straight-liners must all be flagged. Uniform-random responders on only
        // 15 items are not reliably beyond a p = .001 cutoff (their expected D² is only moderately above the
        // attentive median), so for them we require that they stand out: robust p-values far below the
        // attentive respondents'. False flags among attentive respondents stay near the nominal level.
        var rows = Lines("respondent-flags.csv").Skip(1).Select(l => l.Split(',')).ToDictionary(c => c[0]);
        var ids = _run.Truth.Responses.RespondentIds;
        var kinds = _run.Truth.Careless;
        string detail = string.Join(" | ", Enumerable.Range(0, 500).Where(i => kinds[i] != CarelessKind.None)
            .Select(i => $"{kinds[i]} {string.Join(",", rows[ids[i]])}"));
        var straight = Enumerable.Range(0, 500).Where(i => kinds[i] == CarelessKind.StraightLine).Select(i => rows[ids[i]]).ToList();
        Assert.All(straight, r => Assert.True(r[9] == "true", detail));
        double Median(IEnumerable<double> v) { var a = v.Order().ToArray(); return a[a.Length / 2]; }
        double P(string[] r) => double.Parse(r[11], System.Globalization.CultureInfo.InvariantCulture);
        double randomMedian = Median(Enumerable.Range(0, 500).Where(i => kinds[i] == CarelessKind.UniformRandom).Select(i => P(rows[ids[i]])));
        double attentiveMedian = Median(Enumerable.Range(0, 500).Where(i => kinds[i] == CarelessKind.None).Select(i => P(rows[ids[i]])));
        Assert.True(randomMedian < 0.05 && attentiveMedian > 0.2, $"median robust p: random {randomMedian}, attentive {attentiveMedian}");
        int attentiveFlagged = Enumerable.Range(0, 500).Count(i => kinds[i] == CarelessKind.None && rows[ids[i]][9] == "true");
        Assert.True(attentiveFlagged < 0.05 * 488, $"{attentiveFlagged} attentive respondents flagged");
    }

    [Fact]
    public void Short_form_codebook_is_a_valid_codebook_for_the_same_responses()
    {
        var r = TempSurvey.Cli("check", "--responses", _run.Survey.Responses, "--codebook", File("short-form-codebook.csv"));
        Assert.True(r.Code == 0, r.Err);
        Assert.Contains("9 in codebook", r.Out);
    }

    [Fact]
    public void Reliability_has_full_short_and_holdout_rows()
    {
        var forms = Lines("reliability.csv").Skip(1).Select(l => l.Split(',')[1]).Distinct().ToHashSet();
        Assert.Contains("full", forms);
        Assert.Contains("short", forms);
        Assert.Contains(forms, f => f.Contains("holdout"));
    }

    [Fact]
    public void Self_check_runs_by_default_and_reaches_its_table_summary_and_appendix()
    {
        // Default --self-check (SelfCheckOptions.DefaultSurveys) with the fixture's holdout: the contract columns, the
        // summary block, the section with its table and figure in the PDF, and the table in tables.md/tex/docx.
        Assert.Equal("quantity,value,interval_low,interval_high,simulated_surveys", Lines("self-check.csv")[0]);
        var quantities = Lines("self-check.csv").Skip(1).Select(l => l.Split(',')[0]).ToList();
        Assert.Contains("screening.false_flag_rate", quantities);
        Assert.Contains("screening.recall.straight_line", quantities);
        Assert.Contains("dimensions.recovery", quantities);
        Assert.Contains(quantities, q => q.StartsWith("short_form.kept_again.", StringComparison.Ordinal));
        Assert.Contains(quantities, q => q.StartsWith("holdout.omega.", StringComparison.Ordinal));
        var block = Summary.GetProperty("selfCheck");
        Assert.Equal(ItemReduce.Core.SelfCheck.SelfCheckOptions.DefaultSurveys, block.GetProperty("simulatedSurveys").GetInt32());
        Assert.Equal(quantities.Count, block.GetProperty("quantities").GetArrayLength());
        string pdf = Squeeze(PdfText(File("appendix.pdf")));
        Assert.Contains(Squeeze("How stable are these decisions?"), pdf);
        Assert.Contains(Squeeze("Selection stability"), pdf);
        Assert.Contains(Squeeze("not evidence that the model is right"), pdf);
        Assert.Contains(Squeeze("does not show that the model is right"), pdf); // the caution
        string title = ItemReduce.Application.Appendix.AppendixBuilder.SelfCheckTableTitle;
        Assert.Contains(title, System.IO.File.ReadAllText(File("tables.md")));
        Assert.Contains("Self-check: the decisions of this run", System.IO.File.ReadAllText(File("tables.tex")));
        Assert.Contains("self-check.csv", System.IO.File.ReadAllText(File("itemreduce-manifest.txt")));
    }

    [Fact]
    public void Appendix_pdf_has_every_section_and_the_cautions()
    {
        using var pdf = PdfDocument.Open(File("appendix.pdf"));
        string text = string.Join("\n", pdf.GetPages().Select(p => p.Text));
        foreach (string h in new[] { "Data and reproducibility", "Respondent screening", "Factorability", "Number of dimensions",
                     "Factor solution", "Reliability and short form", "Cautions and limitations", "References" })
            Assert.Contains(h, text);
        Assert.Contains("validated in a new", text);
        Assert.Contains("not automatic exclusion", text);
        Assert.Contains("Horn, J. L. (1965)", text);
    }

    private static string PdfText(string path)
    {
        using var pdf = PdfDocument.Open(path);
        return string.Concat(pdf.GetPages().Select(p => p.Text));
    }

    private static string Squeeze(string s) => new(s.Where(c => !char.IsWhiteSpace(c)).ToArray());

    [Fact]
    public void Appendix_numbers_equal_summary_json()
    {
        string text = Squeeze(PdfText(File("appendix.pdf")));
        var s = Summary;
        var resp = s.GetProperty("respondents");
        Assert.Contains(Squeeze($"{resp.GetProperty("flagged").GetInt32()} of {resp.GetProperty("total").GetInt32()} respondents"), text);
        Assert.Contains(Squeeze($"analysed {resp.GetProperty("analysed").GetInt32()} respondents"), text);
        Assert.Contains(ItemReduce.Report.Formatting.NumberFormat.Bounded(s.GetProperty("kmo").GetDouble()), text);
        var b = s.GetProperty("bartlett");
        Assert.Contains(Squeeze($"χ²({b.GetProperty("df").GetInt32()}) = {ItemReduce.Report.Formatting.NumberFormat.Fixed(b.GetProperty("chi2").GetDouble(), 2)}"), text);
        Assert.Contains(Squeeze(s.GetProperty("factors").GetProperty("reason").GetString()!), text);
        foreach (var item in s.GetProperty("shortForm").GetProperty("items").EnumerateArray()) Assert.Contains(item.GetString()!, text);
    }

    [Fact]
    public void Every_figure_has_a_number_and_a_caption()
    {
        using var pdf = PdfDocument.Open(File("appendix.pdf"));
        string text = string.Join("\n", pdf.GetPages().Select(p => p.Text));
        for (int f = 1; f <= 3; f++)
        {
            int at = text.IndexOf($"Figure {f}", StringComparison.Ordinal);
            Assert.True(at >= 0, $"Figure {f} missing");
            Assert.True(text.Length > at + 60 && text.Substring(at + 8, 50).Any(char.IsLetter), $"Figure {f} has no caption");
        }
        Assert.True(pdf.NumberOfPages is >= 4 and <= 40, $"{pdf.NumberOfPages} pages");
    }

    [Fact]
    public void Rendering_twice_with_the_same_seed_gives_the_same_text()
    {
        var s = _run.Survey;
        string again = Path.Combine(s.Folder, "again");
        var r = TempSurvey.Cli("run", "--responses", s.Responses, "--codebook", s.Codebook, "--out", again,
            "--replicates", "200", "--seed", "5", "--holdout", "0.5", "--items-per-factor", "3", "--confirmatory");
        Assert.True(r.Code == 0, r.Err);
        static string WithoutTimes(string t) => System.Text.RegularExpressions.Regex.Replace(t, @"\d{4}-\d{2}-\d{2} ?\d{2}:\d{2}(:\d{2})?", "<time>");
        Assert.Equal(WithoutTimes(PdfText(File("appendix.pdf"))), WithoutTimes(PdfText(Path.Combine(again, "appendix.pdf"))));
        foreach (string f in new[] { "respondent-flags.csv", "eigenvalues.csv", "loadings.csv", "reliability.csv", "item-decisions.csv" })
            Assert.Equal(System.IO.File.ReadAllBytes(File(f)), System.IO.File.ReadAllBytes(Path.Combine(again, f)));
    }

    [Fact]
    public void Markdown_and_latex_tables_are_written()
    {
        string md = System.IO.File.ReadAllText(File("tables.md"));
        Assert.Contains("Table 1", md);
        Assert.Contains("|", md);
        string tex = System.IO.File.ReadAllText(File("tables.tex"));
        Assert.Contains("\\begin{longtable}", tex);
    }

    [Fact]
    public void Stage_commands_write_their_own_outputs()
    {
        var s = _run.Survey;
        string outDir = Path.Combine(s.Folder, "stage-dims");
        var r = TempSurvey.Cli("dimensions", "--responses", s.Responses, "--codebook", s.Codebook, "--out", outDir, "--replicates", "100");
        Assert.True(r.Code == 0, r.Err);
        Assert.True(System.IO.File.Exists(Path.Combine(outDir, "eigenvalues.csv")));
        Assert.False(System.IO.File.Exists(Path.Combine(outDir, "respondent-flags.csv")));
        string screenDir = Path.Combine(s.Folder, "stage-screen");
        r = TempSurvey.Cli("screen", "--responses", s.Responses, "--codebook", s.Codebook, "--out", screenDir);
        Assert.True(r.Code == 0, r.Err);
        Assert.True(System.IO.File.Exists(Path.Combine(screenDir, "respondent-flags.csv")));
        Assert.False(System.IO.File.Exists(Path.Combine(screenDir, "eigenvalues.csv")));
        string shortDir = Path.Combine(s.Folder, "stage-short");
        r = TempSurvey.Cli("shorten", "--responses", s.Responses, "--codebook", s.Codebook, "--out", shortDir, "--factors", "3", "--rotation", "varimax");
        Assert.True(r.Code == 0, r.Err);
        Assert.True(System.IO.File.Exists(Path.Combine(shortDir, "loadings.csv")));
        Assert.False(System.IO.File.Exists(Path.Combine(shortDir, "structure-loadings.csv"))); // orthogonal rotation
    }

    [Fact]
    public void Bad_option_value_is_exit_2_naming_the_option()
    {
        var s = _run.Survey;
        var r = TempSurvey.Cli("run", "--responses", s.Responses, "--codebook", s.Codebook, "--out", Path.Combine(s.Folder, "x"), "--rotation", "sideways");
        Assert.Equal(2, r.Code);
        Assert.Contains("--rotation", r.Err);
        Assert.Contains("oblimin", r.Err);
    }
}

public class ReadmeTests
{
    private static string Root()
    {
        string d = AppContext.BaseDirectory;
        while (!File.Exists(Path.Combine(d, "ItemReduce.sln"))) d = Path.GetDirectoryName(d) ?? throw new DirectoryNotFoundException("repository root");
        return d;
    }

    [Fact]
    public void Readme_lists_every_citation_the_appendix_can_print()
    {
        string readme = File.ReadAllText(Path.Combine(Root(), "README.md"));
        var fields = typeof(ItemReduce.Application.Appendix.MethodReferences).GetFields().Where(f => f.IsLiteral).ToList();
        Assert.NotEmpty(fields);
        foreach (var f in fields) Assert.Contains((string)f.GetRawConstantValue()!, readme);
    }

    [Fact]
    public void Readme_carries_the_cautions_about_flags_and_short_forms()
    {
        // Cautions required where results affect people (common practice in psychometric reporting, no source).
        string readme = File.ReadAllText(Path.Combine(Root(), "README.md"));
        Assert.Contains("Flags are for human review, not automatic deletion", readme);
        Assert.Contains("atypical is not invalid", readme);
        Assert.Contains("report how many respondents were set aside and why", readme);
        Assert.Contains("validated in a new sample", readme);
    }

    [Fact]
    public void Readme_names_the_test_command_that_ci_runs()
    {
        string root = Root();
        Assert.Contains("dotnet test", File.ReadAllText(Path.Combine(root, "README.md")));
        Assert.Contains("dotnet test", File.ReadAllText(Path.Combine(root, ".ci", "run")));
    }
}
