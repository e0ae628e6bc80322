namespace FeederLocate.Storage.Events;

/// <summary>
/// Something that happened to an incident, as logged. Events are never changed or removed; the state of an
/// incident is what its events add up to (see <see cref="Incidents.IncidentState"/>).
/// </summary>
public abstract record IncidentEvent;
