using FeederLocate.Storage.Accounts;
using FeederLocate.Storage.Errors;
using FeederLocate.Storage.Events;
using Microsoft.AspNetCore.Identity;

namespace FeederLocate.Web.Security;

/// <summary>
/// The control room's accounts and API tokens. Passwords are hashed with ASP.NET Core Identity's
/// <see cref="PasswordHasher{TUser}"/> (PBKDF2, salted, versioned format); nothing here keeps a password.
/// Five failed sign-ins in a row lock an account for 15 minutes, except from the machine itself; a client that
/// keeps failing is slowed down (<see cref="SignInThrottle"/>). The last enabled engineer cannot be
/// demoted or disabled, so the accounts can always be managed.
/// </summary>
public sealed class AccountDirectory : IDisposable
{
    public const int LockAfterFailures = 5;
    public static readonly TimeSpan LockFor = TimeSpan.FromMinutes(15);
    private static readonly TimeSpan TouchEvery = TimeSpan.FromMinutes(1);

    private readonly AccountStore _store;
    private readonly TimeProvider _clock;
    private readonly PasswordHasher<Account> _hasher = new();
    private readonly Lock _gate = new();
    private readonly Dictionary<long, DateTimeOffset> _touched = [];
    private readonly string _unusedHash;

    public AccountDirectory(AccountStore store, TimeProvider clock, SignInThrottle? throttle = null)
    {
        _store = store;
        _clock = clock;
        Throttle = throttle ?? new SignInThrottle(clock);
        // Compared against when no account matches, so a wrong name costs the same time as a wrong password.
        _unusedHash = _hasher.HashPassword(null!, PasswordRules.OneTime());
    }

    /// <summary>The per-client slowing of repeated failed sign-ins.</summary>
    public SignInThrottle Throttle { get; }

    /// <summary>Ends every session of the account at once (signing out): its security stamp changes, which every request checks.</summary>
    public void EndSessions(string name, Actor by)
    {
        ArgumentNullException.ThrowIfNull(by);
        if (Find(name) is not null)
        {
            Change(() => _store.EndSessions(name, by.Name));
        }
    }

    /// <summary>Raised after any account or token changed.</summary>
    public event Action? Changed;

    public int Count() => Locked(() => _store.Count());

    public IReadOnlyList<Account> Accounts() => Locked(() => _store.All());

    public Account? Find(string name) => Locked(() => _store.Find(name));

    public IReadOnlyList<ApiToken> Tokens() => Locked(() => _store.Tokens());

    public IReadOnlyList<AccountChange> Changes() => Locked(() => _store.Changes());

    /// <summary>The account if it is enabled and still carries <paramref name="stamp"/>; otherwise null (the session is over).</summary>
    public Account? Current(string name, string? stamp) =>
        Find(name) is { IsDisabled: false } account && string.Equals(account.SecurityStamp, stamp, StringComparison.Ordinal) ? account : null;

    public SignInOutcome SignIn(string? name, string? password) => SignIn(name, password, SignInClient.Unknown);

    /// <summary>
    /// Checks a name and password from <paramref name="client"/>. Unknown name, wrong password, disabled account
    /// and locked account all answer <see cref="SignInVerdict.WrongNameOrPassword"/> after the same password
    /// hash work. A client that failed too often is <see cref="SignInVerdict.Throttled"/> before anything is
    /// checked. A lock does not apply to a sign-in from the machine itself.
    /// </summary>
    public SignInOutcome SignIn(string? name, string? password, SignInClient client)
    {
        ArgumentNullException.ThrowIfNull(client);
        var wait = Throttle.WaitFor(client.Address);
        if (wait > TimeSpan.Zero)
        {
            return new SignInOutcome(SignInVerdict.Throttled, RetryAfter: wait);
        }

        var account = string.IsNullOrWhiteSpace(name) ? null : Find(name.Trim());
        var now = _clock.GetUtcNow();
        var result = Verify(account?.PasswordHash ?? _unusedHash, password ?? string.Empty);
        var lockedOut = account is { } held && held.IsLockedAt(now) && !client.IsThisMachine;
        if (account is null || account.IsDisabled || lockedOut || result == PasswordVerificationResult.Failed)
        {
            Throttle.RecordFailure(client.Address);
            if (account is { IsDisabled: false } && !lockedOut && result == PasswordVerificationResult.Failed)
            {
                Locked(() => _store.RecordFailedSignIn(account.Name, LockAfterFailures, LockFor));
            }

            return new SignInOutcome(SignInVerdict.WrongNameOrPassword);
        }

        Locked(() =>
        {
            _store.RecordSuccessfulSignIn(account.Name);
            if (result == PasswordVerificationResult.SuccessRehashNeeded)
            {
                account = _store.SetPassword(account.Name, _hasher.HashPassword(account, password!), account.MustChangePassword, "system");
            }
        });
        return new SignInOutcome(account.MustChangePassword ? SignInVerdict.MustChangePassword : SignInVerdict.SignedIn, account);
    }

    /// <summary>Creates an account with a one-time password, which it returns; the holder sets their own at first sign-in.</summary>
    public (Account Account, string OneTimePassword) Create(string name, string displayName, AccountRole role, IReadOnlyCollection<string>? grids, Actor by)
    {
        ArgumentNullException.ThrowIfNull(by);
        var password = PasswordRules.OneTime();
        var account = Change(() => _store.Create(name, displayName, role, _hasher.HashPassword(null!, password), mustChangePassword: true, grids, by.Name));
        return (account, password);
    }

