using System.Security.Cryptography;
using ItemReduce.Tests.Support;

namespace ItemReduce.Tests.Cli;

/// <summary>
/// The user's files are never deleted or changed: attempts to point <c>--out</c> (or a plan's <c>out</c>/<c>force</c>)
/// at the inputs, their folder or a parent, the plan's folder, the working directory, a root, the home folder or a
/// symbolic link are refused with exit 2 even with <c>--force</c>; interrupts remove the staging folder; leftovers of
/// killed runs are cleaned up and nothing else is. Every case runs in a sandbox folder and checks that every file in it
/// is byte-identical afterwards and that no staging folder remains.
/// </summary>
public class OutputSafetyTests
{
    /// <summary>A sandbox: study/responses.csv, study/codebook.csv, plans/plan.json, a home folder with a file.</summary>
    private sealed class Sandbox : IDisposable
    {
        public Sandbox()
        {
            Study = Path.Combine(Root.Folder, "study");
            Directory.CreateDirectory(Study);
            File.WriteAllText(Responses, TempSurvey.ValidResponses(40));
            File.Copy(Root.Codebook, Codebook);
            File.Delete(Root.Codebook);
            Plans = Path.Combine(Root.Folder, "plans");
            Directory.CreateDirectory(Plans);
            File.WriteAllText(Plan, "{ \"responses\": \"../study/responses.csv\", \"codebook\": \"../study/codebook.csv\", \"replicates\": 20, \"no-pdf\": true }");
            Home = Path.Combine(Root.Folder, "home");
            Directory.CreateDirectory(Home);
            File.WriteAllText(Path.Combine(Home, "diary.txt"), "private");
        }

        public TempSurvey Root { get; } = new TempSurvey().WithCodebook();
        public string Study { get; }
        public string Plans { get; }
        public string Home { get; }
        public string Responses => Path.Combine(Study, "responses.csv");
        public string Codebook => Path.Combine(Study, "codebook.csv");
        public string Plan => Path.Combine(Plans, "plan.json");

        /// <summary>Path → SHA-256 of every file in the sandbox.</summary>
        public Dictionary<string, string> Snapshot() =>
            Directory.GetFiles(Root.Folder, "*", SearchOption.AllDirectories)
                .ToDictionary(f => f, f => Convert.ToHexString(SHA256.HashData(File.ReadAllBytes(f))));

        public void Dispose() => Root.Dispose();
    }

    private static void AssertRefused((int Code, string Out, string Err) r, Sandbox box, Dictionary<string, string> before, params string[] mention)
    {
        Assert.True(r.Code == 2, $"exit {r.Code}: {r.Err}");
        Assert.Single(r.Err.TrimEnd('\n').Split('\n'));
        Assert.DoesNotContain("   at ", r.Err);
        foreach (string m in mention) Assert.Contains(m, r.Err);
        Assert.Equal(before, box.Snapshot());
        Assert.Empty(Directory.GetDirectories(box.Root.Folder, ".*", SearchOption.AllDirectories));
    }

    public static TheoryData<string, string> OutInsideOrAboveInputs() => new()
    {
        { "study", "is or contains the input file" },              // the inputs' own folder
        { ".", "is or contains the input file" },                  // a parent of the inputs
        { "plans", "is or contains the input file" },              // the plan's folder
        { "study/responses.csv", "is or contains the input file" }, // an input itself
    };

    [Theory]
    [MemberData(nameof(OutInsideOrAboveInputs))]
    public void Force_never_replaces_a_folder_holding_inputs(string outRelative, string message)
    {
        using var box = new Sandbox();
        var before = box.Snapshot();
        string output = Path.GetFullPath(Path.Combine(box.Root.Folder, outRelative));
        var r = TempSurvey.Cli("run", "--plan", box.Plan, "--out", output, "--force");
        AssertRefused(r, box, before, message, "Fix:");
    }

