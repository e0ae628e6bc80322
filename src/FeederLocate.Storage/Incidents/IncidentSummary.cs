using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;

namespace FeederLocate.Storage.Incidents;

/// <summary>One line of the incident list.</summary>
/// <param name="FaultType">The confirmed fault type when an outcome gives one, else the type reported; null when unknown.</param>
public sealed record IncidentSummary(
    IncidentId Id,
    string GridName,
    DateTimeOffset ReportedAt,
    IncidentStatus Status,
    FaultType? FaultType,
    SegmentId? ConfirmedSegment,
    string? Cause,
    string? Notes,
    int EventCount)
{
    public static IncidentSummary Of(IncidentState state)
    {
        ArgumentNullException.ThrowIfNull(state);
        var outcome = state.Outcome?.Outcome;
        return new IncidentSummary(
            state.Id,
            state.GridName,
            state.ReportedAt,
            state.Status,
            outcome?.FaultType ?? state.Incident.FaultType,
            outcome?.ConfirmedSegment,
            outcome?.Cause,
            outcome?.Notes,
            state.EventCount)
        {
            Stage = state.Stage,
        };
    }

    /// <summary>Where the incident stands (open when the summary was made without its stages).</summary>
    public IncidentStage Stage { get; init; }
}
