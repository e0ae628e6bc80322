using System.Collections.Immutable;
using FeederLocate.Core.Model;

namespace FeederLocate.Core.Evidence;

/// <summary>Type of fault: the trade's short names.</summary>
public enum FaultType
{
    /// <summary>Single phase to earth.</summary>
    LG,

    /// <summary>Phase to phase, not involving earth.</summary>
    LL,

    /// <summary>Two phases to earth.</summary>
    LLG,

    /// <summary>Three-phase short circuit.</summary>
    LLL,
}

public enum IndicatorState
{
    Fault,
    None,
    Forward,
    Reverse,
    Unknown,
}

public enum IndicationSource
{
    Remote,
    Field,
}

public enum SwitchPosition
{
    Open,
    Closed,
}

/// <summary>One indicator's state as reported by telecontrol or read by a crew.</summary>
/// <param name="Suspect">The operator distrusts this indicator; the ranking leaves it out.</param>
public sealed record Indication(
    IndicatorId Indicator,
    IndicatorState State,
    IndicationSource Source,
    DateTimeOffset? ReadAt = null,
    bool Suspect = false);

/// <summary>Substation record of the feeder breaker <see cref="Device"/>: currents toward the feeder.</summary>
/// <param name="PhaseCurrentA">Largest faulted-phase RMS current.</param>
/// <param name="ResidualCurrentA">|3I0|.</param>
/// <param name="NeutralVoltageV">|U0| at the busbar.</param>
public sealed record SubstationMeasurement(
    SwitchId Device,
    double? PhaseCurrentA = null,
    double? ResidualCurrentA = null,
    double? NeutralVoltageV = null);

/// <summary>
/// What is known of one incident: switch states deviating from normal, the device that cleared the
/// fault (null when nothing tripped), the fault type (null when unknown), substation records and
/// indications. <see cref="ReenergisedAt"/> is the time of the latest trial re-energisation, if any:
/// indications read before it are stale. The protection context (<see cref="FaultAt"/>,
/// <see cref="Reclosing"/>, <see cref="Fuses"/>, <see cref="Relays"/>) is optional.
/// </summary>
public sealed record Incident(
    DateTimeOffset ReportedAt,
    string? GridReference,
    ImmutableDictionary<SwitchId, SwitchPosition> SwitchStates,
    SwitchId? TrippedDevice,
    FaultType? FaultType,
    ImmutableArray<SubstationMeasurement> Measurements,
    ImmutableArray<Indication> Indications,
    DateTimeOffset? ReenergisedAt = null)
{
    /// <summary>When the fault began (first pickup or trip); readings' ages count from it, else from <see cref="ReportedAt"/>.</summary>
    public DateTimeOffset? FaultAt { get; init; }

    /// <summary>The auto-reclose sequence of the tripped device, if reported.</summary>
    public Reclosing? Reclosing { get; init; }

    /// <summary>Fuses found blown or intact.</summary>
    public ImmutableDictionary<SwitchId, FuseCondition> Fuses { get; init; } = ImmutableDictionary<SwitchId, FuseCondition>.Empty;

    /// <summary>Relay results at feeder breakers and reclosers, one per device.</summary>
    public ImmutableArray<RelayResult> Relays { get; init; } = [];

    /// <summary>The instant readings' ages count from: <see cref="FaultAt"/>, else <see cref="ReportedAt"/>.</summary>
    public DateTimeOffset AgeOrigin => FaultAt ?? ReportedAt;

    /// <summary>True where any protection context is given.</summary>
    public bool HasProtectionContext => FaultAt is not null || Reclosing is not null || !Fuses.IsEmpty || !Relays.IsDefaultOrEmpty;

    /// <summary>The indication given for <paramref name="indicator"/>, or null (state unknown).</summary>
    public Indication? IndicationOf(IndicatorId indicator)
    {
        foreach (var indication in Indications)
        {
            if (indication.Indicator == indicator)
            {
                return indication;
            }
        }

        return null;
    }
}
