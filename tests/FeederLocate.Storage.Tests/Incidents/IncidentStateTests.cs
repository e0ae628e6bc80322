using System.Collections.Immutable;
using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;
using FeederLocate.Storage.Events;
using FeederLocate.Storage.Incidents;

namespace FeederLocate.Storage.Tests.Incidents;

public class IncidentStateTests
{
    private static readonly Actor Operator = new("duty-operator", "operator");
    private static readonly Actor Crew = new("crew-4", "crew");

    [Fact]
    public void State_applies_the_events_in_order()
    {
        using var db = new TempDatabase();
        var clock = TestClock.Manual();
        using var store = IncidentStore.Open(db.Path, clock);
        var id = store.OpenIncident(TestGrids.BrackenfoldName, TestIncidents.EarthFault(), Operator);
        var fieldRead = new DateTimeOffset(2026, 3, 14, 6, 20, 0, TimeSpan.Zero);

        store.Append(id, new IndicationEntered(new Indication(new IndicatorId("FI3"), IndicatorState.None, IndicationSource.Field)), Crew);
        store.Append(id, new IndicationEntered(new Indication(new IndicatorId("FI3"), IndicatorState.Fault, IndicationSource.Field, fieldRead)), Crew);
        store.Append(id, new IndicationEntered(new Indication(new IndicatorId("FI1"), IndicatorState.None, IndicationSource.Remote, Distrusted: true)), Operator);
        store.Append(id, new MeasurementRecorded(new SubstationMeasurement(new SwitchId("CB1"), NeutralVoltageV: 9800)), Operator);
        store.Append(id, new SwitchStateChanged(new SwitchId("LB2"), SwitchPosition.Open), Operator);
        store.Append(id, new SwitchStateChanged(new SwitchId("CB1"), SwitchPosition.Closed), Operator);
        var stepDone = clock.At(30);
        store.Append(id, new PlanStepCompleted(1, "open", "LB2"), Operator);
        store.Append(id, new OutcomeLogged(new SegmentId("S3"), FaultType.LG), Crew);
        var outcomeLogged = clock.At(95);
        store.Append(id, new OutcomeLogged(new SegmentId("S2"), FaultType.LG, "cable joint"), Crew);
        var closed = clock.At(120);
        store.Append(id, new IncidentClosed(), Operator);

        var state = store.State(id);

        var expected = TestIncidents.EarthFault() with
        {
            // FI1 is replaced where it stood; FI3, new, goes last with its second reading.
            Indications =
            [
                new Indication(new IndicatorId("FI1"), IndicatorState.None, IndicationSource.Remote, Distrusted: true),
                new Indication(new IndicatorId("FI2"), IndicatorState.Forward, IndicationSource.Remote),
                new Indication(new IndicatorId("FI3"), IndicatorState.Fault, IndicationSource.Field, fieldRead),
            ],
            // The new neutral voltage joins the phase and residual currents recorded before.
            Measurements = [new SubstationMeasurement(new SwitchId("CB1"), PhaseCurrentA: 2140, ResidualCurrentA: 38.5, NeutralVoltageV: 9800)],
            SwitchStates = ImmutableDictionary<SwitchId, SwitchPosition>.Empty
                .Add(new SwitchId("LB2"), SwitchPosition.Open)
                .Add(new SwitchId("CB1"), SwitchPosition.Closed),
        };
        Assert.Equal(TestIncidents.Text(expected), TestIncidents.Text(state.Incident));
        Assert.Equal(id, state.Id);
        Assert.Equal(TestGrids.BrackenfoldName, state.GridName);
        Assert.Equal(IncidentStatus.Closed, state.Status);
        Assert.Equal(11, state.EventCount);
        Assert.Equal(Operator, state.OpenedBy);
        Assert.Equal(TestClock.Start, state.OpenedAt);
        Assert.Equal(closed, state.ClosedAt);
        var step = Assert.Single(state.CompletedSteps);
        Assert.Equal(new CompletedPlanStep(new PlanStepCompleted(1, "open", "LB2"), Operator, stepDone), step);
        // The later outcome replaces the earlier.
        Assert.Equal(new OutcomeInForce(new OutcomeLogged(new SegmentId("S2"), FaultType.LG, "cable joint"), Crew, outcomeLogged), state.Outcome);
    }

