using System.Diagnostics;
using System.Security.Cryptography;
using System.Text;
using ItemReduce.Tests.Support;

namespace ItemReduce.Tests.Cli;

/// <summary>
/// Inputs that could make a reader block or grow without bound are refused quickly with exit 2 and one located line:
/// devices, FIFOs and folders given as files, an oversized plan, a 50 MB field, an over-long line, 100,000 columns.
/// The large files are generated here (not committed).
/// </summary>
public class BoundedInputTests
{
    /// <summary>Path → SHA-256 of every file in the survey's folder.</summary>
    private static Dictionary<string, string> Snapshot(TempSurvey t) =>
        Directory.GetFiles(t.Folder, "*", SearchOption.AllDirectories)
            .ToDictionary(f => f, Hash);

    private static void AssertInputError(TempSurvey t, (int Code, string Out, string Err) r, params string[] mention)
    {
        AssertInputError(t, null, r, mention);
    }

    private static void AssertInputError(TempSurvey t, Dictionary<string, string>? before, (int Code, string Out, string Err) r, params string[] mention)
    {
        if (before is not null) Assert.Equal(before, Snapshot(t)); // inputs byte-identical afterwards
        Assert.True(r.Code == 2, $"exit {r.Code}: {r.Err}");
        Assert.Single(r.Err.TrimEnd('\n').Split('\n'));
        Assert.DoesNotContain("   at ", r.Err);
        foreach (string m in mention) Assert.Contains(m, r.Err);
        Assert.False(Directory.Exists(t.Out));
        Assert.Empty(Directory.GetDirectories(t.Folder));
    }

    private static string Hash(string path) => Convert.ToHexString(SHA256.HashData(File.ReadAllBytes(path)));

    [Fact]
    public void Dev_zero_as_responses_codebook_or_plan_is_refused()
    {
        if (!File.Exists("/dev/zero")) return;
        using var t = new TempSurvey().WithCodebook().WithResponses(TempSurvey.ValidResponses(30));
        var before = Snapshot(t);
        AssertInputError(t, before, TempSurvey.Cli("run", "--responses", "/dev/zero", "--codebook", t.Codebook, "--out", t.Out), "zero", "not a regular file");
        AssertInputError(t, before, TempSurvey.Cli("run", "--responses", t.Responses, "--codebook", "/dev/zero", "--out", t.Out), "zero", "not a regular file");
        AssertInputError(t, before, TempSurvey.Cli("run", "--plan", "/dev/zero", "--out", t.Out), "zero", "not a regular file");
    }

    [Fact]
    public async Task A_fifo_as_responses_is_refused_without_blocking()
    {
        if (!OperatingSystem.IsLinux() && !OperatingSystem.IsMacOS()) return;
        using var t = new TempSurvey().WithCodebook();
        string fifo = Path.Combine(t.Folder, "responses.csv");
        using (var mk = Process.Start("mkfifo", [fifo])) mk.WaitForExit();
        // Opening a FIFO for reading blocks until a writer appears; the run must refuse it before opening. The task only
        // turns a hang into a failure (it is not a speed limit).
        var run = Task.Run(() => TempSurvey.Cli("run", "--responses", fifo, "--codebook", t.Codebook, "--out", t.Out));
        var r = await run.WaitAsync(TimeSpan.FromMinutes(2));
        Assert.Equal(2, r.Code);
        Assert.Contains("not a regular file", r.Err);
    }

    [Fact]
    public void A_folder_as_responses_is_refused()
    {
        using var t = new TempSurvey().WithCodebook();
        string folder = Path.Combine(t.Folder, "responses.csv");
        Directory.CreateDirectory(folder);
        var r = TempSurvey.Cli("run", "--responses", folder, "--codebook", t.Codebook, "--out", t.Out);
        Assert.Equal(2, r.Code);
        Assert.Contains("is a folder, not a file", r.Err);
        Assert.False(Directory.Exists(t.Out));
    }

    [Fact]
    public void A_plan_over_1_MiB_is_refused()
    {
        using var t = new TempSurvey().WithCodebook().WithResponses(TempSurvey.ValidResponses(30));
        string plan = Path.Combine(t.Folder, "plan.json");
        File.WriteAllText(plan, "{ \"seed\": 1 }" + new string(' ', (1 << 20) + 10));
        string before = Hash(plan);
        AssertInputError(t, TempSurvey.Cli("run", "--plan", plan, "--responses", t.Responses, "--codebook", t.Codebook, "--out", t.Out),
            "plan.json", "larger than 1024 KiB");
        Assert.Equal(before, Hash(plan));
    }

    [Fact]
    public void A_50_MB_field_stops_at_its_line()
    {
        using var t = new TempSurvey().WithCodebook();
        var lines = TempSurvey.ValidResponses(30).Split('\n');
        lines[3] = "x" + new string('7', 50_000_000) + lines[3][lines[3].IndexOf(',')..];
        t.WithResponses(string.Join('\n', lines));
        var before = Snapshot(t);
        AssertInputError(t, before, t.Run(), "responses.csv", "line 4", "longer than 1,048,576 characters");
    }

    [Fact]
    public void A_runaway_quoted_field_over_many_lines_is_refused()
    {
        using var t = new TempSurvey().WithCodebook();
        var sb = new StringBuilder(TempSurvey.ValidResponses(10)).Append("\"open quote never closed\n");
        for (int i = 0; i < 200_000; i++) sb.Append("short line ").Append(i).Append('\n');
        t.WithResponses(sb.ToString());
        var before = Snapshot(t);
        AssertInputError(t, before, t.Run(), "responses.csv", "line 12", "field is longer than");
    }

    [Fact]
    public void One_hundred_thousand_columns_are_refused()
    {
        using var t = new TempSurvey().WithCodebook();
        var sb = new StringBuilder("respondent,q1,q2,q3,q4");
        for (int c = 0; c < 100_000; c++) sb.Append(",c").Append(c);
        sb.Append('\n');
        t.WithResponses(sb.ToString() + "id1,1,2,3,4" + string.Concat(Enumerable.Repeat(",0", 100_000)) + "\n");
        var before = Snapshot(t);
        AssertInputError(t, before, t.Run(), "responses.csv", "line 1", "100,005 fields", "at most 10,000");
    }
}
