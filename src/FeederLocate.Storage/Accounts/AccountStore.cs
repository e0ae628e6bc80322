using System.Collections.Immutable;
using System.Security.Cryptography;
using System.Text.Json;
using FeederLocate.Storage.Database;
using FeederLocate.Storage.Errors;
using FeederLocate.Storage.Migrations;
using Microsoft.Data.Sqlite;

namespace FeederLocate.Storage.Accounts;

/// <summary>
/// Accounts and API tokens, in the same SQLite file as the incident log. Passwords arrive hashed (the
/// caller's hasher); token secrets are made here and only their SHA-256 is kept. Every change is one
/// transaction with its row in <c>account_changes</c>. One instance is for one thread.
/// </summary>
public sealed class AccountStore : IDisposable
{
    private readonly SqliteConnection _connection;
    private readonly TimeProvider _clock;
    private readonly FileWatch _file;
    private SqliteTransaction? _transaction;

    private AccountStore(SqliteConnection connection, TimeProvider clock, string path)
    {
        _connection = connection;
        _clock = clock;
        _file = new FileWatch(path);
    }

    /// <summary>Opens (creating if absent) the database at <paramref name="path"/> and brings its schema up to date.</summary>
    public static AccountStore Open(string path, TimeProvider? clock = null)
    {
        ArgumentException.ThrowIfNullOrWhiteSpace(path);
        clock ??= TimeProvider.System;
        var connection = StoreConnection.Open(path);
        try
        {
            SchemaMigrator.Migrate(connection, clock, path);
            return new AccountStore(connection, clock, path);
        }
        catch
        {
            connection.Dispose();
            throw;
        }
    }

    public int Count() => Convert.ToInt32(Scalar("SELECT COUNT(*) FROM accounts"), System.Globalization.CultureInfo.InvariantCulture);

    public IReadOnlyList<Account> All() => ReadAccounts("SELECT * FROM accounts ORDER BY name", _ => { });

    public Account? Find(string name) =>
        ReadAccounts("SELECT * FROM accounts WHERE name = $name", p => p.AddWithValue("$name", name)).FirstOrDefault();

    /// <summary>Creates an account; refuses a name already taken or malformed (<see cref="AccountException"/>).</summary>
    public Account Create(
        string name, string displayName, AccountRole role, string passwordHash, bool mustChangePassword,
        IReadOnlyCollection<string>? grids, string by)
    {
        AccountNames.CheckName(name);
        AccountNames.CheckText($"account \"{name}\"", "displayName", displayName);
        CheckRole(name, role);
        ArgumentException.ThrowIfNullOrWhiteSpace(passwordHash);
        ArgumentException.ThrowIfNullOrWhiteSpace(by);
        CheckGrids(name, grids);
        return Write(transaction =>
        {
            if (Find(name) is not null)
            {
                throw new AccountException($"account \"{name}\"", "name", "is taken");
            }

            Execute(transaction, """
                INSERT INTO accounts (name, display_name, role, password_hash, must_change_password, grids, security_stamp, created_at, created_by)
                VALUES ($name, $display, $role, $hash, $mustChange, $grids, $stamp, $now, $by)
                """, p =>
            {
                p.AddWithValue("$name", name);
                p.AddWithValue("$display", displayName.Trim());
                p.AddWithValue("$role", AccountRoles.Name(role));
                p.AddWithValue("$hash", passwordHash);
                p.AddWithValue("$mustChange", mustChangePassword ? 1 : 0);
                p.AddWithValue("$grids", GridsJson(grids));
                p.AddWithValue("$stamp", NewStamp());
                p.AddWithValue("$now", IsoTime.Format(_clock.GetUtcNow()));
                p.AddWithValue("$by", by);
            });
            LogChange(transaction, by, "create", name, $"role {AccountRoles.Name(role)}");
            return Find(name)!;
        });
    }

    /// <summary>Sets a new password hash (and whether it must be changed at next sign-in); clears a lock.</summary>
    public Account SetPassword(string name, string passwordHash, bool mustChangePassword, string by)
    {
        ArgumentException.ThrowIfNullOrWhiteSpace(passwordHash);
        return Change(name, by, mustChangePassword ? "reset password" : "change password", null,
            "password_hash = $hash, must_change_password = $mustChange, failed_sign_ins = 0, locked_until = NULL",
            p =>
            {
                p.AddWithValue("$hash", passwordHash);
                p.AddWithValue("$mustChange", mustChangePassword ? 1 : 0);
            });
    }

    public Account SetRole(string name, AccountRole role, string by)
    {
        CheckRole(name, role);
        return Change(name, by, "set role", AccountRoles.Name(role), "role = $role", p => p.AddWithValue("$role", AccountRoles.Name(role)));
    }

