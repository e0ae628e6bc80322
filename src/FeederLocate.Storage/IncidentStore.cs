using System.Collections.Immutable;
using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;
using FeederLocate.Storage.Database;
using FeederLocate.Storage.Errors;
using FeederLocate.Storage.Events;
using FeederLocate.Storage.Incidents;
using FeederLocate.Storage.Maintenance;
using FeederLocate.Storage.Migrations;
using Microsoft.Data.Sqlite;

namespace FeederLocate.Storage;

/// <summary>
/// The incident log in one SQLite file: an append-only list of events per incident, from which each
/// incident's state is derived. Several processes may read and write the same file at once (write-ahead
/// log, busy timeout, every change in one immediate transaction). One instance is for one thread.
/// </summary>
public sealed class IncidentStore : IDisposable
{
    private readonly SqliteConnection _connection;
    private readonly TimeProvider _clock;
    private readonly IncidentCache _cache = new();
    private readonly FileWatch _file;

    private IncidentStore(string path, SqliteConnection connection, TimeProvider clock, int schemaVersion)
    {
        Path = path;
        _file = new FileWatch(path);
        _connection = connection;
        _clock = clock;
        SchemaVersion = schemaVersion;
    }

    /// <summary>The database file.</summary>
    public string Path { get; }

    /// <summary>The schema version of the file once opened: always <see cref="LatestSchemaVersion"/>.</summary>
    public int SchemaVersion { get; }

    /// <summary>The schema version this program writes.</summary>
    public static int LatestSchemaVersion => SchemaMigrator.LatestVersion;

    internal SqliteConnection Connection => _connection;

    /// <summary>
    /// Opens the database at <paramref name="path"/>, creating the file if absent and bringing its schema up
    /// to date. <paramref name="clock"/> stamps the events (the system clock by default).
    /// Throws <see cref="SchemaVersionException"/> for a file written by a newer program.
    /// </summary>
    public static IncidentStore Open(string path, TimeProvider? clock = null) => Open(path, clock, create: true);

    /// <summary>
    /// Opens an existing database; throws <see cref="DatabaseMissingException"/>, creating nothing, when there is
    /// no file at <paramref name="path"/> (commands that only read or check a database).
    /// </summary>
    public static IncidentStore OpenExisting(string path, TimeProvider? clock = null) => Open(path, clock, create: false);

    private static IncidentStore Open(string path, TimeProvider? clock, bool create)
    {
        ArgumentException.ThrowIfNullOrWhiteSpace(path);
        clock ??= TimeProvider.System;
        if (!create && !File.Exists(path))
        {
            throw new DatabaseMissingException(path);
        }

        var connection = StoreConnection.Open(path, create);
        try
        {
            var version = SchemaMigrator.Migrate(connection, clock, path);
            return new IncidentStore(path, connection, clock, version);
        }
        catch
        {
            connection.Dispose();
            throw;
        }
    }

    /// <summary>Logs a new incident on version <paramref name="gridVersion"/> of the grid named <paramref name="gridName"/>; returns its id.</summary>
    public IncidentId OpenIncident(string gridName, Incident incident, Actor actor, int gridVersion = 1) =>
        Write(transaction => OpenIn(transaction, gridName, incident, actor, gridVersion));

    /// <summary>
    /// Logs a new incident on <paramref name="grid"/>, stored version <paramref name="gridVersion"/>; switch states that give no radial network are refused
    /// (<see cref="EvidenceNotRadialException"/>) and nothing is logged.
    /// </summary>
    public IncidentId OpenIncident(Grid grid, Incident incident, Actor actor, int gridVersion = 1)
    {
        ArgumentNullException.ThrowIfNull(grid);
        return Write(transaction =>
        {
            var id = OpenIn(transaction, grid.Name, incident, actor, gridVersion);
            RadialEvidence.Check(id, grid, incident);
            return id;
        });
    }

    /// <summary>
    /// Logs an incident with its confirmed fault location and closes it, all in one transaction: the
    /// <c>record</c> command. The outcome's segment must be in <paramref name="grid"/>.
    /// </summary>
    public IncidentId Append(Grid grid, Incident incident, OutcomeLogged outcome, Actor actor, int gridVersion = 1) =>
        AppendPast(grid, incident, outcome, actor, gridVersion);

    /// <summary>Logs an incident whose patrol found no fault, with that outcome, and closes it, in one transaction.</summary>
    public IncidentId Append(Grid grid, Incident incident, NoFaultFoundLogged outcome, Actor actor, int gridVersion = 1) =>
        AppendPast(grid, incident, outcome, actor, gridVersion);

