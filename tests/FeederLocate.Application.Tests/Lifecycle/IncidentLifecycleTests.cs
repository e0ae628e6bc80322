using FeederLocate.Application.Analysis;
using FeederLocate.Application.History;
using FeederLocate.Application.Lifecycle;
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

    [Fact]
    public void An_incident_moves_on_stage_by_stage_closes_after_outcome_and_return_to_normal_and_an_engineer_reopens_it()
    {
        var id = OpenTrip();
        var lifecycle = new IncidentLifecycle(_test.Log);

        Assert.True(lifecycle.MoveTo(id, IncidentStage.Located, Samples.Operator).IsLogged);
        Assert.Equal("the return to normal follows the repair: move the incident to repaired first",
            lifecycle.ReturnToNormal(_graph, id, new SwitchId("CB-A1"), Samples.Operator).Refusal);
        Assert.Equal("incident 1 is already located: stages only move on", lifecycle.MoveTo(id, IncidentStage.Located, Samples.Operator).Refusal);
        Assert.True(lifecycle.MoveTo(id, IncidentStage.Repaired, Samples.Operator).IsLogged);
        Assert.Equal("log the outcome of incident 1 before closing it", lifecycle.Close(_graph.Grid, id, null, Samples.Operator).Refusal);
        _test.Log.Append(id, new OutcomeLogged(new SegmentId("S109"), FaultType.LG), Samples.Operator);
        // The tripped breaker is still open: the return to normal closes it before the incident closes.
        Assert.Equal([(new SwitchId("CB-A1"), SwitchPosition.Open, SwitchPosition.Closed)], IncidentLifecycle.OffNormal(_graph.Grid, _test.Log.State(id)));
        Assert.Equal("return to normal first: CB-A1 is open, normally closed", lifecycle.Close(_graph.Grid, id, null, Samples.Operator).Refusal);
        Assert.Equal("LB-A1-3 is in its normal position", lifecycle.ReturnToNormal(_graph, id, new SwitchId("LB-A1-3"), Samples.Operator).Refusal);
        Assert.True(lifecycle.ReturnToNormal(_graph, id, new SwitchId("CB-A1"), Samples.Operator).IsLogged);
        Assert.True(lifecycle.Close(_graph.Grid, id, "back to normal", Samples.Operator).IsLogged);

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
    public void The_return_to_normal_refuses_to_parallel_two_substations()
    {
        // A tie closed during the restoration, the faulted feeder's breaker still open: closing the breaker
        // before opening the tie would feed the tail from both substations.
        var id = OpenTrip();
        var lifecycle = new IncidentLifecycle(_test.Log);
        _test.Log.Append(id, new SwitchingDeviationRecorded(new SwitchId("NO-A1-B1"), SwitchPosition.Closed, "tail fed from B1"), Engineer);
        lifecycle.MoveTo(id, IncidentStage.Repaired, Samples.Operator);
        var now = FeederLocate.Application.Switching.IncidentSwitching.Current(_graph.Grid, _test.Log.State(id));
        Assert.False(RadialCheck.Of(_graph, now.With(new SwitchId("CB-A1"), SwitchPosition.Closed)).IsRadial);

        var early = lifecycle.ReturnToNormal(_graph, id, new SwitchId("CB-A1"), Samples.Operator);
        var tieFirst = lifecycle.ReturnToNormal(_graph, id, new SwitchId("NO-A1-B1"), Samples.Operator);
        var breaker = lifecycle.ReturnToNormal(_graph, id, new SwitchId("CB-A1"), Samples.Operator);

        Assert.Equal("putting CB-A1 back closed would close a loop or parallel two substations: open the other device first", early.Refusal);
        Assert.True(tieFirst.IsLogged);
        Assert.True(breaker.IsLogged);
        Assert.Empty(IncidentLifecycle.OffNormal(_graph.Grid, _test.Log.State(id)));
    }
}
