using System.Text.RegularExpressions;
using FeederLocate.Storage.Errors;

namespace FeederLocate.Storage.Accounts;

/// <summary>What an account name, display name and token label may be.</summary>
public static partial class AccountNames
{
    /// <summary>Lower-case letters, digits, dot, dash and underscore, starting with a letter or digit, at most 32.</summary>
    public static void CheckName(string? name)
    {
        if (name is null || !NamePattern().IsMatch(name))
        {
            throw new AccountException($"account \"{name}\"", "name",
                "must be 1 to 32 lower-case letters, digits, '.', '-' or '_', starting with a letter or digit");
        }
    }

    /// <summary>Free text (shown as text, never as markup), 1 to 100 characters, no control characters.</summary>
    public static void CheckText(string subject, string field, string? text)
    {
        if (string.IsNullOrWhiteSpace(text) || text.Length > 100 || text.Any(char.IsControl))
        {
            throw new AccountException(subject, field, "must be 1 to 100 characters without control characters");
        }
    }

    [GeneratedRegex("^[a-z0-9][a-z0-9._-]{0,31}$", RegexOptions.CultureInvariant)]
    private static partial Regex NamePattern();
}
