using FeederLocate.Storage.Incidents;

namespace FeederLocate.Storage.Errors;

/// <summary>A retraction was given for an incident that has no outcome in force.</summary>
public sealed class OutcomeNotLoggedException(IncidentId incident)
    : IncidentStoreException(incident, $"incident {incident} has no outcome in force: there is nothing to retract");
