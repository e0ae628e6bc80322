using FeederLocate.Storage.Accounts;

namespace FeederLocate.Web.Security;

/// <summary>How a sign-in attempt ended.</summary>
public enum SignInVerdict
{
    SignedIn,
    MustChangePassword,
    WrongNameOrPassword,
    Locked,
}

/// <summary>A sign-in attempt's verdict, with the account when the password was right and when a lock ends.</summary>
public sealed record SignInOutcome(SignInVerdict Verdict, Account? Account = null, DateTimeOffset? LockedUntil = null);