    public Account SetDisplayName(string name, string displayName, string by)
    {
        AccountNames.CheckText($"account \"{name}\"", "displayName", displayName);
        return Change(name, by, "set display name", displayName.Trim(), "display_name = $display", p => p.AddWithValue("$display", displayName.Trim()));
    }

    /// <summary>Limits the account to the named grids; null lifts the limit.</summary>
    public Account SetGrids(string name, IReadOnlyCollection<string>? grids, string by)
    {
        CheckGrids(name, grids);
        var json = GridsJson(grids);
        return Change(name, by, "set grids", json as string ?? "every grid", "grids = $grids", p => p.AddWithValue("$grids", json));
    }

    /// <summary>Gives the account a new security stamp and nothing else: every open session of it ends (signing out).</summary>
    public Account EndSessions(string name, string by) =>
        Change(name, by, "end sessions", null, "failed_sign_ins = failed_sign_ins", _ => { });

    public Account Disable(string name, string by) =>
        Change(name, by, "disable", null, "disabled_at = $now", p => p.AddWithValue("$now", IsoTime.Format(_clock.GetUtcNow())));

    public Account Enable(string name, string by) =>
        Change(name, by, "enable", null, "disabled_at = NULL, failed_sign_ins = 0, locked_until = NULL", _ => { });

    /// <summary>Counts a failed sign-in; at <paramref name="lockAfter"/> failures in a row the account is locked for <paramref name="lockFor"/>.</summary>
    public Account RecordFailedSignIn(string name, int lockAfter, TimeSpan lockFor)
    {
        ArgumentOutOfRangeException.ThrowIfLessThan(lockAfter, 1);
        return Write(transaction =>
        {
            var account = Find(name) ?? throw Unknown(name);
            var failures = account.FailedSignIns + 1;
            var locked = failures >= lockAfter;
            object until = locked ? IsoTime.Format(_clock.GetUtcNow() + lockFor)
                : account.LockedUntil is { } previous ? IsoTime.Format(previous) : DBNull.Value;
            Execute(transaction, "UPDATE accounts SET failed_sign_ins = $failures, locked_until = $until WHERE name = $name", p =>
            {
                p.AddWithValue("$failures", locked ? 0 : failures);
                p.AddWithValue("$until", until);
                p.AddWithValue("$name", name);
            });
            if (locked)
            {
                LogChange(transaction, "system", "lock", name, $"{failures} failed sign-ins in a row");
            }

            return Find(name)!;
        });
    }

    public void RecordSuccessfulSignIn(string name) => Write(transaction =>
    {
        Execute(transaction, "UPDATE accounts SET failed_sign_ins = 0 WHERE name = $name", p => p.AddWithValue("$name", name));
        return 0;
    });

    /// <summary>Issues a token acting as the account; the secret is in the result only.</summary>
    public IssuedApiToken IssueToken(string accountName, string label, string by)
    {
        AccountNames.CheckText($"token of \"{accountName}\"", "label", label);
        ArgumentException.ThrowIfNullOrWhiteSpace(by);
        return Write(transaction =>
        {
            _ = Find(accountName) ?? throw Unknown(accountName);
            var secret = ApiTokenSecret.Create();
            Execute(transaction, """
                INSERT INTO api_tokens (account_name, label, secret_sha256, prefix, created_at, created_by)
                VALUES ($account, $label, $hash, $prefix, $now, $by)
                """, p =>
            {
                p.AddWithValue("$account", accountName);
                p.AddWithValue("$label", label.Trim());
                p.AddWithValue("$hash", ApiTokenSecret.Sha256Hex(secret));
                p.AddWithValue("$prefix", ApiTokenSecret.PrefixOf(secret));
                p.AddWithValue("$now", IsoTime.Format(_clock.GetUtcNow()));
                p.AddWithValue("$by", by);
            });
            var id = Convert.ToInt64(Scalar("SELECT last_insert_rowid()", transaction), System.Globalization.CultureInfo.InvariantCulture);
            LogChange(transaction, by, "issue token", accountName, $"token {id} \"{label.Trim()}\"");
            return new IssuedApiToken(Tokens(accountName).Single(t => t.Id == id), secret);
        });
    }

