using System.Security.Cryptography;
using System.Text;

namespace FeederLocate.Storage.Grids;

/// <summary>The content hash of a grid's text: SHA-256 of its UTF-8 bytes, lower-case hexadecimal.</summary>
public static class GridContent
{
    public static string Sha256(string text)
    {
        ArgumentNullException.ThrowIfNull(text);
        return Convert.ToHexStringLower(SHA256.HashData(Encoding.UTF8.GetBytes(text)));
    }
}
