using System.Collections.Immutable;

namespace FeederLocate.Storage.Maintenance;

/// <summary>
/// Result of checking a database file: SQLite's <c>integrity_check</c> and <c>foreign_key_check</c>.
/// No problem means the file is sound.
/// </summary>
public sealed record IntegrityReport(ImmutableArray<string> Problems)
{
    public bool IsOk => Problems.IsEmpty;

    /// <summary>"ok", or the problems one a line.</summary>
    public override string ToString() => IsOk ? "ok" : string.Join(Environment.NewLine, Problems);
}
