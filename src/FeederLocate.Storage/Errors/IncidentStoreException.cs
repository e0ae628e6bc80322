using FeederLocate.Storage.Incidents;

namespace FeederLocate.Storage.Errors;

/// <summary>A request the incident log refuses; <see cref="Incident"/> names the incident it concerned.</summary>
public abstract class IncidentStoreException(IncidentId incident, string message) : Exception(message)
{
    public IncidentId Incident { get; } = incident;
}
