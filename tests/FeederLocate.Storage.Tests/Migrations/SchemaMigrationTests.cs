using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;
using FeederLocate.Storage.Database;
using FeederLocate.Storage.Events;
using FeederLocate.Storage.Incidents;
using FeederLocate.Storage.Migrations;
using FeederLocate.Storage.Tests.Support;
using Microsoft.Data.Sqlite;

namespace FeederLocate.Storage.Tests.Migrations;

public class SchemaMigrationTests
{
    [Fact]
    public void The_project_has_numbered_steps_up_to_the_latest_version()
    {
        Assert.Equal([1, 2, 3, 4], Migration.All.Select(m => m.Version));
        Assert.Equal(4, IncidentStore.LatestSchemaVersion);
    }

    [Fact]
    public void Open_creates_a_missing_file_at_the_latest_version()
    {
        using var db = new TempDatabase();
        Assert.False(File.Exists(db.Path));

        using (var store = IncidentStore.Open(db.Path))
        {
            Assert.Equal(IncidentStore.LatestSchemaVersion, store.SchemaVersion);
        }

        Assert.True(File.Exists(db.Path));
        using var raw = RawDatabase.Open(db.Path);
        Assert.Equal(4, RawDatabase.Long(raw, "SELECT COUNT(*) FROM schema_version"));
        Assert.Equal(4, RawDatabase.Long(raw, "SELECT MAX(version) FROM schema_version"));
    }

    [Fact]
    public void Open_migrates_an_empty_file()
    {
        using var db = new TempDatabase();
        File.WriteAllBytes(db.Path, []);

        using var store = IncidentStore.Open(db.Path);

        Assert.Equal(IncidentStore.LatestSchemaVersion, store.SchemaVersion);
        Assert.Empty(store.Incidents());
    }

    [Fact]
    public void Opening_again_applies_no_step_twice()
    {
        using var db = new TempDatabase();
        IncidentStore.Open(db.Path).Dispose();

        using var store = IncidentStore.Open(db.Path);

        using var raw = RawDatabase.Open(db.Path);
        Assert.Equal([1, 2, 3, 4], Versions(raw));
    }

    [Fact]
    public void Open_migrates_a_version_1_database_and_keeps_its_events()
    {
        using var db = new TempDatabase();
        var clock = TestClock.Manual();
        // A database as the first release left it: schema step 1 only, with one incident of two events.
        using (var connection = StoreConnection.Open(db.Path))
        {
            Assert.Equal(1, SchemaMigrator.Migrate(connection, clock, db.Path, Migration.All, targetVersion: 1));
            var incident = TestIncidents.EarthFault();
            RawDatabase.Execute(connection,
                "INSERT INTO incidents (id, grid_name, reported_at, created_at) VALUES (7, $grid, $reported, $created)",
                ("$grid", TestGrids.BrackenfoldName), ("$reported", "2026-03-14T05:40:00.0000000Z"), ("$created", "2026-03-14T05:45:00.0000000Z"));
            InsertVersion1Event(connection, 1, new IncidentOpened(TestGrids.BrackenfoldName, incident));
            InsertVersion1Event(connection, 2, new OutcomeLogged(new SegmentId("S2"), FaultType.LG, "cable joint"));
            Assert.Throws<SqliteException>(() => RawDatabase.Scalar(connection, "SELECT actor_role FROM events"));
        }

        using var store = IncidentStore.Open(db.Path);

        Assert.Equal(IncidentStore.LatestSchemaVersion, store.SchemaVersion);
        var state = store.State(new IncidentId(7));
        Assert.Equal(TestIncidents.Text(TestIncidents.EarthFault()), TestIncidents.Text(state.Incident));
        Assert.Equal(new SegmentId("S2"), state.Outcome?.Outcome.ConfirmedSegment);
        // Events logged before roles existed have none.
        Assert.Equal(new Actor("operator-1"), state.OpenedBy);
        Assert.Single(store.Outcomes(TestGrids.BrackenfoldName));
        using var raw = RawDatabase.Open(db.Path);
        Assert.Equal([1, 2, 3, 4], Versions(raw));
    }

    [Fact]
    public void A_failing_step_rolls_back_and_leaves_the_version_before_it()
    {
        using var db = new TempDatabase();
        var broken = new Migration(2, "broken", "CREATE TABLE half_done (x INTEGER); SELECT * FROM no_such_table;");
        using var connection = StoreConnection.Open(db.Path);

        Assert.Throws<SqliteException>(() =>
            SchemaMigrator.Migrate(connection, TestClock.Manual(), db.Path, [Migration.All[0], broken], targetVersion: 2));

        Assert.Equal(1, SchemaMigrator.CurrentVersion(connection));
        Assert.Equal(0, RawDatabase.Long(connection, "SELECT COUNT(*) FROM sqlite_master WHERE name = 'half_done'"));
        Assert.Equal(1, RawDatabase.Long(connection, "SELECT COUNT(*) FROM sqlite_master WHERE name = 'events'"));
    }

    [Fact]
    public void Open_refuses_a_database_written_by_a_newer_program()
    {
        using var db = new TempDatabase();
        IncidentStore.Open(db.Path).Dispose();
        using (var raw = RawDatabase.Open(db.Path))
        {
            RawDatabase.Execute(raw, "INSERT INTO schema_version (version, name, applied_at) VALUES (9, 'future', '2030-01-01T00:00:00Z')");
        }

        var error = Assert.Throws<SchemaVersionException>(() => IncidentStore.Open(db.Path));

        Assert.Equal(9, error.Version);
        Assert.Contains("schema version 9", error.Message, StringComparison.Ordinal);
        Assert.Contains(db.Path, error.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void Open_sets_write_ahead_logging_foreign_keys_and_a_busy_timeout()
    {
        using var db = new TempDatabase();
        using var store = IncidentStore.Open(db.Path);

        Assert.Equal("wal", RawDatabase.Scalar(store.Connection, "PRAGMA journal_mode"));
        Assert.Equal(1, RawDatabase.Long(store.Connection, "PRAGMA foreign_keys"));
        Assert.Equal((long)StoreConnection.BusyTimeout.TotalMilliseconds, RawDatabase.Long(store.Connection, "PRAGMA busy_timeout"));
    }

    private static void InsertVersion1Event(SqliteConnection connection, int sequence, IncidentEvent e) =>
        RawDatabase.Execute(connection,
            "INSERT INTO events (incident_id, sequence, time, actor, kind, payload) VALUES (7, $sequence, $time, 'operator-1', $kind, $payload)",
            ("$sequence", sequence), ("$time", IsoTime.Format(TestClock.Start.AddMinutes(sequence))),
            ("$kind", EventPayload.KindOf(e)), ("$payload", EventPayload.Serialize(e)));

    private static List<long> Versions(SqliteConnection connection)
    {
        using var command = connection.CreateCommand();
        command.CommandText = "SELECT version FROM schema_version ORDER BY version";
        using var reader = command.ExecuteReader();
        var versions = new List<long>();
        while (reader.Read())
        {
            versions.Add(reader.GetInt64(0));
        }

        return versions;
    }
}
