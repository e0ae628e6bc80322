using FeederLocate.Storage.Accounts;

namespace FeederLocate.Web.Security;

/// <summary>How a sign-in attempt ended.</summary>
public enum SignInVerdict
{
    SignedIn,
    MustChangePassword,
    /// <summary>Wrong name, wrong password, disabled or locked account: one answer, so it tells nothing about which names exist.</summary>
    WrongNameOrPassword,

    /// <summary>This client failed too often: it must wait <see cref="SignInOutcome.RetryAfter"/> before it is heard again.</summary>
    Throttled,
}

/// <summary>A sign-in attempt's verdict, with the account when the password was right and the wait when throttled.</summary>
public sealed record SignInOutcome(SignInVerdict Verdict, Account? Account = null, TimeSpan? RetryAfter = null);
