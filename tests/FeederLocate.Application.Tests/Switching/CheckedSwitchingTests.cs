using FeederLocate.Application.Analysis;
using FeederLocate.Application.History;
using FeederLocate.Application.Switching;
using FeederLocate.Application.Tests.Support;
using FeederLocate.Core.Evaluation;
using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;
using FeederLocate.Core.Ranking;
using FeederLocate.Core.Switching;
using FeederLocate.Core.Synthetic;
using FeederLocate.Core.Topology;
using FeederLocate.Storage.Events;
using FeederLocate.Storage.Incidents;

namespace FeederLocate.Application.Tests.Switching;

public sealed class CheckedSwitchingTests : IDisposable
{
    private static readonly Actor Engineer = new("eli", "engineer");
    private readonly TestLog _test = new();

    public void Dispose() => _test.Dispose();

    public static TheoryData<string> Cases() => new()
    {
        "resonant:resonant-standing-earth-fault-b1.incident.json",
        "solid:solid-lg-trip-a1.incident.json",
        "isolated:isolated-standing-earth-fault-a2.incident.json",
        "synthetic-solid:7",
        "synthetic-impedance:5",
        "synthetic-isolated:11",
        "synthetic-resonant:3",
    };

    /// <summary>A grid and an incident on it: a sample one, or one simulated on a generated grid of another shape.</summary>
    private static (NetworkGraph Graph, Incident Incident) Case(string name)
    {
        var (kind, detail) = (name.Split(':')[0], name.Split(':')[1]);
        if (!kind.StartsWith("synthetic-", StringComparison.Ordinal))
        {
            var graph = Samples.Graph(kind);
            return (graph, Samples.Incident(detail, graph.Grid));
        }

        var scheme = Enum.Parse<GroundingScheme>(kind["synthetic-".Length..], ignoreCase: true);
        var seed = int.Parse(detail, System.Globalization.CultureInfo.InvariantCulture);
        var generated = new NetworkGraph(SyntheticGrid.Generate(new SyntheticGridOptions(90, seed, scheme, IndicatorsPerSegment: 0.3, SegmentsPerFeeder: 30, SegmentsPerSwitch: 3)));
        return (generated, new IncidentSimulator(generated, new SimulationSettings()).Next(new Random(seed), 1).Incident);
    }

    private (IncidentId Id, SwitchingPlan Plan) Open(NetworkGraph graph, Incident incident)
    {
        var id = _test.Log.Open(graph.Grid, incident, Samples.Operator);
        return (id, PlanOf(graph, _test.Log.State(id)));
    }

    private static SwitchingPlan PlanOf(NetworkGraph graph, IncidentState state)
    {
        var ranking = EvidenceAnalysis.Rank(graph, state.Incident, RankingPriors.None).Result!;
        var outcome = EvidenceAnalysis.Plan(graph, state.PlanBasis, ranking);
        return outcome.Plan ?? throw new InvalidOperationException(outcome.Problem);
    }

    /// <summary>The use case with the core's ranking and no learned priors beyond the (empty) log's.</summary>
    private CheckedSwitching Switching() => new(_test.Log, new IncidentAnalysis(new GridLearning(_test.Log), new CoreFaultRanker()));

    [Fact]
    public async Task By_number_a_tick_takes_the_present_plan_and_refuses_a_step_it_does_not_have()
    {
        var graph = Samples.Graph("resonant");
        var (id, plan) = Open(graph, Samples.Incident("resonant-standing-earth-fault-b1.incident.json", graph.Grid));
        var switching = Switching();

        Assert.True((await switching.TickAsync(graph, id, 1, Samples.Operator)).IsLogged);
        Assert.Equal($"step 99 is not a step of the present switching order (steps 1 to {plan.Steps.Length})",
            (await switching.TickAsync(graph, id, 99, Samples.Operator)).Refusal);
        Assert.StartsWith("step 2 (", (await switching.TickAsync(graph, id, 3, Samples.Operator)).Refusal, StringComparison.Ordinal);
        Assert.Equal([1], _test.Log.State(id).CompletedSteps.Select(d => d.Step.Order));
    }