    [Fact]
    public void A_plans_out_and_force_are_held_to_the_same_rules()
    {
        using var box = new Sandbox();
        File.WriteAllText(box.Plan, "{ \"responses\": \"../study/responses.csv\", \"codebook\": \"../study/codebook.csv\", \"out\": \"../study\", \"force\": true, \"replicates\": 20 }");
        var before = box.Snapshot();
        AssertRefused(TempSurvey.Cli("run", "--plan", box.Plan), box, before, "is or contains the input file");

        File.WriteAllText(box.Plan, "{ \"responses\": \"../study/responses.csv\", \"codebook\": \"../study/codebook.csv\", \"out\": \".\", \"force\": true }");
        before = box.Snapshot();
        AssertRefused(TempSurvey.Cli("run", "--plan", box.Plan), box, before, "is or contains the input file", "plan.json");

        File.WriteAllText(box.Plan, "{ \"responses\": \"../study/responses.csv\", \"codebook\": \"../study/codebook.csv\", \"out\": \"\", \"force\": true }");
        before = box.Snapshot();
        AssertRefused(TempSurvey.Cli("run", "--plan", box.Plan), box, before, "plan.json", "\"out\"", "the path is empty");
    }

    [Fact]
    public void An_empty_out_is_an_option_error()
    {
        using var box = new Sandbox();
        var before = box.Snapshot();
        AssertRefused(TempSurvey.Cli("run", "--plan", box.Plan, "--out", ""), box, before, "--out", "\"\"", "not allowed");
        AssertRefused(TempSurvey.Cli("run", "--plan", box.Plan, "--out", "", "--force"), box, before, "--out", "\"\"", "not allowed");
    }

    [Fact]
    public void A_filesystem_root_is_refused()
    {
        using var box = new Sandbox();
        var before = box.Snapshot();
        AssertRefused(TempSurvey.Cli("run", "--plan", box.Plan, "--out", Path.GetPathRoot(box.Root.Folder)!, "--force"), box, before,
            "filesystem root or the home folder");
    }

    [Fact]
    public void A_symbolic_link_as_out_is_refused()
    {
        using var box = new Sandbox();
        string link = Path.Combine(box.Root.Folder, "results-link");
        Directory.CreateSymbolicLink(link, box.Home);
        var before = box.Snapshot();
        AssertRefused(TempSurvey.Cli("run", "--plan", box.Plan, "--out", link, "--force"), box, before, "symbolic link");
        Assert.True(File.Exists(Path.Combine(box.Home, "diary.txt")));
    }

    [Fact]
    public void The_working_directory_and_the_home_folder_are_refused_in_a_real_process()
    {
        // A separate process, so that its working directory and HOME can be set without touching the test host's.
        using var box = new Sandbox();
        var before = box.Snapshot();
        var env = new Dictionary<string, string> { ["HOME"] = box.Home };
        string work = Path.Combine(box.Root.Folder, "work");
        Directory.CreateDirectory(work);
        var cwd = CliProcess.Run(work, env, "run", "--plan", box.Plan, "--out", ".", "--force");
        AssertRefused(cwd, box, before, "is or contains the working directory");
        var home = CliProcess.Run(box.Root.Folder, env, "run", "--plan", box.Plan, "--out", box.Home, "--force");
        AssertRefused(home, box, before, "filesystem root or the home folder");
        var parentOfCwd = CliProcess.Run(box.Study, env, "run", "--plan", box.Plan, "--out", "..", "--force");
        AssertRefused(parentOfCwd, box, before, "is or contains");
    }

