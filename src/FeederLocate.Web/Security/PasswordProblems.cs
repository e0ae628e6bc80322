namespace FeederLocate.Web.Security;

/// <summary>
/// Why a password change was refused, as a short code in the address the form returns to: the page shows
/// only these sentences of ours, never text taken from the address.
/// </summary>
public static class PasswordProblems
{
    public const string WrongCurrent = "the current password is wrong";
    public const string Mismatch = "the new password and its confirmation differ";
    public const string Unchanged = "the new password must differ from the current one";

    private static readonly string[] Known =
    [
        WrongCurrent,
        Mismatch,
        Unchanged,
        $"the new password must be at least {PasswordRules.MinimumLength} characters",
        $"the new password must be at most {PasswordRules.MaximumLength} characters",
        "the new password must not be the account name",
    ];

    /// <summary>The code of a refusal (its place in the list), or null for one not listed.</summary>
    public static int? CodeOf(string problem)
    {
        var index = Array.IndexOf(Known, problem);
        return index < 0 ? null : index;
    }

    /// <summary>The sentence of a code; a code not known reads as a plain refusal.</summary>
    public static string Sentence(int? code) =>
        code is { } c && c >= 0 && c < Known.Length ? Known[c] : "the password was not changed";
}