    private IncidentId AppendPast(Grid grid, Incident incident, IncidentEvent outcome, Actor actor, int gridVersion)
    {
        ArgumentNullException.ThrowIfNull(grid);
        ArgumentNullException.ThrowIfNull(outcome);
        return Write(transaction =>
        {
            var id = OpenIn(transaction, grid.Name, incident, actor, gridVersion);
            RadialEvidence.Check(id, grid, incident);
            AppendIn(transaction, id, [outcome, new IncidentClosed()], actor, grid);
            return id;
        });
    }

    /// <summary>Appends one event to an open incident; see <see cref="Append(IncidentId, IReadOnlyList{IncidentEvent}, Actor, Grid?)"/>.</summary>
    public StoredEvent Append(IncidentId incident, IncidentEvent e, Actor actor, Grid? grid = null) =>
        Append(incident, [e], actor, grid)[0];

    /// <summary>
    /// Appends events, in order, to an open incident in one transaction: all are logged or none.
    /// With <paramref name="grid"/> given, it must be the incident's grid and the events may name only its
    /// elements (<see cref="IncidentGridMismatchException"/>), and switch states that close a loop or parallel two
    /// substations, or an outcome on such states, are refused (<see cref="EvidenceNotRadialException"/>). Throws <see cref="UnknownIncidentException"/>
    /// for an id not logged and <see cref="IncidentClosedException"/> for a closed incident.
    /// </summary>
    public IReadOnlyList<StoredEvent> Append(IncidentId incident, IReadOnlyList<IncidentEvent> events, Actor actor, Grid? grid = null)
    {
        ArgumentNullException.ThrowIfNull(events);
        ArgumentNullException.ThrowIfNull(actor);
        if (events.Any(e => e is OutcomeRetracted))
        {
            CheckRetractions(incident, events);
        }

        if (events.Any(e => e is MeasurementRecorded))
        {
            CheckMeasurementCount(incident, events);
        }

        if (events.Any(e => e is IncidentGridMoved))
        {
            CheckGridMoves(incident, events);
        }

        if (grid is not null && RadialEvidence.Concerns(events) && State(incident) is { } state
            && string.Equals(state.GridName, grid.Name, StringComparison.Ordinal))
        {
            GridReferences.Check(incident, state.GridName, grid, events);
            RadialEvidence.Check(incident, grid, state.Incident, events);
        }

        return Write(transaction => AppendIn(transaction, incident, events, actor, grid));
    }

    /// <summary>The incident's events in order; throws <see cref="UnknownIncidentException"/> for an id not logged.</summary>
    public IReadOnlyList<StoredEvent> Events(IncidentId incident)
    {
        var events = _cache.EventsOf(_connection, incident);
        return events.Count > 0 || EventTable.IncidentExists(_connection, incident)
            ? events
            : throw new UnknownIncidentException(incident, Path);
    }

    /// <summary>The incident as its events add up to; throws <see cref="UnknownIncidentException"/> for an id not logged.</summary>
    public IncidentState State(IncidentId incident) =>
        _cache.StateOf(_connection, incident) ?? IncidentFold.Fold(Events(incident));

    /// <summary>Every logged incident, by id.</summary>
    public IReadOnlyList<IncidentSummary> Incidents() =>
        States(gridName: null).Select(IncidentSummary.Of).ToList();

    /// <summary>
    /// Every incident of the grid named <paramref name="gridName"/> (exact match) with an outcome logged, by id,
    /// each with its evidence as last updated and the confirmed segment.
    /// </summary>
    public IReadOnlyList<IncidentOutcome> Outcomes(string gridName)
    {
        ArgumentNullException.ThrowIfNull(gridName);
        return States(gridName)
            .Where(s => s.Outcome is not null)
            .Select(s => new IncidentOutcome(s.Id, s.Incident, s.Outcome!.Outcome.ConfirmedSegment, s.ReportedAt) { LastEvent = s.LastEvent })
            .ToList();
    }

    /// <summary>Writes a consistent copy of the database to <paramref name="destinationPath"/> while it stays in use.</summary>
    public void BackupTo(string destinationPath) => DatabaseChecks.Backup(_connection, Path, destinationPath);

    /// <summary>Runs SQLite's integrity and foreign key checks on the file, and names every quarantined event.</summary>
    public IntegrityReport CheckIntegrity()
    {
        var report = DatabaseChecks.Check(_connection);
        return report with { Quarantined = QuarantinedSafely() };
    }