    [Fact]
    public async Task A_steps_actual_time_is_kept_and_one_in_the_future_is_refused()
    {
        var graph = Samples.Graph("resonant");
        var (id, _) = Open(graph, Samples.Incident("resonant-standing-earth-fault-b1.incident.json", graph.Grid));
        var clock = TestClock.Manual();
        var switching = new CheckedSwitching(_test.Log, new IncidentAnalysis(new GridLearning(_test.Log), new CoreFaultRanker()), clock);

        var future = await switching.TickAsync(graph, id, 1, Samples.Operator, TestClock.Start.AddMinutes(3));
        var earlier = await switching.TickAsync(graph, id, 1, Samples.Operator, TestClock.Start.AddMinutes(-4));

        Assert.Equal("step 1 done at 2026-03-14T05:48:00Z is in the future (now 2026-03-14T05:45:00Z)", future.Refusal);
        Assert.True(earlier.IsLogged);
        var done = Assert.Single(_test.Log.State(id).CompletedSteps);
        Assert.Equal(TestClock.Start.AddMinutes(-4), done.DoneAt);
        Assert.Equal(TestClock.Start, done.CompletedAt);
    }

    [Fact]
    public void Closing_the_tie_before_opening_the_downstream_boundary_is_refused_with_the_reason()
    {
        // The report's reproduction, on any plan that closes a tie: the ticks up to a boundary that must open first,
        // then the tie's close. (The resonant demo incident is now searched first and closes no tie onto a suspect.)
        var graph = Samples.Graph("solid");
        var (id, plan) = Open(graph, Samples.Incident("solid-lg-trip-a1.incident.json", graph.Grid));
        var switching = Switching();
        var close = plan.Steps.First(s => s.Action == StepAction.Close && s.Device is { } d && graph.Grid.Switches[graph.Grid.SwitchIndex(d)].NormallyOpen);
        var open = plan.Steps.Last(s => s.Action == StepAction.Open && s.Order < close.Order);
        foreach (var step in plan.Steps.Where(s => s.Order < open.Order))
        {
            Assert.True(switching.Tick(graph, _test.Log.State(id), plan, step, Samples.Operator).IsLogged);
        }

        var events = _test.Log.Events(id).Count;

        var decision = switching.Tick(graph, _test.Log.State(id), plan, close, Samples.Operator);

        Assert.False(decision.IsLogged);
        Assert.Contains($"step {open.Order} (open {open.Device}) is not done yet", decision.Refusal, StringComparison.Ordinal);
        Assert.Equal(events, _test.Log.Events(id).Count);
    }

    [Theory]
    [MemberData(nameof(Cases))]
    public void Every_step_of_the_plan_ticked_in_order_is_accepted_and_leaves_the_plan_positions(string name)
    {
        var (graph, incident) = Case(name);
        var (id, plan) = Open(graph, incident);
        var switching = Switching();

        foreach (var step in plan.Steps)
        {
            var decision = switching.Tick(graph, _test.Log.State(id), plan, step, Samples.Operator);
            Assert.True(decision.IsLogged, $"step {step.Order}: {decision.Refusal}");
        }

        var final = IncidentSwitching.Current(graph.Grid, _test.Log.State(id));
        var suspect = graph.Sections[plan.IsolatedSections[0]];
        var network = graph.Energise(final);
        Assert.All(suspect.Segments, s => Assert.False(network.IsSegmentEnergised(s), $"{s} is live after the plan"));
    }

    [Theory]
    [MemberData(nameof(Cases))]
    public void Operations_the_rules_allow_never_close_a_loop_parallel_substations_or_energise_a_dead_suspect_section(string name)
    {
        // Property: a random walk of single operations from the incident's positions; each one StepCheck
        // allows is applied. Checked against the topology alone (RadialCheck, the energised network).
        var (graph, incident) = Case(name);
        var (id, plan) = Open(graph, incident);
        var state = _test.Log.State(id);
        var suspect = graph.Sections[plan.IsolatedSections[0]];
        var now = IncidentSwitching.Current(graph.Grid, state);
        var random = new Random(name.Length);
        var allowed = 0;
        for (var move = 0; move < 150; move++)
        {
            var device = graph.Grid.Switches[random.Next(graph.Grid.Switches.Length)];
            var position = now.PositionOf(device.Id) == SwitchPosition.Open ? SwitchPosition.Closed : SwitchPosition.Open;
            if (StepCheck.Check(graph, state.PlanBasis, suspect.Id, now, device.Id, position) is not null)
            {
                continue;
            }

            var deadBefore = suspect.Segments.Where(s => !graph.Energise(now).IsSegmentEnergised(s)).ToList();
            now = now.With(device.Id, position);
            allowed++;
            Assert.True(RadialCheck.Of(graph, now).IsRadial, $"{position} {device.Id} was allowed and is not radial");
            var after = graph.Energise(now);
            Assert.All(deadBefore, s => Assert.False(after.IsSegmentEnergised(s), $"{position} {device.Id} energised the suspect segment {s}"));
        }

        Assert.True(allowed > 0, "the walk never found an allowed operation");
    }

