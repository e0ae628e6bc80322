using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;
using FeederLocate.Storage.Events;

namespace FeederLocate.Storage.Tests.Incidents;

public class SwitchingCorrectionFoldTests
{
    private static readonly Actor Operator = new("duty-operator", "operator");
    private static readonly Actor Engineer = new("shift-engineer", "engineer");

    [Fact]
    public void A_correction_withdraws_the_latest_tick_of_its_step_and_keeps_every_event()
    {
        using var db = new TempDatabase();
        var clock = TestClock.Manual();
        using var store = IncidentStore.Open(db.Path, clock);
        var id = store.OpenIncident(TestGrids.BrackenfoldName, TestIncidents.EarthFault(), Operator);
        store.Append(id, new PlanStepCompleted(1, "open", "LB2"), Operator);
        var mistaken = clock.At(3);
        store.Append(id, new PlanStepCompleted(2, "close", "NO1"), Operator);
        var corrected = clock.At(4);

        store.Append(id, new PlanStepCorrected(2, "ticked the wrong line"), Engineer);

        var state = store.State(id);
        Assert.Equal([1], state.CompletedSteps.Select(d => d.Step.Order));
        var correction = Assert.Single(state.Corrections);
        Assert.Equal(2, correction.Withdrawn?.Step.Order);
        Assert.Equal(mistaken, correction.Withdrawn?.CompletedAt);
        Assert.Equal("ticked the wrong line", correction.Reason);
        Assert.Equal(Engineer, correction.Actor);
        Assert.Equal(corrected, correction.CorrectedAt);
        Assert.Equal(4, store.Events(id).Count);
        Assert.IsType<PlanStepCompleted>(store.Events(id)[2].Event);
    }

    [Fact]
    public void A_correction_of_a_step_no_longer_ticked_withdraws_nothing()
    {
        using var db = new TempDatabase();
        using var store = IncidentStore.Open(db.Path, TestClock.Manual());
        var id = store.OpenIncident(TestGrids.BrackenfoldName, TestIncidents.EarthFault(), Operator);
        store.Append(id, new PlanStepCompleted(1, "open", "LB2"), Operator);
        store.Append(id, new PlanStepCorrected(1, "wrong line"), Operator);

        store.Append(id, new PlanStepCorrected(1, "wrong line, said twice"), Engineer);

        var state = store.State(id);
        Assert.Empty(state.CompletedSteps);
        Assert.Equal(2, state.Corrections.Length);
        Assert.Null(state.Corrections[1].Withdrawn);
    }

    [Fact]
    public void A_deviation_starts_a_new_plan_from_the_positions_switched_so_far()
    {
        using var db = new TempDatabase();
        var clock = TestClock.Manual();
        using var store = IncidentStore.Open(db.Path, clock);
        var id = store.OpenIncident(TestGrids.BrackenfoldName, TestIncidents.EarthFault(), Operator);
        store.Append(id, new PlanStepCompleted(1, "dispatch", "LB2"), Operator);
        store.Append(id, new PlanStepCompleted(2, "open", "LB2"), Operator);
        var at = clock.At(20);

        store.Append(id, new SwitchingDeviationRecorded(new SwitchId("NO1"), SwitchPosition.Closed, "feed the school first", "step 3 (open FU1) is not done yet"), Engineer);

        var state = store.State(id);
        Assert.Empty(state.CompletedSteps);
        Assert.Equal([1, 2], state.EarlierSteps.Select(d => d.Step.Order));
        Assert.Equal(SwitchPosition.Open, state.SwitchedBeforePlan[new SwitchId("LB2")]);
        Assert.Equal(SwitchPosition.Closed, state.SwitchedBeforePlan[new SwitchId("NO1")]);
        Assert.Equal(2, state.SwitchedBeforePlan.Count);
        Assert.Equal(SwitchPosition.Closed, state.PlanBasis.SwitchStates[new SwitchId("NO1")]);
        var deviation = Assert.Single(state.Deviations);
        Assert.Equal(Engineer, deviation.Actor);
        Assert.Equal(at, deviation.RecordedAt);
        Assert.Equal("step 3 (open FU1) is not done yet", deviation.Deviation.Departure);
    }

    [Fact]
    public void A_position_found_on_site_later_replaces_the_switched_one()
    {
        using var db = new TempDatabase();
        using var store = IncidentStore.Open(db.Path, TestClock.Manual());
        var id = store.OpenIncident(TestGrids.BrackenfoldName, TestIncidents.EarthFault(), Operator);
        store.Append(id, new SwitchingDeviationRecorded(new SwitchId("LB2"), SwitchPosition.Open, "crew opened it early"), Engineer);

        store.Append(id, new SwitchStateChanged(new SwitchId("LB2"), SwitchPosition.Closed), Operator);

        var state = store.State(id);
        Assert.False(state.SwitchedBeforePlan.ContainsKey(new SwitchId("LB2")));
        Assert.Equal(SwitchPosition.Closed, state.PlanBasis.SwitchStates[new SwitchId("LB2")]);
    }

    [Fact]
    public void A_correction_without_a_reason_is_refused_and_nothing_is_written()
    {
        using var db = new TempDatabase();
        using var store = IncidentStore.Open(db.Path, TestClock.Manual());
        var id = store.OpenIncident(TestGrids.BrackenfoldName, TestIncidents.EarthFault(), Operator);

        Assert.ThrowsAny<ArgumentException>(() => store.Append(id, new PlanStepCorrected(1, " "), Operator));
        Assert.ThrowsAny<ArgumentException>(() => store.Append(id, new SwitchingDeviationRecorded(new SwitchId("LB2"), SwitchPosition.Open, ""), Operator));
        Assert.Single(store.Events(id));
    }
}