    /// <summary>Creates an account with the password given (first run from a configured password; tests).</summary>
    public Account CreateWithPassword(string name, string displayName, AccountRole role, string password, IReadOnlyCollection<string>? grids, Actor by)
    {
        ArgumentNullException.ThrowIfNull(by);
        if (PasswordRules.Problem(password, name) is { } problem)
        {
            throw new AccountException($"account \"{name}\"", "password", problem);
        }

        return Change(() => _store.Create(name, displayName, role, _hasher.HashPassword(null!, password), mustChangePassword: false, grids, by.Name));
    }

    /// <summary>Gives the account a new one-time password (returned) and ends its sessions.</summary>
    public string ResetPassword(string name, Actor by)
    {
        ArgumentNullException.ThrowIfNull(by);
        var password = PasswordRules.OneTime();
        Change(() => _store.SetPassword(name, _hasher.HashPassword(null!, password), mustChangePassword: true, by.Name));
        return password;
    }

    /// <summary>The holder's own change: the current password must be right. Returns the problem, or null when changed.</summary>
    public string? ChangePassword(string name, string? currentPassword, string? newPassword)
    {
        if (Find(name) is not { IsDisabled: false } account
            || Verify(account.PasswordHash, currentPassword ?? string.Empty) == PasswordVerificationResult.Failed)
        {
            return PasswordProblems.WrongCurrent;
        }

        if (PasswordRules.Problem(newPassword, name) is { } problem)
        {
            return $"the new password {problem}";
        }

        if (string.Equals(newPassword, currentPassword, StringComparison.Ordinal))
        {
            return PasswordProblems.Unchanged;
        }

        Change(() => _store.SetPassword(name, _hasher.HashPassword(account, newPassword!), mustChangePassword: false, name));
        return null;
    }

    public Account SetRole(string name, AccountRole role, Actor by)
    {
        ArgumentNullException.ThrowIfNull(by);
        return Change(() =>
        {
            if (role < AccountRole.Engineer)
            {
                KeepAnEngineer(name, "role");
            }

            return _store.SetRole(name, role, by.Name);
        });
    }

    public Account SetGrids(string name, IReadOnlyCollection<string>? grids, Actor by)
    {
        ArgumentNullException.ThrowIfNull(by);
        return Change(() => _store.SetGrids(name, grids, by.Name));
    }

    public Account SetDisplayName(string name, string displayName, Actor by)
    {
        ArgumentNullException.ThrowIfNull(by);
        return Change(() => _store.SetDisplayName(name, displayName, by.Name));
    }

    public Account Disable(string name, Actor by)
    {
        ArgumentNullException.ThrowIfNull(by);
        return Change(() =>
        {
            KeepAnEngineer(name, "status");
            return _store.Disable(name, by.Name);
        });
    }

    public Account Enable(string name, Actor by)
    {
        ArgumentNullException.ThrowIfNull(by);
        return Change(() => _store.Enable(name, by.Name));
    }

    public IssuedApiToken IssueToken(string accountName, string label, Actor by)
    {
        ArgumentNullException.ThrowIfNull(by);
        return Change(() => _store.IssueToken(accountName, label, by.Name));
    }

    public ApiToken Revoke(long tokenId, Actor by)
    {
        ArgumentNullException.ThrowIfNull(by);
        return Change(() => _store.Revoke(tokenId, by.Name));
    }

    /// <summary>The token's account when the token is valid; notes its use (at most once a minute per token).</summary>
    public (ApiToken Token, Account Account)? AuthenticateToken(string secret) => Locked(() =>
    {
        if (_store.Authenticate(secret) is not { } found)
        {
            return ((ApiToken, Account)?)null;
        }

        var now = _clock.GetUtcNow();
        if (!_touched.TryGetValue(found.Token.Id, out var last) || now - last >= TouchEvery)
        {
            _touched[found.Token.Id] = now;
            _store.TouchToken(found.Token.Id, now);
        }

        return found;
    });

    public void Dispose() => _store.Dispose();

    private PasswordVerificationResult Verify(string hash, string password)
    {
        try
        {
            return _hasher.VerifyHashedPassword(null!, hash, password);
        }
        catch (FormatException)
        {
            // A hash that is not the hasher's format (an account meant for tokens only) accepts no password.
            return PasswordVerificationResult.Failed;
        }
    }

    private void KeepAnEngineer(string name, string field)
    {
        var engineers = _store.All().Where(a => a.Role == AccountRole.Engineer && !a.IsDisabled).Select(a => a.Name).ToList();
        if (engineers.Count == 1 && engineers[0] == name)
        {
            throw new AccountException($"account \"{name}\"", field, "cannot change: it is the last enabled engineer, and someone must manage the accounts");
        }
    }

    private T Change<T>(Func<T> change)
    {
        var result = Locked(change);
        Changed?.Invoke();
        return result;
    }

    private T Locked<T>(Func<T> action)
    {
        lock (_gate)
        {
            return action();
        }
    }

    private void Locked(Action action)
    {
        lock (_gate)
        {
            action();
        }
    }
}
