using FeederLocate.Storage.Accounts;
using FeederLocate.Storage.Events;

namespace FeederLocate.Cli.Input;

/// <summary>Who a command's change names in the log: the account given with --by, checked against the database's accounts.</summary>
internal static class CliActor
{
    /// <summary>
    /// The account <paramref name="by"/> (an enabled operator or engineer; an engineer when <paramref name="engineerOnly"/>),
    /// else the machine's user as cli:NAME. <paramref name="doing"/> names the change in the message.
    /// </summary>
    public static Actor Of(string dbPath, string? by, string doing, bool engineerOnly = false)
    {
        if (by is null)
        {
            return engineerOnly
                ? throw new BadInputException($"error: {doing} needs --by naming an engineer's account")
                : new Actor($"cli:{Environment.UserName}", "system");
        }

        if (!File.Exists(dbPath))
        {
            throw new BadInputException($"error: --by \"{by}\" must name an account of {dbPath}, which does not exist yet");
        }

        using var accounts = AccountStore.Open(dbPath);
        return accounts.Find(by) switch
        {
            null => throw new BadInputException($"error: --by \"{by}\" is not an account of {dbPath}"),
            { IsDisabled: true } => throw new BadInputException($"error: --by \"{by}\" is a disabled account"),
            { Role: AccountRole.Viewer } => throw new BadInputException($"error: --by \"{by}\" is a viewer; {doing} needs an operator or engineer"),
            { Role: not AccountRole.Engineer } when engineerOnly => throw new BadInputException($"error: --by \"{by}\" is not an engineer; {doing} needs an engineer"),
            var account => new Actor(account.Name, AccountRoles.Name(account.Role)),
        };
    }
}
