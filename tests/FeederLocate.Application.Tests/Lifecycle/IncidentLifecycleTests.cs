using FeederLocate.Application.Analysis;
using FeederLocate.Application.History;
using FeederLocate.Application.Lifecycle;
using FeederLocate.Application.Switching;
using FeederLocate.Application.Tests.Support;
using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;
using FeederLocate.Core.Topology;
using FeederLocate.Storage.Events;
using FeederLocate.Storage.Incidents;

namespace FeederLocate.Application.Tests.Lifecycle;

public sealed class IncidentLifecycleTests : IDisposable
{
    private static readonly Actor Engineer = new("eli", "engineer");
    private readonly TestLog _test = new();
    private readonly NetworkGraph _graph = Samples.Graph("solid");

    public void Dispose() => _test.Dispose();

    private IncidentId OpenTrip() =>
        _test.Log.Open(_graph.Grid, new SwitchId("CB-A1"), FaultType.LG, TestClock.Start.AddMinutes(-30), Samples.Operator);

    private IncidentAnalysis Analysis() => new(new GridLearning(_test.Log), new CoreFaultRanker());

    /// <summary>Ticks every step of the incident's return order, in order; each must be logged.</summary>
    private async Task TickReturnThrough(IncidentId id, ReturnSwitching back, IncidentAnalysis analysis)
    {
        var plan = (await analysis.ReturnAsync(_graph, _test.Log.State(id))).Plan!;
        foreach (var step in plan.Steps)
        {
            Assert.Null((await back.TickAsync(_graph, id, step.Order, Samples.Operator)).Refusal);
        }
    }

    [Fact]
    public async Task An_incident_moves_on_stage_by_stage_the_outcome_leads_to_the_return_order_then_closing_and_an_engineer_reopens_it()
    {
        var id = OpenTrip();
        var analysis = Analysis();
        var lifecycle = new IncidentLifecycle(_test.Log, analysis);
        var back = new ReturnSwitching(_test.Log, analysis);

        Assert.True(lifecycle.MoveTo(id, IncidentStage.Located, Samples.Operator).IsLogged);
        Assert.Equal("the return to normal follows the outcome: log where the fault was found, or that none was found",
            (await back.TickAsync(_graph, id, 1, Samples.Operator)).Refusal);
        Assert.Equal("incident 1 is already located: stages only move on", lifecycle.MoveTo(id, IncidentStage.Located, Samples.Operator).Refusal);
        Assert.Equal("log the outcome of incident 1 before closing it", (await lifecycle.CloseAsync(_graph, id, null, Samples.Operator)).Refusal);
        _test.Log.Append(id, new OutcomeLogged(new SegmentId("S109"), FaultType.LG), Samples.Operator);
        Assert.Equal("the return to normal follows the repair: move the incident to repaired first",
            (await back.TickAsync(_graph, id, 1, Samples.Operator)).Refusal);
        Assert.True(lifecycle.MoveTo(id, IncidentStage.Repaired, Samples.Operator).IsLogged);

        // The tripped breaker is still open: the return order closes it, in its own steps, before the incident closes.
        Assert.Equal([(new SwitchId("CB-A1"), SwitchPosition.Open, SwitchPosition.Closed)], IncidentLifecycle.OffNormal(_graph.Grid, _test.Log.State(id)));
        var order = (await analysis.ReturnAsync(_graph, _test.Log.State(id))).Plan!;
        Assert.Contains(order.Steps, s => s.Action == Core.Switching.StepAction.Close && s.Device == new SwitchId("CB-A1"));
        Assert.StartsWith("carry out the return to normal first: step 1", (await lifecycle.CloseAsync(_graph, id, null, Samples.Operator)).Refusal, StringComparison.Ordinal);
        if (order.Steps.Length > 1)
        {
            Assert.StartsWith("return step 1 (", (await back.TickAsync(_graph, id, order.Steps[^1].Order, Samples.Operator)).Refusal, StringComparison.Ordinal);
        }

        await TickReturnThrough(id, back, analysis);
        var returned = _test.Log.State(id);
        Assert.Equal(order.Steps.Length, returned.ReturnSteps.Length);
        // Its own events: not deviations, not ticks of the fault's order.
        Assert.Empty(returned.Deviations);
        Assert.Empty(returned.CompletedSteps);
        Assert.Empty(IncidentLifecycle.OffNormal(_graph.Grid, returned));
        Assert.Equal($"return step 1 is already ticked", (await back.TickAsync(_graph, id, 1, Samples.Operator)).Refusal);
        Assert.True((await lifecycle.CloseAsync(_graph, id, "back to normal", Samples.Operator)).IsLogged);

        Assert.Equal("incident 1 is closed: an engineer reopens it with a reason", lifecycle.MoveTo(id, IncidentStage.Repaired, Samples.Operator).Refusal);
        Assert.Equal("only an engineer reopens an incident", lifecycle.Reopen(id, "fault again", Samples.Operator).Refusal);
        Assert.Equal("give the reason for reopening", lifecycle.Reopen(id, "", Engineer).Refusal);
        Assert.True(lifecycle.Reopen(id, "fault again on S109", Engineer).IsLogged);
        Assert.Equal("incident 1 is open", lifecycle.Reopen(id, "again", Engineer).Refusal);

        var state = _test.Log.State(id);
        Assert.Equal(
            [IncidentStage.Open, IncidentStage.Located, IncidentStage.Repaired, IncidentStage.Closed, IncidentStage.Repaired],
            state.Stages.Select(s => s.Stage));
        Assert.Equal((Engineer, "fault again on S109"), (state.Stages[^1].Actor, state.Stages[^1].Reason));
    }

