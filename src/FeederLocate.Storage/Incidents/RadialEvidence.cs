using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;
using FeederLocate.Core.Topology;
using FeederLocate.Storage.Errors;
using FeederLocate.Storage.Events;

namespace FeederLocate.Storage.Incidents;

/// <summary>
/// Refuses switch states that give no radial network at fault time, where the grid is known: the ranking, the
/// plan and the learning all need one, and a logged event is never removed.
/// </summary>
internal static class RadialEvidence
{
    /// <summary>Whether logging <paramref name="events"/> can change what the check sees (a switch state) or rely on it (an outcome).</summary>
    public static bool Concerns(IEnumerable<IncidentEvent> events) =>
        events.Any(e => e is SwitchStateChanged or OutcomeLogged);

    public static void Check(IncidentId id, Grid grid, Incident incident, IEnumerable<IncidentEvent> events)
    {
        var after = incident.SwitchStates;
        foreach (var change in events.OfType<SwitchStateChanged>())
        {
            after = after.SetItem(change.Switch, change.Position);
        }

        Check(id, grid, incident with { SwitchStates = after });
    }

    public static void Check(IncidentId id, Grid grid, Incident incident)
    {
        if (incident.SwitchStates.Keys.Any(s => !grid.HasSwitch(s)))
        {
            return; // named as a missing element by the grid reference check
        }

        if (!new NetworkGraph(grid).TryEnergise(SwitchStates.AtFaultTime(grid, incident), out _, out var problem))
        {
            throw new EvidenceNotRadialException(id, problem!);
        }
    }
}
