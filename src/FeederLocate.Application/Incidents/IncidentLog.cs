using System.Collections.Immutable;
using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;
using FeederLocate.Storage;
using FeederLocate.Storage.Events;
using FeederLocate.Storage.Incidents;

namespace FeederLocate.Application.Incidents;

/// <summary>
/// The incidents, kept in the SQLite incident log, for any number of callers at once: every read and write
/// goes through one store under a lock (a store is for one thread), and every change is announced with the
/// incident's id so open views can follow it.
/// </summary>
public class IncidentLog : IDisposable
{
    private readonly IncidentStore _store;
    private readonly Func<string, int, Grid?> _gridVersion;
    private readonly Lock _gate = new();

    /// <param name="gridNamed">The loaded grid of a name, if any: every change is checked against it (its elements, radial switch states).</param>
    public IncidentLog(IncidentStore store, Func<string, Grid?>? gridNamed = null)
        : this(store, gridNamed is null ? (_, _) => null : (name, _) => gridNamed(name))
    {
    }

    /// <param name="gridVersion">
    /// The stored version of a grid (name, version), if any: every change to an incident is checked against the
    /// version it is pinned to (its elements, radial switch states).
    /// </param>
    public IncidentLog(IncidentStore store, Func<string, int, Grid?> gridVersion)
    {
        ArgumentNullException.ThrowIfNull(store);
        ArgumentNullException.ThrowIfNull(gridVersion);
        _store = store;
        _gridVersion = gridVersion;
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

    /// <summary>Every incident, the most recently reported first.</summary>
    public IReadOnlyList<IncidentSummary> List()
    {
        lock (_gate)
        {
            return [.. _store.Incidents().OrderByDescending(i => i.ReportedAt)];
        }
    }

    /// <summary>The incident as its events add up to; throws <see cref="Storage.Errors.UnknownIncidentException"/> for an id not logged.</summary>
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

    /// <summary>The incidents of the grid named <paramref name="gridName"/> with an outcome logged (see <see cref="IncidentStore.Outcomes"/>).</summary>
    public IReadOnlyList<IncidentOutcome> Outcomes(string gridName)
    {
        lock (_gate)
        {
            return _store.Outcomes(gridName);
        }
    }

    /// <summary>
    /// Opens an incident as given in the incident format on stored version <paramref name="gridVersion"/> of
    /// <paramref name="grid"/>, which it stays pinned to; switch states that give no radial network are refused.
    /// </summary>
    public IncidentId Open(Grid grid, Incident incident, Actor actor, int gridVersion = 1)
    {
        ArgumentNullException.ThrowIfNull(grid);
        IncidentId id;
        lock (_gate)
        {
            id = _store.OpenIncident(grid, incident, actor, gridVersion);
        }

        Changed?.Invoke(id);
        return id;
    }

    /// <summary>Opens an incident from the substation's first report: the tripped device (none for a standing earth fault) and the fault type.</summary>
    public IncidentId Open(Grid grid, SwitchId? trippedDevice, FaultType? faultType, DateTimeOffset reportedAt, Actor actor, int gridVersion = 1) =>
        Open(grid, new Incident(reportedAt, null, ImmutableDictionary<SwitchId, SwitchPosition>.Empty, trippedDevice, faultType, [], []), actor, gridVersion);

    /// <summary>Logs a past incident whose patrol found no fault, with that outcome, and closes it, in one transaction.</summary>
    public IncidentId Append(Grid grid, Incident incident, NoFaultFoundLogged outcome, Actor actor)
    {
        IncidentId id;
        lock (_gate)
        {
            id = _store.Append(grid, incident, outcome, actor);
        }

        Changed?.Invoke(id);
        return id;
    }

    /// <summary>Logs a past incident with where its fault was confirmed, and closes it, in one transaction.</summary>
    public IncidentId Append(Grid grid, Incident incident, OutcomeLogged outcome, Actor actor)
    {
        IncidentId id;
        lock (_gate)
        {
            id = _store.Append(grid, incident, outcome, actor);
        }

        Changed?.Invoke(id);
        return id;
    }

    /// <summary>Appends one change; see <see cref="AppendAll"/>.</summary>
    public void Append(IncidentId id, IncidentEvent change, Actor actor, Grid? grid = null) => AppendAll(id, [change], actor, grid);

    /// <summary>
    /// Appends every change in one transaction (all or none), checked against the grid given or else the stored
    /// version of its grid the incident is pinned to: its elements, and switch states that give a radial network.
    /// </summary>
    public void AppendAll(IncidentId id, IReadOnlyList<IncidentEvent> changes, Actor actor, Grid? grid = null)
    {
        lock (_gate)
        {
            var state = _store.State(id);
            _store.Append(id, changes, actor, grid ?? _gridVersion(state.GridName, state.GridVersion));
        }

        Changed?.Invoke(id);
    }

    public void Dispose()
    {
        Dispose(disposing: true);
        GC.SuppressFinalize(this);
    }

    protected virtual void Dispose(bool disposing)
    {
        if (disposing)
        {
            _store.Dispose();
        }
    }
}
