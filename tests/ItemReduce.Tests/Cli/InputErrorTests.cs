using System.Security.Cryptography;
using ItemReduce.Tests.Support;

namespace ItemReduce.Tests.Cli;

/// <summary>
/// Every malformed input gives exit code 2, one line naming file, line and column/item, no stack trace,
/// no output folder, and leaves the inputs untouched.
/// </summary>
public class InputErrorTests
{
    private static void AssertInputError(TempSurvey s, (int Code, string Out, string Err) r, params string[] mustMention)
    {
        Assert.Equal(2, r.Code);
        string line = r.Err.TrimEnd('\n');
        Assert.DoesNotContain('\n', line); // exactly one line
        Assert.DoesNotContain("   at ", r.Err); // no stack trace
        Assert.Contains("Fix:", line);
        foreach (string m in mustMention) Assert.Contains(m, line);
        Assert.False(Directory.Exists(s.Out), "no output folder on failure");
        Assert.Empty(Directory.GetDirectories(s.Folder)); // no partial temp folders either
    }

    private static string Hash(string path) => Convert.ToHexString(SHA256.HashData(File.ReadAllBytes(path)));

    [Fact]
    public void Bad_cell_on_line_101_names_line_101_and_the_column()
    {
        using var s = new TempSurvey().WithCodebook();
        var lines = TempSurvey.ValidResponses(150).Split('\n');
        // line 101 (1-based) is data row 100; corrupt its q3 cell
        var cells = lines[100].Split(',');
        cells[3] = "abc";
        lines[100] = string.Join(',', cells);
        s.WithResponses(string.Join('\n', lines));
        string before = Hash(s.Responses);
        AssertInputError(s, s.Run(), "responses.csv", "line 101", "\"q3\"", "\"abc\"");
        Assert.Equal(before, Hash(s.Responses));
    }

    [Theory]
    [InlineData("NaN")]
    [InlineData("Infinity")]
    [InlineData("-Infinity")]
    [InlineData("3,5")] // quoted decimal comma
    [InlineData("four")]
    public void Non_numeric_cells_are_rejected(string bad)
    {
        using var s = new TempSurvey().WithCodebook();
        var lines = TempSurvey.ValidResponses(30).Split('\n');
        var cells = lines[5].Split(',');
        cells[2] = bad.Contains(',') ? $"\"{bad}\"" : bad;
        lines[5] = string.Join(',', cells);
        s.WithResponses(string.Join('\n', lines));
        AssertInputError(s, s.Run(), "line 6", "\"q2\"", "not a finite number");
    }

    [Theory]
    [InlineData("7")]
    [InlineData("0")]
    [InlineData("1e308")]
    [InlineData("-99")]
    public void Values_outside_the_codebook_range_are_rejected(string bad)
    {
        using var s = new TempSurvey().WithCodebook();
        var lines = TempSurvey.ValidResponses(30).Split('\n');
        var cells = lines[10].Split(',');
        cells[4] = bad;
        lines[10] = string.Join(',', cells);
        s.WithResponses(string.Join('\n', lines));
        AssertInputError(s, s.Run(), "line 11", "\"q4\"", "outside the codebook range 1–5");
    }

    [Fact]
    public void Missing_codes_are_honoured_before_range_checks()
    {
        using var s = new TempSurvey().WithCodebook();
        var lines = TempSurvey.ValidResponses(30).Split('\n');
        var cells = lines[10].Split(',');
        cells[4] = "-99";
        lines[10] = string.Join(',', cells);
        s.WithResponses(string.Join('\n', lines));
        var r = s.Run("--missing=-99,NA");
        Assert.True(r.Code == 0, r.Err);
    }

    [Fact]
    public void Empty_file() { using var s = new TempSurvey().WithCodebook().WithResponses(""); AssertInputError(s, s.Run(), "responses.csv", "line 1", "empty"); }

