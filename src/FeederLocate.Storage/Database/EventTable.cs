using System.Globalization;
using FeederLocate.Storage.Errors;
using FeederLocate.Storage.Events;
using FeederLocate.Storage.Incidents;
using Microsoft.Data.Sqlite;

namespace FeederLocate.Storage.Database;

/// <summary>The SQL of the incident log, every value passed as a parameter.</summary>
internal static class EventTable
{
    private const string SelectEvents = """
        SELECT e.id, e.incident_id, e.sequence, e.time, e.actor, e.actor_role, e.kind, e.payload
        FROM events e
        """;

    /// <summary>What an append needs to know of an incident, read under the write lock.</summary>
    public sealed record Head(string GridName, int LastSequence, bool Closed);

    public static IncidentId InsertIncident(SqliteConnection connection, SqliteTransaction transaction, string gridName, DateTimeOffset reportedAt, DateTimeOffset now)
    {
        using var command = Command(connection, transaction, """
            INSERT INTO incidents (grid_name, reported_at, created_at)
            VALUES ($gridName, $reportedAt, $createdAt)
            RETURNING id
            """);
        command.Parameters.AddWithValue("$gridName", gridName);
        command.Parameters.AddWithValue("$reportedAt", IsoTime.Format(reportedAt));
        command.Parameters.AddWithValue("$createdAt", IsoTime.Format(now));
        return new IncidentId(Convert.ToInt64(command.ExecuteScalar(), CultureInfo.InvariantCulture));
    }

    public static Head? ReadHead(SqliteConnection connection, SqliteTransaction transaction, IncidentId incident)
    {
        using var command = Command(connection, transaction, """
            SELECT i.grid_name,
                   (SELECT COALESCE(MAX(sequence), 0) FROM events WHERE incident_id = i.id),
                   COALESCE((SELECT kind = $closedKind FROM events
                             WHERE incident_id = i.id AND kind IN ($closedKind, $reopenedKind)
                             ORDER BY sequence DESC LIMIT 1), 0)
            FROM incidents i
            WHERE i.id = $incident
            """);
        command.Parameters.AddWithValue("$incident", incident.Value);
        command.Parameters.AddWithValue("$closedKind", EventPayload.IncidentClosedKind);
        command.Parameters.AddWithValue("$reopenedKind", EventPayload.IncidentReopenedKind);
        using var reader = command.ExecuteReader();
        return reader.Read() ? new Head(reader.GetString(0), reader.GetInt32(1), reader.GetBoolean(2)) : null;
    }

    public static StoredEvent InsertEvent(
        SqliteConnection connection, SqliteTransaction transaction, IncidentId incident, int sequence, DateTimeOffset time, Actor actor, IncidentEvent e)
    {
        using var command = Command(connection, transaction, """
            INSERT INTO events (incident_id, sequence, time, actor, actor_role, kind, payload)
            VALUES ($incident, $sequence, $time, $actor, $actorRole, $kind, $payload)
            RETURNING id
            """);
        command.Parameters.AddWithValue("$incident", incident.Value);
        command.Parameters.AddWithValue("$sequence", sequence);
        command.Parameters.AddWithValue("$time", IsoTime.Format(time));
        command.Parameters.AddWithValue("$actor", actor.Name);
        command.Parameters.AddWithValue("$actorRole", (object?)actor.Role ?? DBNull.Value);
        command.Parameters.AddWithValue("$kind", EventPayload.KindOf(e));
        command.Parameters.AddWithValue("$payload", EventPayload.Serialize(e));
        var id = new EventId(Convert.ToInt64(command.ExecuteScalar(), CultureInfo.InvariantCulture));
        return new StoredEvent(id, incident, sequence, time, actor, e);
    }

    public static bool IncidentExists(SqliteConnection connection, IncidentId incident)
    {
        using var command = Command(connection, null, "SELECT EXISTS (SELECT 1 FROM incidents WHERE id = $incident)");
        command.Parameters.AddWithValue("$incident", incident.Value);
        return Convert.ToInt64(command.ExecuteScalar(), CultureInfo.InvariantCulture) != 0;
    }

    /// <summary>The incident's events in sequence order.</summary>
    public static List<StoredEvent> EventsOf(SqliteConnection connection, IncidentId incident)
    {
        using var command = Command(connection, null, SelectEvents + " WHERE e.incident_id = $incident ORDER BY e.sequence");
        command.Parameters.AddWithValue("$incident", incident.Value);
        return ReadAll(command);
    }

    /// <summary>The incident's events after sequence number <paramref name="afterSequence"/>, in sequence order.</summary>
    public static List<StoredEvent> EventsOf(SqliteConnection connection, IncidentId incident, int afterSequence)
    {
        using var command = Command(connection, null, SelectEvents + " WHERE e.incident_id = $incident AND e.sequence > $after ORDER BY e.sequence");
        command.Parameters.AddWithValue("$incident", incident.Value);
        command.Parameters.AddWithValue("$after", afterSequence);
        return ReadAll(command);
    }

    /// <summary>
    /// Every event with an id above <paramref name="afterEventId"/>, in id order. Ids increase in the order
    /// events were committed, so a reader that remembers the last id it saw never misses one.
    /// </summary>
    public static List<StoredEvent> EventsAfter(SqliteConnection connection, long afterEventId)
    {
        using var command = Command(connection, null, SelectEvents + " WHERE e.id > $after ORDER BY e.id");
        command.Parameters.AddWithValue("$after", afterEventId);
        return ReadAll(command);
    }

    /// <summary>
    /// Reads the rows; a row that cannot be read back becomes an <see cref="UnreadableEvent"/> in its place,
    /// so one damaged event never hides the others.
    /// </summary>
    private static List<StoredEvent> ReadAll(SqliteCommand command)
    {
        var events = new List<StoredEvent>();
        using var reader = command.ExecuteReader();
        while (reader.Read())
        {
            var id = new EventId(reader.GetInt64(0));
            var incident = new IncidentId(reader.GetInt64(1));
            var sequence = reader.GetInt32(2);
            var kind = reader.IsDBNull(6) ? "(none)" : reader.GetString(6);
            var actor = new Actor(
                reader.IsDBNull(4) ? "(unknown)" : reader.GetString(4),
                reader.IsDBNull(5) ? null : reader.GetString(5));
            var timeText = reader.IsDBNull(3) ? string.Empty : reader.GetString(3);
            if (!IsoTime.TryParse(timeText, out var time))
            {
                events.Add(new StoredEvent(id, incident, sequence, DateTimeOffset.UnixEpoch, actor,
                    new UnreadableEvent(kind, $"has time \"{timeText}\" that is not an ISO 8601 time")));
                continue;
            }

            IncidentEvent e;
            try
            {
                e = EventPayload.Deserialize(id, kind, reader.IsDBNull(7) ? string.Empty : reader.GetString(7));
            }
            catch (CorruptEventException problem)
            {
                e = new UnreadableEvent(kind, problem.Problem);
            }

            events.Add(new StoredEvent(id, incident, sequence, time, actor, e));
        }

        return events;
    }

    private static SqliteCommand Command(SqliteConnection connection, SqliteTransaction? transaction, string sql)
    {
        var command = connection.CreateCommand();
        command.Transaction = transaction;
        command.CommandText = sql;
        return command;
    }
}
