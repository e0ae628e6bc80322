using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;
using FeederLocate.Storage.Errors;
using FeederLocate.Storage.Events;

namespace FeederLocate.Storage.Tests.Incidents;

public class ReturnAndNoFaultFoldTests
{
    private static readonly Actor Operator = new("duty-operator", "operator");

    [Fact]
    public void No_fault_found_is_the_outcome_in_force_until_a_confirmed_segment_or_a_retraction_replaces_it()
    {
        using var db = new TempDatabase();
        var clock = TestClock.Manual();
        using var store = IncidentStore.Open(db.Path, clock);
        var id = store.OpenIncident(TestGrids.BrackenfoldName, TestIncidents.EarthFault(), Operator);
        var loggedAt = clock.At(20);
        store.Append(id, new NoFaultFoundLogged(Transient: true, FaultType.LG, "patrolled"), Operator);

        var none = store.State(id);
        Assert.True(none.HasOutcome);
        Assert.Null(none.Outcome);
        Assert.Equal((true, loggedAt, Operator), (none.NoFaultFound!.Finding.Transient, none.NoFaultFound.LoggedAt, none.NoFaultFound.Actor));
        // It confirms no segment: the learning's outcomes leave it out.
        Assert.Empty(store.Outcomes(TestGrids.BrackenfoldName));
        var summary = Assert.Single(store.Incidents());
        Assert.Equal((true, true, null), (summary.NoFaultFound, summary.Transient, summary.ConfirmedSegment));

        store.Append(id, new OutcomeLogged(new SegmentId("S2"), FaultType.LG), Operator);
        Assert.Null(store.State(id).NoFaultFound);
        Assert.Single(store.Outcomes(TestGrids.BrackenfoldName));

        store.Append(id, new NoFaultFoundLogged(Transient: false), Operator);
        Assert.Null(store.State(id).Outcome);
        Assert.Empty(store.Outcomes(TestGrids.BrackenfoldName));

        // A no-fault-found outcome can be retracted like any other; then none is in force and a second retraction is refused.
        store.Append(id, new OutcomeRetracted("the crew found a broken insulator after all"), Operator);
        Assert.False(store.State(id).HasOutcome);
        Assert.Throws<OutcomeNotLoggedException>(() => store.Append(id, new OutcomeRetracted("again"), Operator));
    }

    [Fact]
    public void Return_steps_accumulate_apart_from_the_plans_ticks_and_a_deviation_takes_their_positions_as_switched()
    {
        using var db = new TempDatabase();
        var clock = TestClock.Manual();
        using var store = IncidentStore.Open(db.Path, clock);
        var id = store.OpenIncident(TestGrids.BrackenfoldName, TestIncidents.EarthFault(), Operator);
        store.Append(id, new PlanStepCompleted(1, "open", "LB2"), Operator);
        var doneAt = TestClock.Start.AddMinutes(30);
        clock.At(40);
        store.Append(id, new ReturnStepCompleted(1, "removeEarth"), Operator);
        store.Append(id, new ReturnStepCompleted(2, "close", "LB2", doneAt), Operator);

        var state = store.State(id);
        Assert.Equal([1], state.CompletedSteps.Select(d => d.Step.Order));
        Assert.Equal([("removeEarth", (string?)null), ("close", "LB2")], state.ReturnSteps.Select(d => (d.Step.Action, d.Step.Device)));
        Assert.Equal(doneAt, state.ReturnSteps[1].DoneAt);
        Assert.Equal(TestClock.Start.AddMinutes(40), state.ReturnSteps[0].DoneAt);

        store.Append(id, new SwitchingDeviationRecorded(new SwitchId("CB1"), SwitchPosition.Open, "relay test"), Operator);
        var after = store.State(id);
        Assert.Empty(after.ReturnSteps);
        Assert.Empty(after.CompletedSteps);
        Assert.Equal(SwitchPosition.Closed, after.SwitchedBeforePlan[new SwitchId("LB2")]);
        Assert.Equal(3, after.EarlierSteps.Length);
    }

    [Fact]
    public void A_return_step_needs_an_order_and_an_action()
    {
        using var db = new TempDatabase();
        using var store = IncidentStore.Open(db.Path, TestClock.Manual());
        var id = store.OpenIncident(TestGrids.BrackenfoldName, TestIncidents.EarthFault(), Operator);

        Assert.Throws<ArgumentOutOfRangeException>(() => store.Append(id, new ReturnStepCompleted(0, "close", "LB2"), Operator));
        Assert.ThrowsAny<ArgumentException>(() => store.Append(id, new ReturnStepCompleted(1, " "), Operator));
        Assert.Equal(1, store.State(id).EventCount);
    }
}