    [Fact]
    public void Header_only() { using var s = new TempSurvey().WithCodebook().WithResponses("respondent,q1,q2,q3,q4\n"); AssertInputError(s, s.Run(), "line 2", "no data rows"); }

    [Fact]
    public void Duplicate_column_names()
    {
        using var s = new TempSurvey().WithCodebook().WithResponses("respondent,q1,q2,q3,q4,q2\nA,1,2,3,4,5\n");
        AssertInputError(s, s.Run(), "line 1", "\"q2\"", "appears twice");
    }

    [Fact]
    public void Ragged_rows()
    {
        var text = TempSurvey.ValidResponses(30).Split('\n');
        text[7] += ",5";
        using var s = new TempSurvey().WithCodebook().WithResponses(string.Join('\n', text));
        AssertInputError(s, s.Run(), "line 8", "6 fields", "header has 5");
    }

    [Fact]
    public void Line_numbers_count_lines_inside_quoted_fields()
    {
        // A quoted id with an embedded newline makes the record span lines 2-3; the bad cell is then on line 4.
        string text = "respondent,q1,q2,q3,q4\n\"multi\nline\",1,2,3,4\nB,1,2,x,4\n";
        using var s = new TempSurvey().WithCodebook().WithResponses(text);
        AssertInputError(s, s.Run(), "line 4", "\"q3\"");
    }

    [Fact]
    public void Codebook_item_missing_from_responses()
    {
        using var s = new TempSurvey().WithCodebook(5).WithResponses(TempSurvey.ValidResponses(30));
        AssertInputError(s, s.Run(), "codebook.csv", "line 6", "\"q5\"", "no column in responses.csv");
    }

    [Theory]
    [InlineData("q2,S1,maybe,1,5,x", "\"reverse\"", "\"maybe\"")]
    [InlineData("q2,S1,false,5,1,x", "\"min\"", "must be below max")]
    [InlineData("q2,S1,false,1,five,x", "\"max\"", "\"five\"")]
    [InlineData("q2,S1,false,low,5,x", "\"min\"", "\"low\"")]
    public void Malformed_codebook_values(string badLine, string column, string detail)
    {
        string cb = "item,subscale,reverse,min,max,text\nq1,S1,false,1,5,a\n" + badLine + "\nq3,S2,false,1,5,c\nq4,S2,false,1,5,d\n";
        using var s = new TempSurvey().WithCodebook(text: cb).WithResponses(TempSurvey.ValidResponses(30));
        AssertInputError(s, s.Run(), "codebook.csv", "line 3", column, detail);
    }

    [Fact]
    public void Duplicate_respondent_ids()
    {
        var text = TempSurvey.ValidResponses(30).Split('\n');
        text[20] = "id3" + text[20][text[20].IndexOf(',')..];
        using var s = new TempSurvey().WithCodebook().WithResponses(string.Join('\n', text));
        AssertInputError(s, s.Run(), "line 21", "\"id3\"", "already appeared on line 4");
    }

    /// <summary>Ids are checked for duplicates a batch of rows at a time beside the cell checks; the error named is still
    /// the first in the file, and on one row the id comes before the cells (common practice, no source: report the
    /// first problem in reading order).</summary>
    [Theory]
    [InlineData(9001, 9500, "line 9001", "already appeared on line 2")]
    [InlineData(9500, 9001, "line 9001", "not a finite number")]
    [InlineData(9001, 9001, "line 9001", "already appeared on line 2")]
    [InlineData(9001, 0, "line 9001", "already appeared on line 2")]
    public void The_first_error_in_the_file_is_reported_when_a_duplicate_id_and_a_bad_cell_both_occur(int duplicateLine, int badLine,
        string line, string problem)
    {
        var text = TempSurvey.ValidResponses(10_000).Split('\n');
        text[duplicateLine - 1] = "id1" + text[duplicateLine - 1][text[duplicateLine - 1].IndexOf(',')..];
        if (badLine > 0) text[badLine - 1] += "x";
        using var s = new TempSurvey().WithCodebook().WithResponses(string.Join('\n', text));
        var r = TempSurvey.Cli("check", "--responses", s.Responses, "--codebook", s.Codebook);
        Assert.Equal(2, r.Code);
        Assert.Contains(line + ",", r.Err);
        Assert.Contains(problem, r.Err);
    }

