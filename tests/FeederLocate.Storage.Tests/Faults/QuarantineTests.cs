using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;
using FeederLocate.Storage.Events;
using FeederLocate.Storage.Incidents;
using FeederLocate.Storage.Tests.Support;

namespace FeederLocate.Storage.Tests.Faults;

/// <summary>One unreadable event is left out and named; every other event and incident is served.</summary>
public class QuarantineTests
{
    private static readonly Actor Operator = new("duty-operator", "operator");

    public static TheoryData<string, string> DamagedPayloads => new()
    {
        { "indicationEntered", "\"just text\"" },
        { "indicationEntered", "{\"indicator\":\"FI3\",\"state\":\"glowing\",\"source\":\"remote\"}" },
        { "switchStateChanged", "{\"switch\":\"SW1\",\"position\":\"ajar\"}" },
        { "outcomeLogged", "{\"confirmedSegment\":\"S1\",\"faultType\":\"ZZ\"}" },
        { "somethingNew", "{}" },
        { "measurementRecorded", "null" },
    };

    [Theory]
    [MemberData(nameof(DamagedPayloads))]
    public void A_damaged_event_is_quarantined_and_the_rest_of_its_incident_is_served(string kind, string payload)
    {
        using var db = new TempDatabase();
        using var store = IncidentStore.Open(db.Path, TestClock.Manual());
        var damaged = store.OpenIncident(TestGrids.BrackenfoldName, TestIncidents.EarthFault(), Operator);
        var healthy = store.OpenIncident(TestGrids.BrackenfoldName, TestIncidents.EarthFault(), Operator);
        store.Append(damaged, new SwitchStateChanged(new SwitchId("SW2"), SwitchPosition.Open), Operator);
        Insert(db.Path, damaged, sequence: 3, kind, payload, id: 501);
        store.Append(damaged, new OutcomeLogged(new SegmentId("S2")), Operator);

        var state = store.State(damaged);

        var quarantined = Assert.Single(state.Quarantined);
        Assert.Equal(new EventId(501), quarantined.Event);
        Assert.Equal(kind, quarantined.Kind);
        Assert.Equal(SwitchPosition.Open, state.Incident.SwitchStates[new SwitchId("SW2")]);
        Assert.Equal(new SegmentId("S2"), state.Outcome!.Outcome.ConfirmedSegment);
        Assert.Equal([damaged, healthy], store.Incidents().Select(i => i.Id));
        Assert.Single(store.Outcomes(TestGrids.BrackenfoldName));
        Assert.Equal(new EventId(501), Assert.Single(store.Quarantine()).Event);
    }

    [Fact]
    public void An_incident_whose_opening_cannot_be_read_is_left_out_and_named()
    {
        using var db = new TempDatabase();
        using var store = IncidentStore.Open(db.Path, TestClock.Manual());
        var first = store.OpenIncident(TestGrids.BrackenfoldName, TestIncidents.EarthFault(), Operator);
        var second = store.OpenIncident(TestGrids.BrackenfoldName, TestIncidents.EarthFault(), Operator);
        using (var raw = RawDatabase.Open(db.Path))
        {
            RawDatabase.Execute(raw, "INSERT INTO incidents (id, grid_name, reported_at, created_at) VALUES (99, 'x', '2026-03-14T05:40:00Z', '2026-03-14T05:45:00Z')");
        }

        Insert(db.Path, new IncidentId(99), sequence: 1, "incidentOpened", "{\"gridName\":\"x\"}", id: 300);

        Assert.Equal([first, second], store.Incidents().Select(i => i.Id));
        var quarantined = Assert.Single(store.Quarantine());
        Assert.Equal(new IncidentId(99), quarantined.Incident);
        Assert.Contains("whole incident", quarantined.Problem, StringComparison.Ordinal);
    }

    [Fact]
    public void An_event_with_a_time_that_is_not_a_time_is_quarantined()
    {
        using var db = new TempDatabase();
        using var store = IncidentStore.Open(db.Path, TestClock.Manual());
        var id = store.OpenIncident(TestGrids.BrackenfoldName, TestIncidents.EarthFault(), Operator);
        using (var raw = RawDatabase.Open(db.Path))
        {
            RawDatabase.Execute(raw,
                "INSERT INTO events (id, incident_id, sequence, time, actor, kind, payload) VALUES (9, $id, 2, 'yesterday', 'x', 'incidentClosed', '{}')",
                ("$id", id.Value));
        }

        var state = store.State(id);

        Assert.Equal(IncidentStatus.Open, state.Status);
        Assert.Contains("yesterday", Assert.Single(state.Quarantined).Problem, StringComparison.Ordinal);
    }

    [Fact]
    public void Integrity_names_every_quarantined_event_and_is_not_ok()
    {
        using var db = new TempDatabase();
        using var store = IncidentStore.Open(db.Path, TestClock.Manual());
        var id = store.OpenIncident(TestGrids.BrackenfoldName, TestIncidents.EarthFault(), Operator);
        Insert(db.Path, id, sequence: 2, "indicationEntered", "[]", id: 61);

        var report = store.CheckIntegrity();

        Assert.False(report.IsOk);
        Assert.Empty(report.Problems);
        Assert.Contains("event 61 (incident 1, #2, indicationEntered) is quarantined", report.ToString(), StringComparison.Ordinal);
    }

    [Fact]
    public void A_sound_file_has_nothing_quarantined()
    {
        using var db = new TempDatabase();
        using var store = IncidentStore.Open(db.Path, TestClock.Manual());
        var id = store.OpenIncident(TestGrids.BrackenfoldName, TestIncidents.EarthFault(), Operator);
        store.Append(id, [new OutcomeLogged(new SegmentId("S1")), new IncidentClosed()], Operator);

        Assert.Empty(store.Quarantine());
        Assert.True(store.CheckIntegrity().IsOk);
    }

    private static void Insert(string path, IncidentId incident, int sequence, string kind, string payload, long id)
    {
        using var raw = RawDatabase.Open(path);
        RawDatabase.Execute(raw,
            "INSERT INTO events (id, incident_id, sequence, time, actor, kind, payload) VALUES ($eid, $incident, $sequence, '2026-03-14T06:00:00Z', 'x', $kind, $payload)",
            ("$eid", id), ("$incident", incident.Value), ("$sequence", sequence), ("$kind", kind), ("$payload", payload));
    }
}
