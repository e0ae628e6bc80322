using FeederLocate.Storage.Events;

namespace FeederLocate.Storage.Incidents;

/// <summary>
/// A logged event left out of its incident's state because it cannot be read or cannot apply (for instance
/// an event after the closing). It stays in the file, untouched; <c>integrity</c> and the engineer's pages name it.
/// </summary>
public sealed record QuarantinedEvent(EventId Event, IncidentId Incident, int Sequence, string Kind, string Problem)
{
    public override string ToString() => $"event {Event} (incident {Incident}, #{Sequence}, {Kind}) is quarantined: {Problem}";
}
