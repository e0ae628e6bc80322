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
            outcome?.FaultType ?? state.NoFaultFound?.Finding.FaultType ?? state.Incident.FaultType,
            outcome?.ConfirmedSegment,
            outcome?.Cause,
            outcome?.Notes,
            state.EventCount)
        {
            Stage = state.Stage,
            NoFaultFound = state.NoFaultFound is not null,
            Transient = state.NoFaultFound?.Finding.Transient ?? false,
            Notes = outcome?.Notes ?? state.NoFaultFound?.Finding.Notes,
        };
    }

    /// <summary>Where the incident stands (open when the summary was made without its stages).</summary>
    public IncidentStage Stage { get; init; }

    /// <summary>True when the outcome in force is no fault found: no segment is confirmed.</summary>
    public bool NoFaultFound { get; init; }

    /// <summary>Of a no-fault-found outcome: the fault cleared by itself.</summary>
    public bool Transient { get; init; }
}
