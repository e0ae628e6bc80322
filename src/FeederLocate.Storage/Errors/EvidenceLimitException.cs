using FeederLocate.Storage.Incidents;

namespace FeederLocate.Storage.Errors;

/// <summary>
/// A change over one of the evidence limits (<see cref="Core.Evidence.EvidenceLimits"/>): a text too long, or too many
/// substation measurements in one incident. Nothing of the change is logged.
/// </summary>
public sealed class EvidenceLimitException(IncidentId incident, string field, string message)
    : IncidentStoreException(incident, $"incident {incident}: {field} {message}")
{
    /// <summary>The field over its limit, as the incident format and the API name it.</summary>
    public string Field { get; } = field;
}
