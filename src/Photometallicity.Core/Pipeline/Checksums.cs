using System.Security.Cryptography;

namespace Photometallicity.Pipeline;

/// <summary>SHA-256 checksums of input files, for provenance.</summary>
public static class Checksums
{
    public static string Sha256(string path)
    {
        using var s = new FileStream(path, FileMode.Open, FileAccess.Read, FileShare.Read, 1 << 20);
        return Convert.ToHexStringLower(SHA256.HashData(s));
    }
}
