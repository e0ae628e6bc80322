using FeederLocate.Core.Model;
using FeederLocate.Storage.Errors;
using FeederLocate.Storage.Events;
using FeederLocate.Storage.Incidents;

namespace FeederLocate.Storage.Database;

/// <summary>Checks that events given with a grid belong to the incident's grid and name only its elements.</summary>
internal static class GridReferences
{
    public static void Check(IncidentId incident, string incidentGrid, Grid grid, IEnumerable<IncidentEvent> events)
    {
        if (!string.Equals(grid.Name, incidentGrid, StringComparison.Ordinal))
        {
            throw IncidentGridMismatchException.OtherGrid(incident, incidentGrid, grid.Name);
        }

        foreach (var e in events)
        {
            if (MissingElement(grid, e) is { } element)
            {
                throw IncidentGridMismatchException.MissingElement(incident, incidentGrid, element);
            }
        }
    }

    private static string? MissingElement(Grid grid, IncidentEvent e) => e switch
    {
        IndicationEntered { Indication.Indicator: var id } when !grid.HasIndicator(id) => $"indicator {id}",
        MeasurementRecorded { Measurement.Device: var id } when !grid.HasSwitch(id) => $"switch {id}",
        SwitchStateChanged { Switch: var id } when !grid.HasSwitch(id) => $"switch {id}",
        TripAmended { TrippedDevice: { } id } when !grid.HasSwitch(id) => $"switch {id}",
        SwitchingDeviationRecorded { Switch: var id } when !grid.HasSwitch(id) => $"switch {id}",
        OutcomeLogged { ConfirmedSegment: var id } when !grid.HasSegment(id) => $"segment {id}",
        ProtectionRecorded p => p.Fuses.Keys.Concat(p.Relays.Select(r => r.Device)).Concat(p.Reclosing is { } r ? [r.Device] : [])
            .Where(id => !grid.HasSwitch(id)).Select(id => $"switch {id}").FirstOrDefault(),
        _ => null,
    };
}
