using System.Security.Cryptography;

namespace ItemReduce.IO;

/// <summary>SHA-256 of an input file, for the reproducibility record.</summary>
public static class FileFingerprint
{
    public static string Sha256(string path)
    {
        using var fs = File.OpenRead(path);
        return Convert.ToHexStringLower(SHA256.HashData(fs));
    }
}
