using FeederLocate.Storage.Accounts;
using FeederLocate.Storage.Events;

namespace FeederLocate.Cli.Input;

/// <summary>
/// The account a command logs a change as, given with <c>--by</c> and proven by one of its live API tokens in
/// <see cref="TokenVariable"/>: anyone at the machine could type a name; only the account's holder has its token.
/// </summary>
public static class ProvenAccount
{
    /// <summary>The environment variable holding an API token of the account named with --by.</summary>
    public const string TokenVariable = "FEEDERLOCATE_TOKEN";

    /// <summary>The account named <paramref name="by"/>, if its token is given, it is enabled and holds at least <paramref name="least"/>.</summary>
    public static Actor Of(string dbPath, string by, AccountRole least, string doing)
    {
        if (!File.Exists(dbPath))
        {
            throw new BadInputException($"error: --by \"{by}\" must name an account of {dbPath}, which does not exist yet");
        }

        var secret = Environment.GetEnvironmentVariable(TokenVariable);
        if (string.IsNullOrWhiteSpace(secret))
        {
            throw new BadInputException($"error: --by \"{by}\" needs one of that account's API tokens in the environment variable {TokenVariable} (an engineer issues tokens on the Accounts page)");
        }

        using var accounts = AccountStore.Open(dbPath);
        if (accounts.Authenticate(secret.Trim()) is not { } proven || !string.Equals(proven.Account.Name, by, StringComparison.Ordinal))
        {
            throw new BadInputException($"error: the token in {TokenVariable} is not a live API token of account \"{by}\"");
        }

        return accounts.Find(by) switch
        {
            null => throw new BadInputException($"error: --by \"{by}\" is not an account of {dbPath}"),
            { IsDisabled: true } => throw new BadInputException($"error: --by \"{by}\" is a disabled account"),
            { Role: var role } when role < least =>
                throw new BadInputException($"error: --by \"{by}\" is {Article(role)} {AccountRoles.Name(role)}; {doing} needs {Needed(least)}"),
            var account => new Actor(account.Name, AccountRoles.Name(account.Role)),
        };
    }

    private static string Article(AccountRole role) => role == AccountRole.Viewer ? "a" : "an";

    private static string Needed(AccountRole least) => least switch
    {
        AccountRole.Engineer => "an engineer",
        AccountRole.Operator => "an operator or engineer",
        _ => "an account",
    };
}
