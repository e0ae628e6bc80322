using FeederLocate.Core.Evidence;
using FeederLocate.Core.Learning;
using FeederLocate.Core.Model;
using FeederLocate.Storage.Events;

namespace FeederLocate.Storage.Incidents;

/// <summary>A past incident of a grid with its confirmed fault location: what learning and the ranking use.</summary>
/// <param name="Incident">The evidence as it stood when last updated (later indications applied).</param>
public sealed record RecordedOutcome(IncidentId Id, Incident Incident, SegmentId ConfirmedSegment, DateTimeOffset ReportedAt)
{
    public ConfirmedFault ToConfirmedFault() => new(ConfirmedSegment, ReportedAt);

    /// <summary>The id of the incident's latest event (its evidence or its outcome may have changed since an earlier read).</summary>
    public EventId LastEvent { get; init; }
}
