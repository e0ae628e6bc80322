using System.Text.Json;
using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;
using FeederLocate.Storage.Errors;
using FeederLocate.Storage.Events;
using FeederLocate.Storage.Tests.Support;

namespace FeederLocate.Storage.Tests.Events;

public class EventRoundTripTests
{
    private static readonly Actor Operator = new("duty-operator", "operator");

    public static TheoryData<IncidentEvent> LaterEvents => new()
    {
        new IndicationEntered(new Indication(new IndicatorId("FI3"), IndicatorState.Fault, IndicationSource.Field,
            new DateTimeOffset(2026, 3, 14, 6, 20, 30, TimeSpan.Zero), Distrusted: true)),
        new IndicationEntered(new Indication(new IndicatorId("FI2"), IndicatorState.Reverse, IndicationSource.Remote)),
        new MeasurementRecorded(new SubstationMeasurement(new SwitchId("CB1"), 2140.5, 38.25, 9800)),
        new MeasurementRecorded(new SubstationMeasurement(new SwitchId("CB1"), NeutralVoltageV: 9750)),
        new SwitchStateChanged(new SwitchId("LB2"), SwitchPosition.Open),
        new PlanStepCompleted(3, "open", "LB2", "opened from the control room"),
        new PlanStepCompleted(9, "proveDead"),
        new OutcomeLogged(new SegmentId("S2"), FaultType.LG, "cable joint", "joint at the 1.2 km mark"),
        new OutcomeLogged(new SegmentId("S3")),
        new IncidentClosed("restored"),
        new IncidentClosed(),
        new PlanStepCorrected(4, "ticked the wrong line"),
        new SwitchingDeviationRecorded(new SwitchId("LB2"), SwitchPosition.Open, "crew found it jammed", "step 2 (open FU1) is not done yet"),
        new SwitchingDeviationRecorded(new SwitchId("NO1"), SwitchPosition.Closed, "feed the hospital first"),
        new PlanStepCompleted(2, "close", "NO1", DoneAt: new DateTimeOffset(2026, 3, 14, 5, 52, 10, TimeSpan.Zero)),
        new IncidentTimesEntered(new DateTimeOffset(2026, 3, 14, 5, 31, 40, TimeSpan.Zero), new DateTimeOffset(2026, 3, 14, 5, 31, 40, 120, TimeSpan.Zero)),
        new IncidentTimesEntered(null, null, new DateTimeOffset(2026, 3, 14, 5, 31, 45, TimeSpan.Zero)),
        new IncidentStageChanged(Storage.Incidents.IncidentStage.Isolated),
        new NoFaultFoundLogged(Transient: true, FaultType.LG, "reclosure held; line patrolled"),
        new NoFaultFoundLogged(Transient: false),
        new ReturnStepCompleted(2, "close", "CB1", new DateTimeOffset(2026, 3, 14, 9, 12, 0, TimeSpan.Zero)),
        new ReturnStepCompleted(1, "removeEarth"),
    };

    [Theory]
    [MemberData(nameof(LaterEvents))]
    public void Each_event_kind_reads_back_as_appended(IncidentEvent e)
    {
        using var db = new TempDatabase();
        var clock = TestClock.Manual();
        using var store = IncidentStore.Open(db.Path, clock);
        var incident = store.OpenIncident(TestGrids.BrackenfoldName, TestIncidents.EarthFault(), Operator);

        var loggedAt = clock.At(12);
        var appended = store.Append(incident, e, Operator);

        var read = store.Events(incident)[1];
        Assert.Equal(e, read.Event);
        Assert.Equal(appended, read);
        Assert.Equal(2, read.Sequence);
        Assert.Equal(Operator, read.Actor);
        Assert.Equal(loggedAt, read.Time);
    }

    [Fact]
    public void The_opening_event_holds_the_grid_name_and_the_incident_as_given()
    {
        using var db = new TempDatabase();
        var clock = TestClock.Manual();
        using var store = IncidentStore.Open(db.Path, clock);
        var given = TestIncidents.EarthFault();

        var incident = store.OpenIncident(TestGrids.BrackenfoldName, given, Operator);

        var opened = Assert.IsType<IncidentOpened>(store.Events(incident).Single().Event);
        Assert.Equal(TestGrids.BrackenfoldName, opened.GridName);
        Assert.Equal(TestIncidents.ReportedAt, opened.ReportedAt);
        Assert.Equal(TestIncidents.Text(given), TestIncidents.Text(opened.Incident));
        Assert.Equal(1, store.Events(incident).Single().Sequence);
    }

    [Fact]
    public void Payloads_are_camel_case_json_with_the_incident_format_names()
    {
        using var db = new TempDatabase();
        var clock = TestClock.Manual();
        using var store = IncidentStore.Open(db.Path, clock);
        var incident = store.OpenIncident(TestGrids.BrackenfoldName, TestIncidents.EarthFault(), Operator);
        store.Append(incident, new IndicationEntered(new Indication(new IndicatorId("FI3"), IndicatorState.Fault,
            IndicationSource.Field, new DateTimeOffset(2026, 3, 14, 6, 20, 30, TimeSpan.Zero))), Operator);

        using var raw = RawDatabase.Open(db.Path);
        var kind = (string?)RawDatabase.Scalar(raw, "SELECT kind FROM events WHERE sequence = 2");
        var payload = (string?)RawDatabase.Scalar(raw, "SELECT payload FROM events WHERE sequence = 2");
        var opened = (string?)RawDatabase.Scalar(raw, "SELECT payload FROM events WHERE sequence = 1");

        Assert.Equal("indicationEntered", kind);
        using var json = JsonDocument.Parse(payload!);
        Assert.Equal("FI3", json.RootElement.GetProperty("indicator").GetString());
        Assert.Equal("fault", json.RootElement.GetProperty("state").GetString());
        Assert.Equal("field", json.RootElement.GetProperty("source").GetString());
        Assert.Equal("2026-03-14T06:20:30.0000000Z", json.RootElement.GetProperty("readAt").GetString());
        using var openedJson = JsonDocument.Parse(opened!);
        Assert.Equal(TestGrids.BrackenfoldName, openedJson.RootElement.GetProperty("gridName").GetString());
        Assert.Equal("2026-03-14T05:40:00.0000000Z", openedJson.RootElement.GetProperty("reportedAt").GetString());
        Assert.StartsWith("{", openedJson.RootElement.GetProperty("incident").GetString(), StringComparison.Ordinal);
    }

    [Fact]
    public void A_payload_missing_a_required_field_is_quarantined_with_its_event_id()
    {
        using var db = new TempDatabase();
        var clock = TestClock.Manual();
        using var store = IncidentStore.Open(db.Path, clock);
        var incident = store.OpenIncident(TestGrids.BrackenfoldName, TestIncidents.EarthFault(), Operator);
        using (var raw = RawDatabase.Open(db.Path))
        {
            RawDatabase.Execute(raw,
                "INSERT INTO events (id, incident_id, sequence, time, actor, kind, payload) VALUES (77, $incident, 2, '2026-03-14T06:00:00Z', 'x', 'outcomeLogged', '{\"faultType\":\"LG\"}')",
                ("$incident", incident.Value));
        }

        var unreadable = Assert.IsType<UnreadableEvent>(store.Events(incident)[1].Event);
        var quarantined = Assert.Single(store.State(incident).Quarantined);

        Assert.Equal("outcomeLogged", unreadable.StoredKind);
        Assert.Equal(new EventId(77), quarantined.Event);
        Assert.Contains("event 77", quarantined.ToString(), StringComparison.Ordinal);
        Assert.Null(store.State(incident).Outcome);
    }
}