    /// <summary>SQLite's quick check of every page (seconds on a large file, not minutes): the start-up check.</summary>
    public IntegrityReport QuickCheck() => DatabaseChecks.QuickCheck(_connection);

    /// <summary>
    /// Every logged event left out of its incident's state because it cannot be read or cannot apply where it
    /// stands; a whole incident when its opening event cannot be read. The rest is served as usual.
    /// </summary>
    public IReadOnlyList<QuarantinedEvent> Quarantine() => _cache.Quarantine(_connection);

    private ImmutableArray<QuarantinedEvent> QuarantinedSafely()
    {
        try
        {
            return [.. Quarantine()];
        }
        catch (SqliteException)
        {
            return [];
        }
    }

    public void Dispose() => _connection.Dispose();

    private IEnumerable<IncidentState> States(string? gridName) => _cache.States(_connection, gridName);

    private T Write<T>(Func<SqliteTransaction, T> change)
    {
        // BeginTransaction() is BEGIN IMMEDIATE: the write lock is taken (waiting up to the busy timeout)
        // before anything is read, so the sequence number read below cannot be taken by another process.
        _file.EnsureUnchanged();
        using var transaction = _connection.BeginTransaction();
        var result = change(transaction);
        transaction.Commit();
        return result;
    }

    private IncidentId OpenIn(SqliteTransaction transaction, string gridName, Incident incident, Actor actor, int gridVersion)
    {
        ArgumentException.ThrowIfNullOrWhiteSpace(gridName);
        ArgumentOutOfRangeException.ThrowIfLessThan(gridVersion, 1);
        ArgumentNullException.ThrowIfNull(incident);
        ArgumentNullException.ThrowIfNull(actor);
        var now = _clock.GetUtcNow();
        var id = EventTable.InsertIncident(_connection, transaction, gridName, incident.ReportedAt, now);
        EventTable.InsertEvent(_connection, transaction, id, 1, now, actor, new IncidentOpened(gridName, incident) { GridVersion = gridVersion });
        if (incident.Measurements.Length > EvidenceLimits.MaxMeasurementsPerIncident)
        {
            throw new EvidenceLimitException(id, "measurements",
                $"holds {incident.Measurements.Length} records; at most {EvidenceLimits.MaxMeasurementsPerIncident} are accepted in one incident");
        }

        return id;
    }

    private List<StoredEvent> AppendIn(SqliteTransaction transaction, IncidentId incident, IReadOnlyList<IncidentEvent> events, Actor actor, Grid? grid)
    {
        foreach (var e in events)
        {
            CheckEvent(incident, e);
        }

        var head = EventTable.ReadHead(_connection, transaction, incident) ?? throw new UnknownIncidentException(incident, Path);
        if (grid is not null)
        {
            GridReferences.Check(incident, head.GridName, grid, events);
        }

        var stored = new List<StoredEvent>(events.Count);
        var closed = head.Closed;
        var sequence = head.LastSequence;
        var now = _clock.GetUtcNow();
        foreach (var e in events)
        {
            if (closed && e is not (OutcomeRetracted or IncidentReopened))
            {
                throw new IncidentClosedException(incident, EventPayload.KindOf(e));
            }

            if (!closed && e is IncidentReopened)
            {
                throw new InvalidOperationException($"incident {incident} is open: only a closed incident is reopened");
            }

            stored.Add(EventTable.InsertEvent(_connection, transaction, incident, ++sequence, now, actor, e));
            closed |= e is IncidentClosed;
        }

        return stored;
    }

    /// <summary>A retraction needs an outcome in force where it stands: the one logged, or one earlier in the batch.</summary>
    private void CheckRetractions(IncidentId incident, IReadOnlyList<IncidentEvent> events)
    {
        var inForce = State(incident).HasOutcome;
        foreach (var e in events)
        {
            if (e is OutcomeRetracted)
            {
                inForce = inForce ? false : throw new OutcomeNotLoggedException(incident);
            }
            else if (e is OutcomeLogged or NoFaultFoundLogged)
            {
                inForce = true;
            }
        }
    }

    /// <summary>A grid move starts from the version the incident stands on where it is appended.</summary>
    private void CheckGridMoves(IncidentId incident, IReadOnlyList<IncidentEvent> events)
    {
        var version = State(incident).GridVersion;
        foreach (var move in events.OfType<IncidentGridMoved>())
        {
            version = move.FromVersion == version
                ? move.ToVersion
                : throw new InvalidOperationException($"incident {incident} stands on grid version {version}, not {move.FromVersion}: the move is refused");
        }
    }

