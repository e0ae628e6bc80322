using FeederLocate.Application.Incidents;
using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;
using FeederLocate.Storage;
using FeederLocate.Storage.Events;
using FeederLocate.Storage.Incidents;

namespace FeederLocate.Web.Services;

/// <summary>
/// The control room's incident log (<see cref="IncidentLog"/>), opened on a loaded grid. Every open page is
/// told of changes to its incident, so several operators see each other's work without reloading.
/// </summary>
public sealed class IncidentBoard : IncidentLog
{
    public IncidentBoard(IncidentStore store, Func<string, Grid?>? gridNamed = null)
        : base(store, gridNamed)
    {
    }

    /// <param name="gridVersion">The stored version of a grid: changes to an incident are checked against the version it is pinned to.</param>
    public IncidentBoard(IncidentStore store, Func<string, int, Grid?> gridVersion)
        : base(store, gridVersion)
    {
    }

    public IncidentId Open(LoadedGrid grid, SwitchId? trippedDevice, FaultType? faultType, DateTimeOffset reportedAt, Actor actor)
    {
        ArgumentNullException.ThrowIfNull(grid);
        return Open(grid.Grid, trippedDevice, faultType, reportedAt, actor, grid.Version);
    }

    public IncidentId Open(LoadedGrid grid, Incident incident, Actor actor)
    {
        ArgumentNullException.ThrowIfNull(grid);
        return Open(grid.Grid, incident, actor, grid.Version);
    }
}
