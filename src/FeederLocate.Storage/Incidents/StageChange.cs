using FeederLocate.Storage.Events;

namespace FeederLocate.Storage.Incidents;

/// <summary>An incident's move to <paramref name="Stage"/>, with who made it, when, and the reason given (reopening needs one).</summary>
public sealed record StageChange(IncidentStage Stage, Actor Actor, DateTimeOffset At, string? Reason = null);