    /// <summary>Revokes a token: it is refused from then on. Revoking a revoked token changes nothing.</summary>
    public ApiToken Revoke(long tokenId, string by)
    {
        ArgumentException.ThrowIfNullOrWhiteSpace(by);
        return Write(transaction =>
        {
            var token = Token(tokenId) ?? throw new AccountException($"token {tokenId}", "id", "does not exist");
            if (!token.IsRevoked)
            {
                Execute(transaction, "UPDATE api_tokens SET revoked_at = $now, revoked_by = $by WHERE id = $id", p =>
                {
                    p.AddWithValue("$now", IsoTime.Format(_clock.GetUtcNow()));
                    p.AddWithValue("$by", by);
                    p.AddWithValue("$id", tokenId);
                });
                LogChange(transaction, by, "revoke token", token.AccountName, $"token {tokenId} \"{token.Label}\"");
            }

            return Token(tokenId)!;
        });
    }

    /// <summary>The token with this secret and its account, when the token is not revoked and the account not disabled; otherwise null.</summary>
    public (ApiToken Token, Account Account)? Authenticate(string secret)
    {
        if (string.IsNullOrEmpty(secret) || !secret.StartsWith(ApiTokenSecret.Mark, StringComparison.Ordinal) || secret.Length > 100)
        {
            return null;
        }

        var hash = ApiTokenSecret.Sha256Hex(secret);
        var token = ReadTokens("SELECT * FROM api_tokens WHERE secret_sha256 = $hash", p => p.AddWithValue("$hash", hash)).FirstOrDefault();
        if (token is null || token.IsRevoked || Find(token.AccountName) is not { IsDisabled: false } account)
        {
            return null;
        }

        return (token, account);
    }

    /// <summary>Notes when a token was last used (the caller decides how often).</summary>
    public void TouchToken(long tokenId, DateTimeOffset usedAt) => Write(transaction =>
    {
        Execute(transaction, "UPDATE api_tokens SET last_used_at = $at WHERE id = $id", p =>
        {
            p.AddWithValue("$at", IsoTime.Format(usedAt));
            p.AddWithValue("$id", tokenId);
        });
        return 0;
    });

    public ApiToken? Token(long tokenId) =>
        ReadTokens("SELECT * FROM api_tokens WHERE id = $id", p => p.AddWithValue("$id", tokenId)).FirstOrDefault();

    /// <summary>The tokens of one account, or of all when <paramref name="accountName"/> is null, newest first.</summary>
    public IReadOnlyList<ApiToken> Tokens(string? accountName = null) => accountName is null
        ? ReadTokens("SELECT * FROM api_tokens ORDER BY id DESC", _ => { })
        : ReadTokens("SELECT * FROM api_tokens WHERE account_name = $account ORDER BY id DESC", p => p.AddWithValue("$account", accountName));

    /// <summary>The latest account changes, newest first.</summary>
    public IReadOnlyList<AccountChange> Changes(int limit = 200)
    {
        using var command = _connection.CreateCommand();
        command.Transaction = _transaction;
        command.CommandText = "SELECT time, actor, action, subject, detail FROM account_changes ORDER BY id DESC LIMIT $limit";
        command.Parameters.AddWithValue("$limit", limit);
        using var reader = command.ExecuteReader();
        var changes = new List<AccountChange>();
        while (reader.Read())
        {
            changes.Add(new AccountChange(Time(reader, 0)!.Value, reader.GetString(1), reader.GetString(2), reader.GetString(3), reader.IsDBNull(4) ? null : reader.GetString(4)));
        }

        return changes;
    }

    public void Dispose() => _connection.Dispose();

    private Account Change(string name, string by, string action, string? detail, string assignments, Action<SqliteParameterCollection> parameters)
    {
        ArgumentException.ThrowIfNullOrWhiteSpace(by);
        return Write(transaction =>
        {
            _ = Find(name) ?? throw Unknown(name);
            Execute(transaction, $"UPDATE accounts SET {assignments}, security_stamp = $stamp WHERE name = $name", p =>
            {
                parameters(p);
                p.AddWithValue("$stamp", NewStamp());
                p.AddWithValue("$name", name);
            });
            LogChange(transaction, by, action, name, detail);
            return Find(name)!;
        });
    }

    private static void CheckRole(string name, AccountRole role)
    {
        if (!AccountRoles.All.Contains(role))
        {
            throw new AccountException($"account \"{name}\"", "role", "must be viewer, operator or engineer");
        }
    }

    private static void CheckGrids(string name, IReadOnlyCollection<string>? grids)
    {
        if (grids is not null && grids.Any(string.IsNullOrWhiteSpace))
        {
            throw new AccountException($"account \"{name}\"", "grids", "must name grids, not blanks");
        }
    }

    private static object GridsJson(IReadOnlyCollection<string>? grids) =>
        grids is null ? DBNull.Value : JsonSerializer.Serialize(grids.Distinct(StringComparer.Ordinal).Order(StringComparer.Ordinal).ToArray());

    private static string NewStamp() => Convert.ToHexStringLower(RandomNumberGenerator.GetBytes(16));