    [Fact]
    public async Task A_no_fault_found_outcome_needs_no_repair_before_the_return_and_lets_the_incident_close()
    {
        var id = OpenTrip();
        var analysis = Analysis();
        var lifecycle = new IncidentLifecycle(_test.Log, analysis);
        var back = new ReturnSwitching(_test.Log, analysis);
        _test.Log.Append(id, new NoFaultFoundLogged(Transient: true, FaultType.LG, "patrolled, nothing found"), Samples.Operator);

        var state = _test.Log.State(id);
        Assert.True(state.HasOutcome);
        Assert.Null(state.Outcome);
        Assert.Null(ReturnSwitching.NotYet(state));
        await TickReturnThrough(id, back, analysis);
        Assert.True((await lifecycle.CloseAsync(_graph, id, null, Samples.Operator)).IsLogged);
    }

    [Fact]
    public async Task The_board_line_gives_the_age_from_the_fault_the_customers_off_and_the_current_step()
    {
        var id = OpenTrip();
        new FeederLocate.Application.Times.IncidentTimesEntry(_test.Log, TestClock.Manual()).Enter(id, TestClock.Start.AddMinutes(-40), null, null, Samples.Operator);
        var analysis = new IncidentAnalysis(new GridLearning(_test.Log), new CoreFaultRanker());

        var line = await IncidentOverview.LineAsync(_graph, _test.Log.State(id), analysis, TestClock.Start);

        Assert.Equal(TimeSpan.FromMinutes(40), line.Age);
        // With CB-A1 open, every customer of feeder A1 is off: the sum over the nodes the breaker feeds.
        var normal = _graph.Energise(SwitchStates.Normal(_graph.Grid));
        var tripped = _graph.Energise(SwitchStates.Normal(_graph.Grid).With(new SwitchId("CB-A1"), SwitchPosition.Open));
        var expected = _graph.Grid.Nodes.Where(n => normal.IsEnergised(n.Id) && !tripped.IsEnergised(n.Id)).Sum(n => n.Customers);
        Assert.True(expected > 0);
        Assert.Equal(expected, line.CustomersOff);
        Assert.StartsWith("1. ", line.CurrentStep, StringComparison.Ordinal);
        Assert.Equal(IncidentStage.Open, line.Stage);
    }

    [Fact]
    public async Task The_return_order_opens_the_tie_before_closing_the_breaker_and_the_device_rules_refuse_the_parallel()
    {
        // A tie closed during the restoration, the faulted feeder's breaker still open: closing the breaker
        // before opening the tie would feed the tail from both substations.
        var id = OpenTrip();
        var analysis = Analysis();
        var back = new ReturnSwitching(_test.Log, analysis);
        _test.Log.Append(id, new SwitchingDeviationRecorded(new SwitchId("NO-A1-B1"), SwitchPosition.Closed, "tail fed from B1"), Engineer);
        _test.Log.Append(id, new OutcomeLogged(new SegmentId("S109"), FaultType.LG), Samples.Operator);
        new IncidentLifecycle(_test.Log, analysis).MoveTo(id, IncidentStage.Repaired, Samples.Operator);
        var now = FeederLocate.Application.Switching.IncidentSwitching.Current(_graph.Grid, _test.Log.State(id));
        Assert.False(RadialCheck.Of(_graph, now.With(new SwitchId("CB-A1"), SwitchPosition.Closed)).IsRadial);
        Assert.Equal("closing CB-A1 would close a loop or parallel two substations",
            Core.Switching.StepCheck.CheckAfterRepair(_graph, now, new SwitchId("CB-A1"), SwitchPosition.Closed));

        var order = (await analysis.ReturnAsync(_graph, _test.Log.State(id))).Plan!;
        var openTie = order.Steps.Single(s => s.Device == new SwitchId("NO-A1-B1") && s.Action == Core.Switching.StepAction.Open);
        var closeBreaker = order.Steps.Single(s => s.Device == new SwitchId("CB-A1") && s.Action == Core.Switching.StepAction.Close);
        Assert.True(openTie.Order < closeBreaker.Order);

        await TickReturnThrough(id, back, analysis);
        Assert.Empty(IncidentLifecycle.OffNormal(_graph.Grid, _test.Log.State(id)));
    }
}
