using System.Collections.Immutable;

namespace FeederLocate.Storage.Accounts;

/// <summary>
/// A person or system that signs in. <see cref="PasswordHash"/> is the hasher's output, never the password.
/// <see cref="Grids"/> lists the grids whose incidents the account may see; null means every grid.
/// <see cref="SecurityStamp"/> changes with every change of password, role, grids or status, which ends open sessions.
/// </summary>
public sealed record Account(
    string Name,
    string DisplayName,
    AccountRole Role,
    string PasswordHash,
    bool MustChangePassword,
    ImmutableArray<string>? Grids,
    string SecurityStamp,
    int FailedSignIns,
    DateTimeOffset? LockedUntil,
    DateTimeOffset? DisabledAt,
    DateTimeOffset CreatedAt,
    string CreatedBy)
{
    public bool IsDisabled => DisabledAt is not null;

    public bool IsLockedAt(DateTimeOffset now) => LockedUntil is { } until && until > now;

    /// <summary>Whether the account may see incidents of the grid named <paramref name="gridName"/>.</summary>
    public bool MaySee(string gridName) => Grids is not { } grids || grids.Contains(gridName, StringComparer.Ordinal);
}
