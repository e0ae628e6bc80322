using FeederLocate.Storage.Accounts;
using FeederLocate.Storage.Events;

namespace FeederLocate.Cli.Input;

/// <summary>Who a command's change names in the log: the account given with --by, proven by one of its API tokens (<see cref="ProvenAccount"/>).</summary>
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

        // Anyone at the machine could type a name: the account is proven by one of its API tokens.
        return ProvenAccount.Of(dbPath, by, engineerOnly ? AccountRole.Engineer : AccountRole.Operator, doing);
    }
}
