using System.Collections.Immutable;
using FeederLocate.Core.Evidence;
using FeederLocate.Storage.Events;

namespace FeederLocate.Storage.Incidents;

/// <summary>
/// An incident as its events add up to: the evidence (<see cref="Incident"/>, with every later indication,
/// measurement and switch state applied in order), the plan steps done, the outcome if logged and not retracted,
/// open or closed.
/// </summary>
/// <param name="OpenedAt">When the incident was logged (not when it was reported: see <see cref="ReportedAt"/>).</param>
/// <param name="EventCount">Events logged for the incident, the opening one included.</param>
public sealed record IncidentState(
    IncidentId Id,
    string GridName,
    Incident Incident,
    IncidentStatus Status,
    ImmutableArray<CompletedPlanStep> CompletedSteps,
    OutcomeInForce? Outcome,
    Actor OpenedBy,
    DateTimeOffset OpenedAt,
    DateTimeOffset? ClosedAt,
    int EventCount)
{
    public DateTimeOffset ReportedAt => Incident.ReportedAt;

    /// <summary>The incident's events left out of this state because they cannot be read or cannot apply.</summary>
    public ImmutableArray<QuarantinedEvent> Quarantined { get; init; } = [];

    /// <summary>
    /// The id of the incident's latest event. Ids increase in commit order across the whole log, so a state
    /// with a greater id is a later one: what caches of anything derived from the incident key on.
    /// </summary>
    public EventId LastEvent { get; init; }
}
