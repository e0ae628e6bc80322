using FeederLocate.Storage.Events;

namespace FeederLocate.Storage.Grids;

/// <summary>
/// One stored version of a grid: its number among the versions of its name (1, 2, …), the SHA-256 of its text,
/// who loaded it, when, why and from which file. The text itself is read with <see cref="GridVersionStore.TextOf"/>.
/// </summary>
public sealed record GridVersion(
    string GridName,
    int Version,
    string ContentSha256,
    DateTimeOffset LoadedAt,
    Actor LoadedBy,
    string? Reason,
    string? Source);