    [Fact]
    public void Too_few_respondents_says_how_many_are_needed()
    {
        using var s = new TempSurvey().WithCodebook().WithResponses(TempSurvey.ValidResponses(6));
        AssertInputError(s, s.Run(), "responses.csv", "6 respondents", "at least 10");
    }

    [Fact]
    public void Missing_file_is_a_clear_input_error()
    {
        using var s = new TempSurvey().WithCodebook();
        AssertInputError(s, s.Run(), "not found", "--responses");
    }

    [Fact]
    public void Force_replaces_only_an_empty_folder_or_a_previous_run_and_never_the_users_files()
    {
        using var s = new TempSurvey().WithCodebook().WithResponses(TempSurvey.ValidResponses(40));
        Directory.CreateDirectory(s.Out);
        File.WriteAllText(Path.Combine(s.Out, "keep.txt"), "mine");
        var r = s.Run("--replicates", "20", "--no-pdf");
        Assert.Equal(2, r.Code);
        Assert.Contains("--force", r.Err);
        var forced = s.Run("--replicates", "20", "--no-pdf", "--force");
        Assert.Equal(2, forced.Code);
        Assert.Contains("\"keep.txt\" and no itemreduce-manifest.txt, so it was not written by itemreduce", forced.Err);
        Assert.Equal("mine", File.ReadAllText(Path.Combine(s.Out, "keep.txt")));

        // An empty folder is filled without --force; a folder of a previous run is replaced with it.
        File.Delete(Path.Combine(s.Out, "keep.txt"));
        var intoEmpty = s.Run("--replicates", "20", "--no-pdf");
        Assert.True(intoEmpty.Code == 0, intoEmpty.Err);
        Assert.True(File.Exists(Path.Combine(s.Out, "itemreduce-manifest.txt")));
        var again = s.Run("--replicates", "20", "--no-pdf", "--force");
        Assert.True(again.Code == 0, again.Err);
        Assert.Equal([s.Out], Directory.GetDirectories(s.Folder)); // no staging or replaced folders left

        // A results file edited after the run makes the folder the user's: --force refuses it.
        File.AppendAllText(Path.Combine(s.Out, "summary.json"), " ");
        var edited = s.Run("--replicates", "20", "--no-pdf", "--force");
        Assert.Equal(2, edited.Code);
        Assert.Contains("\"summary.json\" was changed after itemreduce wrote it", edited.Err);
        Assert.EndsWith(" ", File.ReadAllText(Path.Combine(s.Out, "summary.json")));
    }

    [Fact]
    public void Unwritable_output_location_is_a_clear_one_line_error()
    {
        using var s = new TempSurvey().WithCodebook().WithResponses(TempSurvey.ValidResponses(40));
        string file = Path.Combine(s.Folder, "a-file");
        File.WriteAllText(file, "x");
        var under = TempSurvey.Cli("run", "--responses", s.Responses, "--codebook", s.Codebook, "--out", Path.Combine(file, "results"), "--replicates", "20");
        Assert.Equal(2, under.Code);
        Assert.Contains("could not be written", under.Err);
        Assert.Contains("No partial results were kept", under.Err);
        var onto = TempSurvey.Cli("run", "--responses", s.Responses, "--codebook", s.Codebook, "--out", file, "--replicates", "20");
        Assert.Equal(2, onto.Code);
        Assert.Contains("is a file, not a folder", onto.Err);
        Assert.Equal("x", File.ReadAllText(file));
    }

    [Fact]
    public void Unknown_option_is_a_usage_error_with_exit_2()
    {
        var r = TempSurvey.Cli("run", "--replicatez", "5");
        Assert.Equal(2, r.Code);
        Assert.Contains("--help", r.Err);
    }
}
