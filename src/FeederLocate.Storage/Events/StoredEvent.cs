using FeederLocate.Storage.Incidents;

namespace FeederLocate.Storage.Events;

/// <summary>An event as logged: its id, its place in the incident (1, 2, …), when and by whom.</summary>
/// <param name="Time">When it was logged (UTC).</param>
public sealed record StoredEvent(
    EventId Id,
    IncidentId Incident,
    int Sequence,
    DateTimeOffset Time,
    Actor Actor,
    IncidentEvent Event)
{
    /// <summary>The kind as stored, for instance <c>indicationEntered</c>.</summary>
    public string Kind => EventPayload.KindOf(Event);
}
