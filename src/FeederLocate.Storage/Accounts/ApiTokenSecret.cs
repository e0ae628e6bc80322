using System.Security.Cryptography;
using System.Text;

namespace FeederLocate.Storage.Accounts;

/// <summary>
/// Token secrets: 32 random bytes from the operating system's generator, base64url-encoded behind a
/// recognisable "flt_" mark. Being random and long, a secret needs no slow hash: SHA-256 of it is kept.
/// </summary>
public static class ApiTokenSecret
{
    public const string Mark = "flt_";
    public const int PrefixLength = 12;

    public static string Create()
    {
        var bytes = RandomNumberGenerator.GetBytes(32);
        return Mark + Convert.ToBase64String(bytes).TrimEnd('=').Replace('+', '-').Replace('/', '_');
    }

    public static string Sha256Hex(string secret)
    {
        ArgumentNullException.ThrowIfNull(secret);
        return Convert.ToHexStringLower(SHA256.HashData(Encoding.UTF8.GetBytes(secret)));
    }

    public static string PrefixOf(string secret) => secret.Length <= PrefixLength ? secret : secret[..PrefixLength];
}
