using System.Text;
using System.Text.RegularExpressions;

namespace ItemReduce.IO;

/// <summary>
/// Collects output files in a temporary folder next to the destination and moves them into place only
/// when <see cref="Commit"/> is called, so a failed or interrupted run never leaves partial outputs.
/// <para>The user's files are never touched. A results folder carries a manifest (<see cref="ResultsManifest"/>)
/// naming every file the run wrote with its size and SHA-256. An existing destination is used only when it is
/// empty, or — with <c>force</c> — when its contents are exactly what its manifest lists; replacing it removes
/// exactly those files and nothing else. Whatever <c>force</c> says, the destination may not be a filesystem
/// root, the home folder, a symbolic link, or a folder that is or contains an input file or the working
/// directory (<see cref="CheckDestination"/>).</para>
/// <para>Staging folders are named <c>.NAME.partial-PID-GUID</c> and hold a marker file; a folder replaced during
/// a commit is briefly renamed <c>.NAME.replaced-PID-GUID</c>. A later run in the same parent folder removes such
/// folders whose process is gone (after a SIGKILL or power loss) — only folders of that pattern that still hold
/// the marker, or exactly their manifest's files.</para>
/// </summary>
public sealed class OutputStaging : IDisposable
{
    /// <summary>Name of the marker file inside a staging folder.</summary>
    internal const string StagingMarker = ".itemreduce-staging";

    private static readonly UTF8Encoding Utf8NoBom = new(false);
    private static readonly Regex LeftoverPattern = new(@"^\..+\.(?<kind>partial|replaced)-(?<pid>[0-9]{1,10})-[0-9a-f]{32}$",
        RegexOptions.CultureInvariant);

    /// <summary>Guards commits against an interrupt that removes the staging folders at the same moment.</summary>
    private static readonly object Gate = new();
    private static readonly HashSet<OutputStaging> Active = [];
    private static bool _abandoned;

    private readonly string _destination;
    private readonly string _shownDestination;
    private readonly bool _force;
    private bool _committed;

    private OutputStaging(string destination, string shown, string temp, bool force)
    {
        _destination = destination;
        _shownDestination = shown;
        TempFolder = temp;
        _force = force;
    }

    /// <summary>The staging folder (deleted on dispose unless committed).</summary>
    public string TempFolder { get; }

    /// <summary>
    /// Checks that <paramref name="destination"/> can receive results without touching anything the tool did not
    /// write; call before any analysis so a user error surfaces early. <paramref name="protectedPaths"/> are the
    /// input files (responses, codebook, plan); the working directory is always protected.
    /// </summary>
    public static void CheckDestination(string destination, bool force, IEnumerable<string?> protectedPaths)
    {
        if (string.IsNullOrWhiteSpace(destination))
            throw new SurveyInputException("--out is empty. Fix: give the results folder, e.g. --out results.");
        string shown = InputErrors.ShowPath(destination);
        string full = Path.TrimEndingDirectorySeparator(Path.GetFullPath(destination));
        if (IsLink(full))
            throw new SurveyInputException($"--out {shown} is a symbolic link. Fix: give the folder it points to, or another folder.");
        string real = SafePaths.Canonical(full);
        if (SafePaths.IsRootOrHome(real))
            throw new SurveyInputException($"--out {shown} is a filesystem root or the home folder; ItemReduce never writes results there. " +
                "Fix: give a new folder, e.g. --out results.");
        foreach (string? p in protectedPaths)
        {
            if (string.IsNullOrEmpty(p)) continue;
            string input = SafePaths.Canonical(Path.GetFullPath(p));
            if (SafePaths.IsSameOrInside(input, real))
                throw new SurveyInputException($"--out {shown} is or contains the input file {InputErrors.ShowPath(p)}; ItemReduce never replaces a folder " +
                    "holding its inputs. Fix: give a new folder for the results, e.g. --out results.");
        }
        string cwd = SafePaths.Canonical(Directory.GetCurrentDirectory());
        if (SafePaths.IsSameOrInside(cwd, real))
            throw new SurveyInputException($"--out {shown} is or contains the working directory. Fix: give a new folder below it, e.g. --out results.");
        if (File.Exists(full))
            throw new SurveyInputException($"{destination}: the output path is a file, not a folder. Fix: choose a folder with --out.");
        if (!Directory.Exists(full) || IsEmpty(full)) return;
        if (!force)
            throw new SurveyInputException($"{destination}: the output folder already exists. Fix: add --force to replace it (only a folder " +
                "written by itemreduce is replaced), or choose another folder with --out.");
        string? problem = ResultsManifest.Verify(full);
        if (problem is not null)
            throw new SurveyInputException($"{destination}: --force replaces only an empty folder or one written by a previous itemreduce run, " +
                $"and {problem}. Fix: choose another folder with --out, or move your own files out of it.");
    }

