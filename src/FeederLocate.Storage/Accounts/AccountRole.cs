namespace FeederLocate.Storage.Accounts;

/// <summary>
/// What an account may do, each role including the ones before it: a viewer reads; an operator also enters
/// indications and records, ticks switching steps and logs outcomes; an engineer also loads grids and
/// manages accounts and tokens.
/// </summary>
public enum AccountRole
{
    Viewer = 1,
    Operator = 2,
    Engineer = 3,
}

/// <summary>The roles' names as stored and as shown.</summary>
public static class AccountRoles
{
    public static string Name(AccountRole role) => role switch
    {
        AccountRole.Viewer => "viewer",
        AccountRole.Operator => "operator",
        AccountRole.Engineer => "engineer",
        _ => throw new ArgumentOutOfRangeException(nameof(role), role, "not a role"),
    };

    public static bool TryParse(string? text, out AccountRole role)
    {
        (var known, role) = text switch
        {
            "viewer" => (true, AccountRole.Viewer),
            "operator" => (true, AccountRole.Operator),
            "engineer" => (true, AccountRole.Engineer),
            _ => (false, default),
        };
        return known;
    }

    public static IReadOnlyList<AccountRole> All { get; } = [AccountRole.Viewer, AccountRole.Operator, AccountRole.Engineer];
}
