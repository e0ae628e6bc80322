using FeederLocate.Storage.Accounts;
using FeederLocate.Storage.Events;

namespace FeederLocate.Web.Security;

/// <summary>
/// On the first run (no account at all) creates the engineer account "admin". Its password is the one
/// configured (setting FeederLocate:AdministratorPassword or environment variable FEEDERLOCATE_ADMIN_PASSWORD),
/// or else a one-time password printed once to the console, to be changed at first sign-in. There is no
/// default password.
/// </summary>
public static class FirstRunAdministrator
{
    public const string AccountName = "admin";
    public const string EnvironmentVariable = "FEEDERLOCATE_ADMIN_PASSWORD";
    private static readonly Actor FirstRun = new("first-run", "system");

    /// <summary>
    /// For whoever runs the program on the machine itself when no engineer can sign in: gives "admin" a new
    /// one-time password (printed), enables it and makes it an engineer again. Creates it if absent.
    /// </summary>
    public static string Reset(AccountDirectory accounts, TextWriter console)
    {
        ArgumentNullException.ThrowIfNull(accounts);
        ArgumentNullException.ThrowIfNull(console);
        string oneTime;
        if (accounts.Find(AccountName) is null)
        {
            (_, oneTime) = accounts.Create(AccountName, "Administrator", AccountRole.Engineer, null, FirstRun);
        }
        else
        {
            accounts.Enable(AccountName, FirstRun);
            accounts.SetRole(AccountName, AccountRole.Engineer, FirstRun);
            accounts.SetGrids(AccountName, null, FirstRun);
            oneTime = accounts.ResetPassword(AccountName, FirstRun);
        }

        var message = string.Join(Environment.NewLine,
            "==================================================================",
            $" Engineer account \"{AccountName}\" reset (enabled, every grid).",
            $" One-time password: {oneTime}",
            " Sign in with it and choose your own; it is shown only this once.",
            "==================================================================");
        console.WriteLine(message);
        return message;
    }

    /// <summary>Creates the administrator when there is no account; returns what it did, for the console.</summary>
    public static string? Ensure(AccountDirectory accounts, string? configuredPassword, TextWriter console)
    {
        ArgumentNullException.ThrowIfNull(accounts);
        ArgumentNullException.ThrowIfNull(console);
        if (accounts.Count() > 0)
        {
            return null;
        }

        string message;
        if (!string.IsNullOrEmpty(configuredPassword))
        {
            if (PasswordRules.Problem(configuredPassword, AccountName) is { } problem)
            {
                throw new InvalidOperationException(
                    $"the configured administrator password ({EnvironmentVariable} or FeederLocate:AdministratorPassword) {problem}");
            }

            accounts.CreateWithPassword(AccountName, "Administrator", AccountRole.Engineer, configuredPassword, null, FirstRun);
            message = $"First run: engineer account \"{AccountName}\" created with the configured password.";
        }
        else
        {
            var (_, oneTime) = accounts.Create(AccountName, "Administrator", AccountRole.Engineer, null, FirstRun);
            message = string.Join(Environment.NewLine,
                "==================================================================",
                $" First run: engineer account \"{AccountName}\" created.",
                $" One-time password: {oneTime}",
                " Sign in with it and choose your own; it is shown only this once.",
                "==================================================================");
        }

        console.WriteLine(message);
        return message;
    }
}