    [Theory]
    [InlineData("INT", 130, "SIGINT")]
    [InlineData("TERM", 143, "SIGTERM")]
    public async Task An_interrupt_removes_the_staging_folder_and_exits_with_the_usual_code(string signal, int code, string name)
    {
        if (!OperatingSystem.IsLinux() && !OperatingSystem.IsMacOS()) return;
        // A survey (48 items) and a reference (100,000 replicates) large enough that the analysis runs for many seconds
        // after the staging folder appears.
        var spec = ItemReduce.Simulation.FactorModelSpec.Simple(6, 8, 0.6, 0.3);
        using var t = SimulatedFiles.Write(ItemReduce.Simulation.FactorModelSimulator.Generate(spec,
            new ItemReduce.Simulation.FactorModelSimulator.Settings(1000, 5, MissingRate: 0.01)));
        string responsesHash = Convert.ToHexString(SHA256.HashData(File.ReadAllBytes(t.Responses)));
        using var p = CliProcess.Start(t.Folder, null, "run", "--responses", t.Responses, "--codebook", t.Codebook, "--out", t.Out,
            "--replicates", "100000", "--no-pdf");
        var stderr = p.StandardError.ReadToEndAsync();
        var stdout = p.StandardOutput.ReadToEndAsync();
        string? staging = null;
        while (staging is null && !p.HasExited)
        {
            staging = Directory.GetDirectories(t.Folder, ".results.partial-*").FirstOrDefault();
            if (staging is null) Thread.Sleep(5);
        }
        if (p.HasExited) Assert.Fail("the run ended before it could be interrupted: " + await stderr);
        CliProcess.Signal(p.Id, signal);
        await p.WaitForExitAsync();
        string err = await stderr;
        _ = await stdout;
        Assert.True(code == p.ExitCode, $"exit {p.ExitCode}: {err}");
        Assert.Single(err.TrimEnd('\n').Split('\n'));
        Assert.Contains($"stopped by {name}", err);
        Assert.False(Directory.Exists(staging), "the staging folder remains");
        Assert.False(Directory.Exists(t.Out), "an output folder appeared");
        Assert.Empty(Directory.GetDirectories(t.Folder));
        Assert.Equal(responsesHash, Convert.ToHexString(SHA256.HashData(File.ReadAllBytes(t.Responses))));
    }

    [Fact]
    public void Leftovers_of_killed_runs_are_removed_and_nothing_else()
    {
        using var t = new TempSurvey().WithCodebook().WithResponses(TempSurvey.ValidResponses(40));
        const int gonePid = int.MaxValue - 7; // no such process
        string hex = new('a', 32);
        // A staging folder of a killed run (pattern, marker, dead process): removed.
        string stale = Path.Combine(t.Folder, $".results.partial-{gonePid}-{hex}");
        Directory.CreateDirectory(stale);
        File.WriteAllText(Path.Combine(stale, ".itemreduce-staging"), "");
        File.WriteAllText(Path.Combine(stale, "summary.json"), "{}");
        // Same pattern but no marker: not provably ours, kept.
        string unmarked = Path.Combine(t.Folder, $".results.partial-{gonePid}-{new string('b', 32)}");
        Directory.CreateDirectory(unmarked);
        File.WriteAllText(Path.Combine(unmarked, "mine.txt"), "user data");
        // Marker but a live process (this test host): kept.
        string live = Path.Combine(t.Folder, $".other.partial-{Environment.ProcessId}-{new string('c', 32)}");
        Directory.CreateDirectory(live);
        File.WriteAllText(Path.Combine(live, ".itemreduce-staging"), "");
        // Not our pattern at all: kept.
        string lookalike = Path.Combine(t.Folder, ".results.partial-notes");
        Directory.CreateDirectory(lookalike);
        File.WriteAllText(Path.Combine(lookalike, ".itemreduce-staging"), "");

        var r = t.Run("--replicates", "20", "--no-pdf");

        Assert.True(r.Code == 0, r.Err);
        Assert.False(Directory.Exists(stale));
        Assert.Equal("user data", File.ReadAllText(Path.Combine(unmarked, "mine.txt")));
        Assert.True(Directory.Exists(live));
        Assert.True(Directory.Exists(lookalike));
    }
}
