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
    private readonly Func<string, Grid?> _gridNamed;
    private readonly Lock _gate = new();

    /// <param name="gridNamed">The loaded grid of a name, if any: every change is checked against it (elements, radial switch states).</param>
    public IncidentBoard(IncidentStore store, Func<string, Grid?>? gridNamed = null)
    {
        _store = store;
        _gridNamed = gridNamed ?? (_ => null);
    }

    /// <summary>The database file.</summary>
    public string DatabasePath => _store.Path;

    /// <summary>Every logged event left out of its incident's state (see <see cref="IncidentStore.Quarantine"/>).</summary>
    public IReadOnlyList<QuarantinedEvent> Quarantine()
    {
        lock (_gate)
        {
            return _store.Quarantine();
        }
    }

    /// <summary>SQLite's quick check of every page, and the quarantined events.</summary>
    public Storage.Maintenance.IntegrityReport QuickCheck()
    {
        lock (_gate)
        {
            return _store.QuickCheck() with { Quarantined = [.. _store.Quarantine()] };
        }
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
            _store.Append(id, changes, actor, grid ?? _gridNamed(_store.State(id).GridName));
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
            id = _store.OpenIncident(grid.Grid, incident, actor);
        }

        Changed?.Invoke(id);
        return id;
    }

    public void Dispose() => _store.Dispose();
}
