using System.Collections.Immutable;
using FeederLocate.Storage.Incidents;

namespace FeederLocate.Storage.Maintenance;

/// <summary>
/// Result of checking a database file: SQLite's <c>integrity_check</c> and <c>foreign_key_check</c>, and the
/// logged events the incidents' states leave out (<see cref="Quarantined"/>). No problem means the file is sound.
/// </summary>
public sealed record IntegrityReport(ImmutableArray<string> Problems)
{
    /// <summary>Events that cannot be read or cannot apply, each named with its incident.</summary>
    public ImmutableArray<QuarantinedEvent> Quarantined { get; init; } = [];

    public bool IsOk => Problems.IsEmpty && Quarantined.IsEmpty;

    /// <summary>"ok", or the problems one a line.</summary>
    public override string ToString() =>
        IsOk ? "ok" : string.Join(Environment.NewLine, Problems.Concat(Quarantined.Select(q => q.ToString())));
}
