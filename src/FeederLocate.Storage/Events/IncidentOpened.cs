using FeederLocate.Core.Evidence;

namespace FeederLocate.Storage.Events;

/// <summary>The first event of every incident: the grid it happened on, the version of that grid, and the incident as given.</summary>
/// <param name="GridName">The grid's <c>name</c>; outcomes are learned per grid name.</param>
public sealed record IncidentOpened(string GridName, Incident Incident) : IncidentEvent
{
    public DateTimeOffset ReportedAt => Incident.ReportedAt;

    /// <summary>The stored version of the grid the incident was opened on; logs written before versions read as 1.</summary>
    public int GridVersion { get; init; } = 1;
}
