using FeederLocate.Core.Evidence;

namespace FeederLocate.Storage.Events;

/// <summary>The first event of every incident: the grid it happened on and the incident as given.</summary>
/// <param name="GridName">The grid's <c>name</c>; outcomes are learned per grid name.</param>
public sealed record IncidentOpened(string GridName, Incident Incident) : IncidentEvent
{
    public DateTimeOffset ReportedAt => Incident.ReportedAt;
}
