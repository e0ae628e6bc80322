namespace FeederLocate.Storage.Accounts;

/// <summary>A bearer token as kept: its label and the first characters of its secret, never the secret itself.</summary>
public sealed record ApiToken(
    long Id,
    string AccountName,
    string Label,
    string Prefix,
    DateTimeOffset CreatedAt,
    string CreatedBy,
    DateTimeOffset? LastUsedAt,
    DateTimeOffset? RevokedAt,
    string? RevokedBy)
{
    public bool IsRevoked => RevokedAt is not null;
}

/// <summary>A token just issued: <see cref="Secret"/> is shown once and never kept.</summary>
public sealed record IssuedApiToken(ApiToken Token, string Secret);

/// <summary>An account change as logged: who, what, to whom.</summary>
public sealed record AccountChange(DateTimeOffset Time, string Actor, string Action, string Subject, string? Detail);
