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
public sealed class IncidentBoard(IncidentStore store, Func<string, Grid?>? gridNamed = null) : IncidentLog(store, gridNamed)
{
    public IncidentId Open(LoadedGrid grid, SwitchId? trippedDevice, FaultType? faultType, DateTimeOffset reportedAt, Actor actor)
    {
        ArgumentNullException.ThrowIfNull(grid);
        return Open(grid.Grid, trippedDevice, faultType, reportedAt, actor);
    }

    public IncidentId Open(LoadedGrid grid, Incident incident, Actor actor)
    {
        ArgumentNullException.ThrowIfNull(grid);
        return Open(grid.Grid, incident, actor);
    }
}
