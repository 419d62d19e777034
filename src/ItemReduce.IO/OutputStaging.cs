using System.Text;

namespace ItemReduce.IO;

/// <summary>
/// Collects output files in a temporary folder next to the destination and moves them into place only
/// when <see cref="Commit"/> is called, so a failed run never leaves partial outputs. An existing
/// destination is replaced only when <c>force</c> is set.
/// </summary>
public sealed class OutputStaging : IDisposable
{
    private static readonly UTF8Encoding Utf8NoBom = new(false);
    private readonly string _destination;
    private readonly bool _force;
    private bool _committed;

    private OutputStaging(string destination, string temp, bool force)
    {
        _destination = destination;
        TempFolder = temp;
        _force = force;
    }

    /// <summary>The staging folder (deleted on dispose unless committed).</summary>
    public string TempFolder { get; }

    /// <summary>Checks that the destination can be used; call before any analysis so a user error surfaces early.</summary>
    public static void CheckDestination(string destination, bool force)
    {
        string full = Path.GetFullPath(destination);
        if (File.Exists(full))
            throw new SurveyInputException($"{destination}: the output path is a file, not a folder. Fix: choose a folder with --out.");
        if (Directory.Exists(full) && !force)
            throw new SurveyInputException($"{destination}: the output folder already exists. Fix: add --force to replace it, or choose another folder with --out.");
    }

    /// <summary>Creates the staging folder next to <paramref name="destination"/>.</summary>
    public static OutputStaging Begin(string destination, bool force)
    {
        CheckDestination(destination, force);
        string full = Path.GetFullPath(destination).TrimEnd(Path.DirectorySeparatorChar);
        string parent = Path.GetDirectoryName(full) ?? ".";
        try
        {
            Directory.CreateDirectory(parent);
            string temp = Path.Combine(parent, $".{Path.GetFileName(full)}.partial-{Environment.ProcessId}-{Guid.NewGuid():N}");
            Directory.CreateDirectory(temp);
            return new OutputStaging(full, temp, force);
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

    /// <summary>Moves the staged files into the destination.</summary>
    public void Commit()
    {
        Guard(() =>
        {
            string? old = null;
            if (Directory.Exists(_destination))
            {
                if (!_force) throw new SurveyInputException($"{_destination}: the output folder appeared during the run. Fix: add --force or choose another --out.");
                old = _destination + $".old-{Guid.NewGuid():N}";
                Directory.Move(_destination, old);
            }
            Directory.Move(TempFolder, _destination);
            if (old is not null) Directory.Delete(old, recursive: true);
        });
        _committed = true;
    }

    private void Guard(Action action)
    {
        try { action(); }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException)
        {
            throw WriteFailure(_destination, e);
        }
    }

    private static SurveyInputException WriteFailure(string destination, Exception e) =>
        new($"{destination}: results could not be written ({e.Message.ReplaceLineEndings(" ")}). " +
            "Fix: check free disk space and write permission, or choose another folder with --out. No partial results were kept.");

    public void Dispose()
    {
        if (_committed) return;
        try { if (Directory.Exists(TempFolder)) Directory.Delete(TempFolder, recursive: true); }
        catch (IOException) { }
        catch (UnauthorizedAccessException) { }
    }
}
