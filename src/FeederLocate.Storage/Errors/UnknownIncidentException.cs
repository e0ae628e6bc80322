using FeederLocate.Storage.Incidents;

namespace FeederLocate.Storage.Errors;

/// <summary>No incident with this id is logged in the database.</summary>
public sealed class UnknownIncidentException(IncidentId incident, string path)
    : IncidentStoreException(incident, $"incident {incident} does not exist in {path}");
