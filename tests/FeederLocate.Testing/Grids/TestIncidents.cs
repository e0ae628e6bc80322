using System.Collections.Immutable;
using FeederLocate.Core.Evidence;
using FeederLocate.Core.Formats;
using FeederLocate.Core.Model;

namespace FeederLocate.Testing;

/// <summary>Incidents on <see cref="TestGrids.Brackenfold"/>.</summary>
public static class TestIncidents
{
    public static readonly DateTimeOffset ReportedAt = new(2026, 3, 14, 5, 40, 0, TimeSpan.Zero);

    /// <summary>An earth fault tripped by CB1: FI1 fault, FI2 forward, CB1's record, LB2 found closed.</summary>
    public static Incident EarthFault(DateTimeOffset? reportedAt = null) => new(
        reportedAt ?? ReportedAt,
        "brackenfold.grid.json",
        ImmutableDictionary<SwitchId, SwitchPosition>.Empty.Add(new SwitchId("LB2"), SwitchPosition.Closed),
        new SwitchId("CB1"),
        FaultType.LG,
        [new SubstationMeasurement(new SwitchId("CB1"), PhaseCurrentA: 2140, ResidualCurrentA: 38.5)],
        [
            new Indication(new IndicatorId("FI1"), IndicatorState.Fault, IndicationSource.Remote, ReportedAt.AddMinutes(1)),
            new Indication(new IndicatorId("FI2"), IndicatorState.Forward, IndicationSource.Remote),
        ]);

    /// <summary>
    /// The incident in its canonical text: incidents hold immutable collections, which compare by reference,
    /// so tests compare what the incident format writes.
    /// </summary>
    public static string Text(Incident incident) => IncidentWriter.Write(incident);
}
