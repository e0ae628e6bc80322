using System.Security.Cryptography;

namespace FeederLocate.Web.Security;

/// <summary>
/// What a password must be (12 to 128 characters, not the account name: common practice, in the spirit of
/// NIST SP 800-63B's length-over-composition advice) and how one-time passwords are made.
/// </summary>
public static class PasswordRules
{
    public const int MinimumLength = 12;
    public const int MaximumLength = 128;
    private const string OneTimeAlphabet = "23456789abcdefghjkmnpqrstuvwxyz";

    /// <summary>The problem with <paramref name="password"/> for account <paramref name="accountName"/>, or null when it will do.</summary>
    public static string? Problem(string? password, string accountName)
    {
        if (string.IsNullOrEmpty(password) || password.Length < MinimumLength)
        {
            return $"must be at least {MinimumLength} characters";
        }

        if (password.Length > MaximumLength)
        {
            return $"must be at most {MaximumLength} characters";
        }

        return string.Equals(password.Trim(), accountName, StringComparison.OrdinalIgnoreCase) ? "must not be the account name" : null;
    }

    /// <summary>A one-time password: four groups of five characters from the system's random generator (about 99 bits).</summary>
    public static string OneTime()
    {
        var characters = RandomNumberGenerator.GetItems<char>(OneTimeAlphabet, 20);
        return string.Join('-', Enumerable.Range(0, 4).Select(i => new string(characters, i * 5, 5)));
    }
}