    /// <summary>Creates the staging folder next to <paramref name="destination"/> after checking the destination,
    /// and removes leftovers of earlier runs in that parent folder whose process is gone.</summary>
    public static OutputStaging Begin(string destination, bool force, IEnumerable<string?>? protectedPaths = null)
    {
        CheckDestination(destination, force, protectedPaths ?? []);
        string full = Path.TrimEndingDirectorySeparator(Path.GetFullPath(destination));
        string parent = Path.GetDirectoryName(full) ?? ".";
        try
        {
            Directory.CreateDirectory(parent);
            RemoveLeftovers(parent);
            string temp = Path.Combine(parent, $".{Path.GetFileName(full)}.partial-{Environment.ProcessId}-{Guid.NewGuid():N}");
            var staging = new OutputStaging(full, destination, temp, force);
            // Created and registered under the lock, so an interrupt either comes first (nothing created) or finds it.
            lock (Gate)
            {
                if (_abandoned) throw new OperationCanceledException();
                Active.Add(staging);
                Directory.CreateDirectory(temp);
                File.WriteAllText(Path.Combine(temp, StagingMarker), "itemreduce staging folder; removed when the run ends\n", Utf8NoBom);
            }
            return staging;
        }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException)
        {
            throw WriteFailure(destination, e);
        }
    }

    /// <summary>Writes a UTF-8 text file (no BOM) into the staging folder.</summary>
    public void WriteText(string fileName, string content) => Guard(() => File.WriteAllText(Path.Combine(TempFolder, fileName), content, Utf8NoBom));

    /// <summary>Writes a UTF-8 text file (no BOM) through a text-writer callback, for tables too large for one string.</summary>
    public void WriteText(string fileName, Action<TextWriter> write) => WriteStream(fileName, stream =>
    {
        using var writer = new StreamWriter(stream, Utf8NoBom, 1 << 16, leaveOpen: true);
        write(writer);
    });

    /// <summary>Writes a file through a stream callback.</summary>
    public void WriteStream(string fileName, Action<Stream> write) => Guard(() =>
    {
        using var fs = new FileStream(Path.Combine(TempFolder, fileName), FileMode.CreateNew, FileAccess.Write);
        write(fs);
    });

    /// <summary>Writes the manifest and moves the staged files into the destination, replacing a previous results
    /// folder only as <see cref="CheckDestination"/> allows (checked again here: the folder may have changed).</summary>
    public void Commit()
    {
        lock (Gate)
        {
            if (_abandoned) throw new OperationCanceledException();
            Guard(() =>
            {
                File.Delete(Path.Combine(TempFolder, StagingMarker));
                ResultsManifest.Write(TempFolder);
                string? replaced = null;
                if (Directory.Exists(_destination))
                {
                    if (IsEmpty(_destination)) Directory.Delete(_destination, recursive: false);
                    else
                    {
                        if (!_force)
                            throw new SurveyInputException($"{_shownDestination}: the output folder appeared during the run. Fix: add --force or choose another --out.");
                        string? problem = ResultsManifest.Verify(_destination);
                        if (problem is not null)
                            throw new SurveyInputException($"{_shownDestination}: the output folder changed during the run and {problem}. " +
                                "Fix: choose another folder with --out.");
                        replaced = Path.Combine(Path.GetDirectoryName(_destination) ?? ".",
                            $".{Path.GetFileName(_destination)}.replaced-{Environment.ProcessId}-{Guid.NewGuid():N}");
                        Directory.Move(_destination, replaced);
                    }
                }
                Directory.Move(TempFolder, _destination);
                _committed = true;
                if (replaced is not null) ResultsManifest.RemoveListedFiles(replaced);
            });
            Active.Remove(this);
        }
    }

    /// <summary>
    /// Removes every staging folder of this process (on SIGINT/SIGTERM), stops later commits, then calls
    /// <paramref name="then"/> (which may end the process) while still holding the commit lock, so no commit can run in
    /// between. Its argument is true when unfinished results were removed, false when nothing was staged or the results
    /// had already been committed.
    /// </summary>
    public static void AbandonAll(Action<bool> then)
    {
        ArgumentNullException.ThrowIfNull(then);
        lock (Gate)
        {
            _abandoned = true;
            bool removed = false;
            foreach (var s in Active)
            {
                if (s._committed) continue;
                DeleteStaging(s.TempFolder);
                removed = true;
            }
            Active.Clear();
            then(removed);
        }
    }

    private void Guard(Action action)
    {
        try { action(); }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException)
        {
            throw WriteFailure(_shownDestination, e);
        }
    }

    private static SurveyInputException WriteFailure(string destination, Exception e) =>
        new($"{destination}: results could not be written ({e.Message.ReplaceLineEndings(" ")}). " +
            "Fix: check free disk space and write permission, or choose another folder with --out. No partial results were kept.");

    private static bool IsEmpty(string folder) => !Directory.EnumerateFileSystemEntries(folder).Any();

    private static bool IsLink(string path) =>
        (Directory.Exists(path) || File.Exists(path)) && new FileInfo(path).LinkTarget is not null;

    /// <summary>Removes staging folders and replaced results folders left in <paramref name="parent"/> by runs whose
    /// process is gone; only folders of the tool's naming pattern that hold its marker or exactly their manifest.</summary>
    internal static void RemoveLeftovers(string parent)
    {
        IEnumerable<string> candidates;
        try { candidates = Directory.EnumerateDirectories(parent, ".*").ToList(); }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException) { return; }
        foreach (string dir in candidates)
        {
            var m = LeftoverPattern.Match(Path.GetFileName(dir));
            if (!m.Success || IsLink(dir)) continue;
            if (!int.TryParse(m.Groups["pid"].Value, out int pid) || ProcessIsAlive(pid)) continue;
            try
            {
                if (File.Exists(Path.Combine(dir, StagingMarker))) DeleteStaging(dir);
                else if (m.Groups["kind"].Value == "replaced" && ResultsManifest.Verify(dir) is null) ResultsManifest.RemoveListedFiles(dir);
            }
            catch (Exception e) when (e is IOException or UnauthorizedAccessException) { }
        }
    }

    private static bool ProcessIsAlive(int pid)
    {
        if (pid == Environment.ProcessId) return true;
        try
        {
            using var p = System.Diagnostics.Process.GetProcessById(pid);
            return !p.HasExited;
        }
        catch (ArgumentException) { return false; }
        catch (InvalidOperationException) { return false; }
    }

    /// <summary>Deletes a staging folder; a file being written concurrently can make one attempt fail, so it retries.</summary>
    private static void DeleteStaging(string folder)
    {
        for (int attempt = 0; attempt < 20; attempt++)
        {
            try
            {
                if (Directory.Exists(folder)) Directory.Delete(folder, recursive: true);
                return;
            }
            catch (IOException) { Thread.Sleep(10); }
            catch (UnauthorizedAccessException) { return; }
        }
    }

    public void Dispose()
    {
        lock (Gate)
        {
            Active.Remove(this);
            if (_committed) return;
        }
        DeleteStaging(TempFolder);
    }
}
