using FeederLocate.Storage.Events;

namespace FeederLocate.Storage.Incidents;

/// <summary>An incident moved to another version of its grid: from which, to which, why, by whom and when.</summary>
public sealed record GridMove(int FromVersion, int ToVersion, string Reason, Actor Actor, DateTimeOffset At);
