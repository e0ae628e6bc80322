using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;
using FeederLocate.Storage.Events;
using FeederLocate.Storage.Tests.Support;

namespace FeederLocate.Storage.Tests.Maintenance;

public class BackupAndIntegrityTests
{
    private static readonly Actor Operator = new("duty-operator", "operator");

    [Fact]
    public void A_fresh_database_passes_the_integrity_check()
    {
        using var db = new TempDatabase();
        using var store = IncidentStore.Open(db.Path);

        var report = store.CheckIntegrity();

        Assert.True(report.IsOk, report.ToString());
        Assert.Equal("ok", report.ToString());
    }

    [Fact]
    public void The_integrity_check_reports_an_event_of_a_missing_incident()
    {
        using var db = new TempDatabase();
        using var store = IncidentStore.Open(db.Path);
        // Only a connection with foreign keys off can write such a row.
        using (var raw = RawDatabase.Open(db.Path, foreignKeys: false))
        {
            RawDatabase.Execute(raw,
                "INSERT INTO events (incident_id, sequence, time, actor, kind, payload) VALUES (99, 1, '2026-03-14T06:00:00Z', 'x', 'incidentClosed', '{}')");
        }

        var report = store.CheckIntegrity();

        Assert.False(report.IsOk);
        Assert.Contains("events row 1 refers to a missing row of incidents", report.Problems);
    }

    [Fact]
    public void A_backup_opens_with_the_same_events_and_passes_the_integrity_check()
    {
        using var db = new TempDatabase();
        var backupPath = db.Sibling("backup.db");
        var clock = TestClock.Manual();
        List<StoredEvent> original;
        using (var store = IncidentStore.Open(db.Path, clock))
        {
            var first = store.OpenIncident(TestGrids.BrackenfoldName, TestIncidents.EarthFault(), Operator);
            clock.At(5);
            store.Append(first, new IndicationEntered(new Indication(new IndicatorId("FI3"), IndicatorState.Fault, IndicationSource.Field)), Operator);
            var second = store.Record(TestGrids.Brackenfold(), TestIncidents.EarthFault(), new OutcomeLogged(new SegmentId("S2")), Operator);
            original = [.. store.Events(first), .. store.Events(second)];

            store.BackupTo(backupPath);
        }

        using var backup = IncidentStore.Open(backupPath);
        var copied = backup.Incidents().SelectMany(i => backup.Events(i.Id)).ToList();
        Assert.Equal(original.Count, copied.Count);
        for (var i = 0; i < original.Count; i++)
        {
            Assert.Equal(original[i].Id, copied[i].Id);
            Assert.Equal(original[i].Sequence, copied[i].Sequence);
            Assert.Equal(original[i].Time, copied[i].Time);
            Assert.Equal(original[i].Actor, copied[i].Actor);
            if (original[i].Event is IncidentOpened opened)
            {
                Assert.Equal(TestIncidents.Text(opened.Incident), TestIncidents.Text(Assert.IsType<IncidentOpened>(copied[i].Event).Incident));
            }
            else
            {
                Assert.Equal(original[i].Event, copied[i].Event);
            }
        }

        Assert.True(backup.CheckIntegrity().IsOk, backup.CheckIntegrity().ToString());
    }

    [Fact]
    public void A_backup_onto_the_database_itself_is_refused()
    {
        using var db = new TempDatabase();
        using var store = IncidentStore.Open(db.Path);

        Assert.Throws<ArgumentException>(() => store.BackupTo(db.Path));
    }
}