    [Fact]
    public void A_new_incident_is_open_with_its_evidence_as_given()
    {
        using var db = new TempDatabase();
        using var store = IncidentStore.Open(db.Path, TestClock.Manual());

        var state = store.State(store.OpenIncident(TestGrids.BrackenfoldName, TestIncidents.EarthFault(), Operator));

        Assert.Equal(IncidentStatus.Open, state.Status);
        Assert.Null(state.Outcome);
        Assert.Null(state.ClosedAt);
        Assert.Empty(state.CompletedSteps);
        Assert.Equal(TestIncidents.Text(TestIncidents.EarthFault()), TestIncidents.Text(state.Incident));
    }

    [Fact]
    public void Record_logs_incident_outcome_and_closing_in_one_go()
    {
        using var db = new TempDatabase();
        using var store = IncidentStore.Open(db.Path, TestClock.Manual());

        var id = store.Append(TestGrids.Brackenfold(), TestIncidents.EarthFault(), new OutcomeLogged(new SegmentId("S1")), new Actor("cli"));

        Assert.Equal(["incidentOpened", "outcomeLogged", "incidentClosed"], store.Events(id).Select(e => e.Kind));
        Assert.Equal(IncidentStatus.Closed, store.State(id).Status);
    }

    [Fact]
    public void Incidents_lists_each_with_status_fault_type_and_confirmed_segment()
    {
        using var db = new TempDatabase();
        using var store = IncidentStore.Open(db.Path, TestClock.Manual());
        var grid = TestGrids.Brackenfold();
        var first = store.Append(grid, TestIncidents.EarthFault(), new OutcomeLogged(new SegmentId("S2"), FaultType.LLG, "digger"), new Actor("cli"));
        var second = store.OpenIncident("Ferncombe 11 kV", TestIncidents.EarthFault(TestIncidents.ReportedAt.AddDays(3)) with { FaultType = null }, Operator);

        var list = store.Incidents();

        Assert.Equal(
        [
            new IncidentSummary(first, TestGrids.BrackenfoldName, TestIncidents.ReportedAt, IncidentStatus.Closed, FaultType.LLG, new SegmentId("S2"), "digger", null, 3)
            {
                Stage = IncidentStage.Closed,
            },
            new IncidentSummary(second, "Ferncombe 11 kV", TestIncidents.ReportedAt.AddDays(3), IncidentStatus.Open, null, null, null, null, 1),
        ], list);
    }

    [Fact]
    public void Outcomes_holds_the_incidents_of_that_grid_with_a_logged_outcome()
    {
        using var db = new TempDatabase();
        using var store = IncidentStore.Open(db.Path, TestClock.Manual());
        var grid = TestGrids.Brackenfold();
        var withOutcome = store.OpenIncident(grid.Name, TestIncidents.EarthFault(), Operator);
        store.Append(withOutcome, new IndicationEntered(new Indication(new IndicatorId("FI3"), IndicatorState.Fault, IndicationSource.Field)), Crew);
        store.Append(withOutcome, new OutcomeLogged(new SegmentId("S3")), Crew, grid);
        store.OpenIncident(grid.Name, TestIncidents.EarthFault(), Operator);
        store.Append(TestGrids.Brackenfold("Ferncombe 11 kV"), TestIncidents.EarthFault(), new OutcomeLogged(new SegmentId("S1")), Operator);

        var outcome = Assert.Single(store.Outcomes(grid.Name));

        Assert.Equal(withOutcome, outcome.Id);
        Assert.Equal(new SegmentId("S3"), outcome.ConfirmedSegment);
        Assert.Equal(TestIncidents.ReportedAt, outcome.ReportedAt);
        // The evidence as last updated, with the field reading entered later.
        Assert.Equal(IndicatorState.Fault, outcome.Incident.IndicationOf(new IndicatorId("FI3"))?.State);
        Assert.Equal(new Core.Learning.OutcomeSite(new SegmentId("S3"), TestIncidents.ReportedAt), outcome.ToSite());
        Assert.Empty(store.Outcomes("brackenfold 20 kv"));
    }
}