    [Fact]
    public void A_correction_withdraws_a_tick_so_the_step_can_be_ticked_again()
    {
        var graph = Samples.Graph("resonant");
        var (id, plan) = Open(graph, Samples.Incident("resonant-standing-earth-fault-b1.incident.json", graph.Grid));
        var switching = Switching();
        switching.Tick(graph, _test.Log.State(id), plan, plan.Steps[0], Samples.Operator);
        Assert.Equal("step 1 is already ticked", switching.Tick(graph, _test.Log.State(id), plan, plan.Steps[0], Samples.Operator).Refusal);

        Assert.Equal("give the reason for the correction", switching.Correct(_test.Log.State(id), 1, "  ", Samples.Operator).Refusal);
        Assert.Equal("step 2 is not ticked", switching.Correct(_test.Log.State(id), 2, "wrong", Samples.Operator).Refusal);
        Assert.True(switching.Correct(_test.Log.State(id), 1, "crew not yet sent", Samples.Operator).IsLogged);

        var state = _test.Log.State(id);
        Assert.Empty(state.CompletedSteps);
        Assert.Equal("crew not yet sent", Assert.Single(state.Corrections).Reason);
        Assert.True(switching.Tick(graph, state, plan, plan.Steps[0], Samples.Operator).IsLogged);
        Assert.Equal(4, _test.Log.Events(id).Count);
    }

    [Fact]
    public void A_deviation_is_logged_with_the_rule_it_departs_from_and_the_plan_is_made_again_from_it()
    {
        var graph = Samples.Graph("resonant");
        var (id, plan) = Open(graph, Samples.Incident("resonant-standing-earth-fault-b1.incident.json", graph.Grid));
        var switching = Switching();
        // Steps 1 to 4: the search-first note, two crews sent, RC-B1-1 opened.
        foreach (var step in plan.Steps.Take(4))
        {
            switching.Tick(graph, _test.Log.State(id), plan, step, Samples.Operator);
        }

        Assert.Equal("give the reason for the deviation",
            switching.Deviate(graph, _test.Log.State(id), plan.IsolatedSections[0], new SwitchId("LB-B1-3"), SwitchPosition.Open, "", Engineer).Refusal);
        Assert.Equal("RC-B1-1 is already open",
            switching.Deviate(graph, _test.Log.State(id), plan.IsolatedSections[0], new SwitchId("RC-B1-1"), SwitchPosition.Open, "check", Engineer).Refusal);
        var decision = switching.Deviate(graph, _test.Log.State(id), plan.IsolatedSections[0], new SwitchId("NO-A1-B1"), SwitchPosition.Closed, "hospital on B1-09 first", Engineer);

        Assert.True(decision.IsLogged);
        var state = _test.Log.State(id);
        var deviation = Assert.Single(state.Deviations).Deviation;
        Assert.Equal("closing NO-A1-B1 would energise the suspect section", deviation.Departure);
        Assert.Equal(4, state.EarlierSteps.Length);
        Assert.Empty(state.CompletedSteps);
        var now = IncidentSwitching.Current(graph.Grid, state);
        Assert.Equal(SwitchPosition.Closed, now.PositionOf(new SwitchId("NO-A1-B1")));
        Assert.Equal(SwitchPosition.Open, now.PositionOf(new SwitchId("RC-B1-1")));

        // The new plan starts from the real positions: it never closes the tie again, and it opens RC-B1-1 no more.
        var again = PlanOf(graph, state);
        Assert.DoesNotContain(again.Steps, s => s.Action == StepAction.Close && s.Device == new SwitchId("NO-A1-B1"));
        Assert.DoesNotContain(again.Steps, s => s.Action == StepAction.Open && s.Device == new SwitchId("RC-B1-1"));
    }
}
