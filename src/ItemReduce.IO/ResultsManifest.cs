using System.Globalization;
using System.Security.Cryptography;
using System.Text;

namespace ItemReduce.IO;

/// <summary>
/// The manifest a run writes into its results folder (<c>itemreduce-manifest.txt</c>): one line per file the run
/// wrote, <c>SHA-256 SIZE NAME</c>, after a header line. A folder whose entries are exactly the manifest and the files
/// it lists, each with its listed size and hash, was written by itemreduce and not changed since; only such a folder is
/// replaced by <c>--force</c>, and replacing it removes exactly those files.
/// </summary>
public static class ResultsManifest
{
    /// <summary>File name of the manifest.</summary>
    public const string FileName = "itemreduce-manifest.txt";

    private const string Header = "# itemreduce results manifest: sha256 bytes file";

    /// <summary>Lists every file of <paramref name="folder"/> (flat; the run writes no subfolders) in the manifest.</summary>
    public static void Write(string folder)
    {
        var sb = new StringBuilder(Header).Append('\n');
        foreach (string path in Directory.EnumerateFiles(folder).Order(StringComparer.Ordinal))
        {
            string name = Path.GetFileName(path);
            if (name == FileName) continue;
            sb.Append(Hash(path)).Append(' ').Append(new FileInfo(path).Length.ToString(CultureInfo.InvariantCulture))
              .Append(' ').Append(name).Append('\n');
        }
        File.WriteAllText(Path.Combine(folder, FileName), sb.ToString(), new UTF8Encoding(false));
    }

    /// <summary>Null when <paramref name="folder"/> holds exactly its manifest and the unchanged files it lists;
    /// otherwise a phrase saying what differs (for an error message).</summary>
    public static string? Verify(string folder)
    {
        string manifest = Path.Combine(folder, FileName);
        if (!File.Exists(manifest) || new FileInfo(manifest).LinkTarget is not null || new FileInfo(manifest).Length > 1 << 20)
        {
            string? first = Directory.EnumerateFileSystemEntries(folder).Select(Path.GetFileName).Order(StringComparer.Ordinal).FirstOrDefault();
            return $"it holds {InputErrors.Show(first)} and no {FileName}, so it was not written by itemreduce";
        }
        var listed = Read(manifest);
        if (listed is null) return $"its {FileName} is not one that itemreduce wrote";
        foreach (string entry in Directory.EnumerateFileSystemEntries(folder))
        {
            string name = Path.GetFileName(entry);
            if (name != FileName && !listed.ContainsKey(name)) return $"it holds {InputErrors.Show(name)}, which no itemreduce run wrote";
        }
        foreach (var (name, (hash, size)) in listed)
        {
            string path = Path.Combine(folder, name);
            var info = new FileInfo(path);
            if (!info.Exists || info.LinkTarget is not null) return $"{InputErrors.Show(name)} listed in its {FileName} is missing";
            if (info.Length != size || Hash(path) != hash) return $"{InputErrors.Show(name)} was changed after itemreduce wrote it";
        }
        return null;
    }

    /// <summary>Deletes the manifest and the files it lists, then the folder if it is empty; never anything else.</summary>
    public static void RemoveListedFiles(string folder)
    {
        var listed = Read(Path.Combine(folder, FileName));
        if (listed is null) return;
        foreach (string name in listed.Keys) File.Delete(Path.Combine(folder, name));
        File.Delete(Path.Combine(folder, FileName));
        try { Directory.Delete(folder, recursive: false); }
        catch (IOException) { } // something else appeared in it: leave it
    }

    private static Dictionary<string, (string Hash, long Size)>? Read(string manifest)
    {
        string[] lines;
        try { lines = File.ReadAllLines(manifest, new UTF8Encoding(false, true)); }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException or DecoderFallbackException) { return null; }
        if (lines.Length == 0 || lines[0] != Header) return null;
        var d = new Dictionary<string, (string, long)>(StringComparer.Ordinal);
        foreach (string line in lines.Skip(1))
        {
            if (line.Length == 0) continue;
            var parts = line.Split(' ', 3);
            if (parts.Length != 3 || parts[0].Length != 64 || !long.TryParse(parts[1], NumberStyles.None, CultureInfo.InvariantCulture, out long size))
                return null;
            string name = parts[2];
            // A listed name is a plain file name in the folder: no separators, no parent references.
            if (name.Length == 0 || name is "." or ".." || name.IndexOfAny(['/', '\\', '\0']) >= 0 || name == FileName) return null;
            d[name] = (parts[0], size);
        }
        return d;
    }

    private static string Hash(string path)
    {
        using var fs = new FileStream(path, FileMode.Open, FileAccess.Read, FileShare.Read, 1 << 16, FileOptions.SequentialScan);
        return Convert.ToHexStringLower(SHA256.HashData(fs));
    }
}
