using FeederLocate.Storage.Incidents;

namespace FeederLocate.Storage.Errors;

/// <summary>An event was given for an incident already closed.</summary>
public sealed class IncidentClosedException(IncidentId incident, string eventKind)
    : IncidentStoreException(incident, $"incident {incident} is closed: {eventKind} cannot be logged after incidentClosed")
{
    public string EventKind { get; } = eventKind;
}
