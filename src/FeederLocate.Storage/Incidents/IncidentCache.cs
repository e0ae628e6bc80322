using FeederLocate.Storage.Database;
using FeederLocate.Storage.Errors;
using FeederLocate.Storage.Events;
using Microsoft.Data.Sqlite;

namespace FeederLocate.Storage.Incidents;

/// <summary>
/// The events already read, per incident, and each incident's state folded from them. Events are never
/// changed once logged, so only newer ones are read again: an incident's events after the last sequence
/// number seen, or every incident's events after the last event id seen (ids increase in commit order,
/// also across processes). Reading a long incident costs one indexed query and a fold in memory, not a
/// read of its whole log. Not thread-safe: it belongs to one <see cref="IncidentStore"/>.
/// </summary>
internal sealed class IncidentCache
{
    private readonly SortedDictionary<long, Entry> _entries = [];
    private long _everyEventThrough;

    /// <summary>A copy of the incident's events in order; empty when nothing is logged for it.</summary>
    public IReadOnlyList<StoredEvent> EventsOf(SqliteConnection connection, IncidentId incident) =>
        Refresh(connection, incident) is { } entry ? [.. entry.Events] : [];

    /// <summary>The incident's state, or null when nothing is logged for it.</summary>
    public IncidentState? StateOf(SqliteConnection connection, IncidentId incident) =>
        Refresh(connection, incident) is { } entry ? entry.State() : null;

    /// <summary>
    /// The state of every incident, or of those on <paramref name="gridName"/>, by id. An incident whose opening
    /// event cannot be read is left out (see <see cref="Quarantine"/>).
    /// </summary>
    public IEnumerable<IncidentState> States(SqliteConnection connection, string? gridName)
    {
        ReadNew(connection);
        return _entries.Values
            .Where(entry => gridName is null || string.Equals(entry.GridName, gridName, StringComparison.Ordinal))
            .Select(entry => entry.TryState())
            .OfType<IncidentState>()
            .ToList();
    }

    /// <summary>Every event left out of its incident's state, by incident and sequence: a whole incident when its opening cannot be read.</summary>
    public IReadOnlyList<QuarantinedEvent> Quarantine(SqliteConnection connection)
    {
        ReadNew(connection);
        var all = new List<QuarantinedEvent>();
        foreach (var entry in _entries.Values)
        {
            if (entry.TryState() is { } state)
            {
                all.AddRange(state.Quarantined);
            }
            else
            {
                var first = entry.Events[0];
                all.Add(new QuarantinedEvent(first.Id, first.Incident, first.Sequence, first.Kind,
                    (first.Event is UnreadableEvent unreadable ? unreadable.Problem : "is not incidentOpened")
                    + $"; the whole incident {first.Incident} is left out"));
            }
        }

        return all;
    }

    private void ReadNew(SqliteConnection connection)
    {
        var fresh = EventTable.EventsAfter(connection, _everyEventThrough);
        foreach (var e in fresh)
        {
            Add(e);
        }

        if (fresh.Count > 0)
        {
            _everyEventThrough = fresh[^1].Id.Value;
        }
    }

    private Entry? Refresh(SqliteConnection connection, IncidentId incident)
    {
        _entries.TryGetValue(incident.Value, out var entry);
        var fresh = EventTable.EventsOf(connection, incident, entry?.LastSequence ?? 0);
        foreach (var e in fresh)
        {
            Add(e);
        }

        return _entries.GetValueOrDefault(incident.Value);
    }

    private void Add(StoredEvent e)
    {
        if (!_entries.TryGetValue(e.Incident.Value, out var entry))
        {
            entry = new Entry();
            _entries[e.Incident.Value] = entry;
        }

        // Read once by incident and once by id: an event already here is skipped.
        if (e.Sequence > entry.LastSequence)
        {
            entry.Events.Add(e);
        }
    }

    private sealed class Entry
    {
        private IncidentState? _state;
        private int _stateEvents;

        public List<StoredEvent> Events { get; } = [];

        public int LastSequence => Events.Count == 0 ? 0 : Events[^1].Sequence;

        public string? GridName => Events.Count > 0 && Events[0].Event is IncidentOpened opened ? opened.GridName : null;

        /// <summary>The state, or null when the incident's opening event cannot be read.</summary>
        public IncidentState? TryState()
        {
            try
            {
                return State();
            }
            catch (CorruptEventException)
            {
                return null;
            }
        }

        public IncidentState State()
        {
            if (_state is null)
            {
                _state = IncidentFold.Fold(Events);
            }
            else if (_stateEvents < Events.Count)
            {
                _state = IncidentFold.Continue(_state, Events, _stateEvents);
            }

            _stateEvents = Events.Count;

            return _state;
        }
    }
}