    private static void CheckLength(IncidentId incident, string field, string? text, int maxChars)
    {
        if (text is not null && text.Length > maxChars)
        {
            throw new EvidenceLimitException(incident, field, $"holds {text.Length} characters; at most {maxChars} are accepted");
        }
    }

    /// <summary>At most <see cref="EvidenceLimits.MaxMeasurementsPerIncident"/> devices with a substation measurement, however many posts bring them.</summary>
    private void CheckMeasurementCount(IncidentId incident, IReadOnlyList<IncidentEvent> events)
    {
        var devices = State(incident).Incident.Measurements.Select(m => m.Device)
            .Concat(events.OfType<MeasurementRecorded>().Select(m => m.Measurement.Device))
            .Distinct()
            .Count();
        if (devices > EvidenceLimits.MaxMeasurementsPerIncident)
        {
            throw new EvidenceLimitException(incident, "measurements",
                $"would hold {devices} devices' records; at most {EvidenceLimits.MaxMeasurementsPerIncident} are accepted in one incident");
        }
    }

    private static void CheckEvent(IncidentId incident, IncidentEvent e)
    {
        ArgumentNullException.ThrowIfNull(e);
        switch (e)
        {
            case IncidentOpened:
                throw new ArgumentException("an incident is opened with OpenIncident, not by appending incidentOpened", nameof(e));
            case PlanStepCompleted step:
                ArgumentOutOfRangeException.ThrowIfLessThan(step.Order, 1, nameof(step.Order));
                ArgumentException.ThrowIfNullOrWhiteSpace(step.Action, nameof(step.Action));
                break;
            case IncidentReopened reopened:
                ArgumentException.ThrowIfNullOrWhiteSpace(reopened.Reason, nameof(reopened.Reason));
                break;
            case IncidentGridMoved move:
                ArgumentOutOfRangeException.ThrowIfLessThan(move.FromVersion, 1, nameof(move.FromVersion));
                ArgumentOutOfRangeException.ThrowIfLessThan(move.ToVersion, 1, nameof(move.ToVersion));
                ArgumentException.ThrowIfNullOrWhiteSpace(move.Reason, nameof(move.Reason));
                CheckLength(incident, "reason", move.Reason, EvidenceLimits.MaxCauseChars);
                break;
            case IncidentStageChanged moved when moved.Stage is IncidentStage.Open or IncidentStage.Closed || !Enum.IsDefined(moved.Stage):
                throw new ArgumentException($"incidentStageChanged moves to located, isolated, restored or repaired, not {moved.Stage}", nameof(e));
            case PlanStepCorrected correction:
                ArgumentOutOfRangeException.ThrowIfLessThan(correction.Order, 1, nameof(correction.Order));
                ArgumentException.ThrowIfNullOrWhiteSpace(correction.Reason, nameof(correction.Reason));
                break;
            case SwitchingDeviationRecorded deviation:
                ArgumentException.ThrowIfNullOrWhiteSpace(deviation.Reason, nameof(deviation.Reason));
                break;
            case OutcomeLogged outcome:
                ArgumentException.ThrowIfNullOrWhiteSpace(outcome.ConfirmedSegment.Value, nameof(outcome.ConfirmedSegment));
                CheckLength(incident, "cause", outcome.Cause, EvidenceLimits.MaxCauseChars);
                CheckLength(incident, "notes", outcome.Notes, EvidenceLimits.MaxNoteChars);
                break;
            case NoFaultFoundLogged finding:
                CheckLength(incident, "notes", finding.Notes, EvidenceLimits.MaxNoteChars);
                break;
            case ReturnStepCompleted back:
                ArgumentOutOfRangeException.ThrowIfLessThan(back.Order, 1, nameof(back.Order));
                ArgumentException.ThrowIfNullOrWhiteSpace(back.Action, nameof(back.Action));
                break;
            case OutcomeRetracted retraction:
                ArgumentException.ThrowIfNullOrWhiteSpace(retraction.Reason, nameof(retraction.Reason));
                CheckLength(incident, "reason", retraction.Reason, EvidenceLimits.MaxCauseChars);
                break;
            case UnreadableEvent:
                throw new ArgumentException("an unreadable event is never written", nameof(e));
        }
    }
}