    private static AccountException Unknown(string name) => new($"account \"{name}\"", "name", "does not exist");

    private void LogChange(SqliteTransaction transaction, string actor, string action, string subject, string? detail) =>
        Execute(transaction, "INSERT INTO account_changes (time, actor, action, subject, detail) VALUES ($now, $actor, $action, $subject, $detail)", p =>
        {
            p.AddWithValue("$now", IsoTime.Format(_clock.GetUtcNow()));
            p.AddWithValue("$actor", actor);
            p.AddWithValue("$action", action);
            p.AddWithValue("$subject", subject);
            p.AddWithValue("$detail", (object?)detail ?? DBNull.Value);
        });

    private T Write<T>(Func<SqliteTransaction, T> change)
    {
        _file.EnsureUnchanged();
        using var transaction = _connection.BeginTransaction();
        _transaction = transaction;
        try
        {
            var result = change(transaction);
            transaction.Commit();
            return result;
        }
        finally
        {
            _transaction = null;
        }
    }

    private void Execute(SqliteTransaction transaction, string sql, Action<SqliteParameterCollection> parameters)
    {
        using var command = _connection.CreateCommand();
        command.Transaction = transaction;
        command.CommandText = sql;
        parameters(command.Parameters);
        command.ExecuteNonQuery();
    }

    private object? Scalar(string sql, SqliteTransaction? transaction = null)
    {
        using var command = _connection.CreateCommand();
        command.Transaction = transaction ?? _transaction;
        command.CommandText = sql;
        return command.ExecuteScalar();
    }

    private List<Account> ReadAccounts(string sql, Action<SqliteParameterCollection> parameters)
    {
        using var command = Query(sql, parameters);
        using var reader = command.ExecuteReader();
        var accounts = new List<Account>();
        while (reader.Read())
        {
            var roleText = reader.GetString(reader.GetOrdinal("role"));
            var name = reader.GetString(reader.GetOrdinal("name"));
            if (!AccountRoles.TryParse(roleText, out var role))
            {
                throw new AccountException($"account \"{name}\"", "role", $"is \"{roleText}\" in the database, not a role");
            }

            var gridsOrdinal = reader.GetOrdinal("grids");
            ImmutableArray<string>? grids = reader.IsDBNull(gridsOrdinal)
                ? null
                : [.. JsonSerializer.Deserialize<string[]>(reader.GetString(gridsOrdinal)) ?? []];
            accounts.Add(new Account(
                name,
                reader.GetString(reader.GetOrdinal("display_name")),
                role,
                reader.GetString(reader.GetOrdinal("password_hash")),
                reader.GetInt64(reader.GetOrdinal("must_change_password")) == 1,
                grids,
                reader.GetString(reader.GetOrdinal("security_stamp")),
                reader.GetInt32(reader.GetOrdinal("failed_sign_ins")),
                Time(reader, reader.GetOrdinal("locked_until")),
                Time(reader, reader.GetOrdinal("disabled_at")),
                Time(reader, reader.GetOrdinal("created_at"))!.Value,
                reader.GetString(reader.GetOrdinal("created_by"))));
        }

        return accounts;
    }

    private List<ApiToken> ReadTokens(string sql, Action<SqliteParameterCollection> parameters)
    {
        using var command = Query(sql, parameters);
        using var reader = command.ExecuteReader();
        var tokens = new List<ApiToken>();
        while (reader.Read())
        {
            tokens.Add(new ApiToken(
                reader.GetInt64(reader.GetOrdinal("id")),
                reader.GetString(reader.GetOrdinal("account_name")),
                reader.GetString(reader.GetOrdinal("label")),
                reader.GetString(reader.GetOrdinal("prefix")),
                Time(reader, reader.GetOrdinal("created_at"))!.Value,
                reader.GetString(reader.GetOrdinal("created_by")),
                Time(reader, reader.GetOrdinal("last_used_at")),
                Time(reader, reader.GetOrdinal("revoked_at")),
                reader.IsDBNull(reader.GetOrdinal("revoked_by")) ? null : reader.GetString(reader.GetOrdinal("revoked_by"))));
        }

        return tokens;
    }

    private SqliteCommand Query(string sql, Action<SqliteParameterCollection> parameters)
    {
        var command = _connection.CreateCommand();
        command.Transaction = _transaction;
        command.CommandText = sql;
        parameters(command.Parameters);
        return command;
    }

    private static DateTimeOffset? Time(SqliteDataReader reader, int ordinal) =>
        reader.IsDBNull(ordinal) ? null : IsoTime.TryParse(reader.GetString(ordinal), out var t) ? t : null;
}
