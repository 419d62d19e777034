namespace ItemReduce.IO;

/// <summary>Path comparisons for the output-safety rules: symbolic links resolved, case folded where the platform
/// folds it.</summary>
internal static class SafePaths
{
    private static StringComparison Comparison =>
        OperatingSystem.IsLinux() || OperatingSystem.IsFreeBSD() ? StringComparison.Ordinal : StringComparison.OrdinalIgnoreCase;

    /// <summary>The absolute path with every symbolic link along it resolved (components that do not exist yet are
    /// kept as given).</summary>
    public static string Canonical(string path) => Canonical(path, 0);

    private static string Canonical(string path, int depth)
    {
        string full = Path.GetFullPath(path);
        string root = Path.GetPathRoot(full) ?? "/";
        string current = root;
        foreach (string part in full[root.Length..].Split(Path.DirectorySeparatorChar, Path.AltDirectorySeparatorChar))
        {
            if (part.Length == 0) continue;
            string next = Path.Combine(current, part);
            if (depth < 32 && (Directory.Exists(next) || File.Exists(next)))
            {
                try
                {
                    var info = new FileInfo(next);
                    if (info.LinkTarget is not null && info.ResolveLinkTarget(returnFinalTarget: true) is { } target)
                        next = Canonical(target.FullName, depth + 1);
                }
                catch (IOException) { } // a link loop: keep the path as written
            }
            current = next;
        }
        return Path.TrimEndingDirectorySeparator(current);
    }

    /// <summary>True when <paramref name="inner"/> is <paramref name="outer"/> or lies below it (both canonical).</summary>
    public static bool IsSameOrInside(string inner, string outer)
    {
        if (string.Equals(inner, outer, Comparison)) return true;
        string prefix = outer.EndsWith(Path.DirectorySeparatorChar) ? outer : outer + Path.DirectorySeparatorChar;
        return inner.StartsWith(prefix, Comparison);
    }

    /// <summary>True for a filesystem root or the user's home folder (canonical path).</summary>
    public static bool IsRootOrHome(string canonical)
    {
        if (string.Equals(Path.TrimEndingDirectorySeparator(Path.GetPathRoot(canonical) ?? ""), canonical, Comparison) ||
            canonical == Path.GetPathRoot(canonical)) return true;
        string home = Environment.GetFolderPath(Environment.SpecialFolder.UserProfile);
        return home.Length > 0 && string.Equals(Canonical(home), canonical, Comparison);
    }
}
