using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;
using FeederLocate.Storage;
using FeederLocate.Storage.Events;
using FeederLocate.Storage.Incidents;

namespace FeederLocate.Web.Services;

/// <summary>
/// The incidents of the control room, kept in the SQLite incident log. Every change is an event in
/// the log; every open page is told of changes to its incident, so several operators see each other's
/// work without reloading.
/// </summary>
public sealed class IncidentBoard : IDisposable
{
    private readonly IncidentStore _store;
    private readonly Lock _gate = new();

    public IncidentBoard(IncidentStore store)
    {
        _store = store;
    }

    /// <summary>Raised after an incident changed, with its id.</summary>
    public event Action<IncidentId>? Changed;

    public IReadOnlyList<IncidentSummary> List()
    {
        lock (_gate)
        {
            return [.. _store.Incidents().OrderByDescending(i => i.ReportedAt)];
        }
    }

    public IncidentState State(IncidentId id)
    {
        lock (_gate)
        {
            return _store.State(id);
        }
    }

    public IReadOnlyList<StoredEvent> Events(IncidentId id)
    {
        lock (_gate)
        {
            return _store.Events(id);
        }
    }

    public IReadOnlyList<RecordedOutcome> Outcomes(string gridName)
    {
        lock (_gate)
        {
            return _store.Outcomes(gridName);
        }
    }

    public IncidentId Open(LoadedGrid grid, SwitchId? trippedDevice, FaultType? faultType, DateTimeOffset reportedAt, Actor actor)
    {
        ArgumentNullException.ThrowIfNull(grid);
        var incident = new Incident(reportedAt, null, System.Collections.Immutable.ImmutableDictionary<SwitchId, SwitchPosition>.Empty,
            trippedDevice, faultType, [], []);
        IncidentId id;
        lock (_gate)
        {
            id = _store.OpenIncident(grid.Name, incident, actor);
        }

        Changed?.Invoke(id);
        return id;
    }

    public void Record(IncidentId id, IncidentEvent change, Actor actor) => RecordAll(id, [change], actor);

    /// <summary>Appends every change in one transaction (all or none), checked against the grid when given.</summary>
    public void RecordAll(IncidentId id, IReadOnlyList<IncidentEvent> changes, Actor actor, Core.Model.Grid? grid = null)
    {
        lock (_gate)
        {
            _store.Append(id, changes, actor, grid);
        }

        Changed?.Invoke(id);
    }

    /// <summary>Opens an incident as given in the incident format.</summary>
    public IncidentId Open(LoadedGrid grid, Incident incident, Actor actor)
    {
        ArgumentNullException.ThrowIfNull(grid);
        IncidentId id;
        lock (_gate)
        {
            id = _store.OpenIncident(grid.Name, incident, actor);
        }

        Changed?.Invoke(id);
        return id;
    }

    public void Dispose() => _store.Dispose();
}
