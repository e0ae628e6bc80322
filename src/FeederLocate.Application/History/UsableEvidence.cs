using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;

namespace FeederLocate.Application.History;

/// <summary>
/// Whether logged evidence still fits the grid as loaded now: a grid of the same name may have been edited since,
/// and learning from evidence that names elements it no longer has would refine a fault on the wrong network.
/// </summary>
public static class UsableEvidence
{
    /// <summary>The first element the evidence names that <paramref name="grid"/> lacks, as a message; null when every one is there.</summary>
    public static string? Problem(Grid grid, Incident incident)
    {
        ArgumentNullException.ThrowIfNull(grid);
        ArgumentNullException.ThrowIfNull(incident);
        foreach (var device in incident.SwitchStates.Keys.Concat(incident.Measurements.Select(m => m.Device))
                     .Concat(incident.TrippedDevice is { } tripped ? [tripped] : []))
        {
            if (!grid.HasSwitch(device))
            {
                return $"names switching device \"{device}\", which grid {grid.Name} no longer has";
            }
        }

        foreach (var indication in incident.Indications)
        {
            if (!grid.HasIndicator(indication.Indicator))
            {
                return $"names indicator \"{indication.Indicator}\", which grid {grid.Name} no longer has";
            }
        }

        return null;
    }
}
