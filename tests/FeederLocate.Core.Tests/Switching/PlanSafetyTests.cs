using FeederLocate.Core.Evaluation;
using FeederLocate.Core.Model;
using FeederLocate.Core.Ranking;
using FeederLocate.Core.Switching;
using FeederLocate.Core.Tests.Support;
using FeederLocate.Core.Topology;

namespace FeederLocate.Core.Tests.Switching;

public class PlanSafetyTests(Xunit.Abstractions.ITestOutputHelper output)
{
    private const int IncidentsPerGrid = 16;

    [Theory]
    [InlineData("solid")]
    [InlineData("impedance")]
    [InlineData("isolated")]
    [InlineData("resonant")]
    public void Plans_for_simulated_incidents_keep_every_rule_and_limit(string scheme)
    {
        var grid = Grids.Sample(scheme);
        var graph = new NetworkGraph(grid);
        var simulator = new IncidentSimulator(graph, new SimulationSettings());
        var random = new Random(scheme.Length * 7919);
        var checker = new PlanChecker(grid);
        var restoring = 0;
        var wrongTop = 0;
        var reenergised = 0;
        var testEntries = 0;
        for (var n = 0; n < IncidentsPerGrid; n++)
        {
            var simulated = simulator.Next(random, n);
            var ranking = FaultRanking.Rank(graph, simulated.Incident);
            var truth = graph.Sections.OfSegment(grid.SegmentIndex(simulated.Segment)).Id;
            var standing = simulated.Incident.TrippedDevice is null;
            wrongTop += ranking.Sections[0].Id == truth ? 0 : 1;
            foreach (var section in new[] { truth, ranking.Sections[0].Id }.Distinct())
            {
                var plan = SwitchingPlanner.Plan(graph, simulated.Incident, section, ranking);
                var (problems, back) = checker.Check(simulated.Incident, plan, simulated.Segment, standing);
                Assert.True(problems.Count == 0, $"incident {n} ({simulated.Type} on {simulated.Segment}), plan for {section}: {string.Join("; ", problems)}");
                var tests = checker.CheckTestOrder(simulated.Incident, plan, simulated.Segment, standing);
                Assert.True(tests.Problems.Count == 0, $"incident {n}, test order of the plan for {section}: {string.Join("; ", tests.Problems)}");
                testEntries += tests.Entries;
                var returnProblems = checker.CheckReturn(simulated.Incident, plan, SwitchingPlanner.PlanReturn(graph, simulated.Incident, plan));
                Assert.True(returnProblems.Count == 0, $"incident {n}, return to normal after the plan for {section}: {string.Join("; ", returnProblems)}");
                Assert.False(back && section == truth, $"incident {n}: the plan for the true section re-energised the fault");
                reenergised += back ? 1 : 0;
                restoring += plan.RestoredCustomers > 0 ? 1 : 0;
            }
        }

        // Only a plan made for the wrong section can put the fault back on.
        Assert.InRange(reenergised, 0, wrongTop);
        Assert.True(restoring >= IncidentsPerGrid / 2, $"only {restoring} plans restored anyone: the check would be vacuous");
        output.WriteLine($"{scheme}: {testEntries} test entries replayed");
    }

    [Fact]
    public void Plan_for_the_sample_trip_isolates_the_section_and_restores_both_sides()
    {
        var (graph, incident) = Load("solid-lg-trip-a1.incident.json", "solid");
        var ranking = FaultRanking.Rank(graph, incident);
        var plan = SwitchingPlanner.Plan(graph, incident, ranking);

        // The sample's fault is on S109 (sample-grid/README.md): its section is {S108, S109}.
        Assert.Equal(new SectionId("SEC-S108"), Assert.Single(plan.IsolatedSections));
        var (problems, back) = new PlanChecker(graph.Grid).Check(incident, plan, new SegmentId("S109"), standing: false);
        Assert.Empty(problems);
        Assert.False(back);
        var operated = plan.Steps.Where(s => s.ChangesNetwork).Select(s => (s.Action, s.Device!.Value.Value)).ToList();
        Assert.Contains((StepAction.Open, "LB-A1-3"), operated);
        Assert.Contains((StepAction.Open, "LB-A1-4"), operated);
        Assert.Contains((StepAction.Open, "DS-A1-5"), operated);
        Assert.Contains((StepAction.Close, "CB-A1"), operated);
        Assert.Contains((StepAction.Close, "NO-A1-B1"), operated);
        Assert.Equal(plan.Steps.Count(s => s.Action == StepAction.ProveDead), plan.Steps.Count(s => s.Action == StepAction.Earth));
        Assert.Equal(StepAction.Permit, plan.Steps[^1].Action);
    }

    [Fact]
    public void Remote_devices_restore_first_and_manual_ones_wait_for_their_crew()
    {
        var (graph, incident) = Load("solid-lg-trip-a1.incident.json", "solid");
        var plan = SwitchingPlanner.Plan(graph, incident, FaultRanking.Rank(graph, incident));

        // The feeder head recloses within minutes behind the remote LB-A1-1; the manual LB-A1-3
        // (travelMinutes 25 in the sample grid) opens only after its crew arrives.
        var head = plan.Steps.First(s => s.Action == StepAction.Close && s.Device == new SwitchId("CB-A1"));
        var manual = plan.Steps.First(s => s.Device == new SwitchId("LB-A1-3") && s.Action == StepAction.Open);
        Assert.True(head.At <= TimeSpan.FromMinutes(5), $"head recloses at {head.At}");
        Assert.True(manual.At >= TimeSpan.FromMinutes(25), $"LB-A1-3 opens at {manual.At}");
        Assert.True(head.Order < manual.Order);
        Assert.Contains(plan.Steps, s => s.Action == StepAction.Dispatch && s.Device == new SwitchId("LB-A1-3") && s.At == TimeSpan.Zero);
    }

    [Fact]
    public void Customer_minutes_follow_the_steps_times()
    {
        var (graph, incident) = Load("solid-lg-trip-a1.incident.json", "solid");
        var plan = SwitchingPlanner.Plan(graph, incident, FaultRanking.Rank(graph, incident));

        // Recount by hand from the steps: the whole feeder (1040 customers, sample-grid/README.md) is out
        // at the start; each close brings its customers back at its time; the rest stay out to the last switching step.
        var grid = graph.Grid;
        var states = SwitchStates.AfterTrip(grid, incident);
        var network = graph.Energise(states);
        int Out(EnergisedNetwork n) => Enumerable.Range(0, grid.Nodes.Length).Where(v => !n.IsEnergised(v)).Sum(v => grid.Nodes[v].Customers);
        var changes = new List<SupplyChange>();
        Assert.Equal(1040, Out(network));
        foreach (var step in plan.Steps.Where(s => s.ChangesNetwork))
        {
            states = states.With(step.Device!.Value, step.Action == StepAction.Open ? Evidence.SwitchPosition.Open : Evidence.SwitchPosition.Closed);
            changes.Add(new SupplyChange(step.At, Out(graph.Energise(states))));
        }

        var expected = CustomerMinutes.Interrupted(1040, changes, changes[^1].At);
        Assert.Equal(expected, plan.CustomerMinutesInterrupted, 6);
        Assert.True(plan.CustomerMinutesInterrupted < 1040 * changes[^1].At.TotalMinutes, "restoring along the way must beat leaving everyone out");
    }

    [Fact]
    public void A_live_suspect_is_de_energised_by_a_device_that_can_break_its_current()
    {
        // Standing earth fault on the isolated sample: a load-break switch may break it (IEC 62271-103).
        var (graph, incident) = Load("isolated-standing-earth-fault-a2.incident.json", "isolated");
        var plan = SwitchingPlanner.Plan(graph, incident, FaultRanking.Rank(graph, incident));
        var first = plan.Steps.First(s => s.ChangesNetwork);
        Assert.Equal(StepAction.Open, first.Action);
        Assert.Equal(SwitchKind.LoadBreakSwitch, graph.Grid.Switch(first.Device!.Value).Kind);

        // The same section with a short circuit that somehow left it live: only a breaker may open it.
        var solid = new NetworkGraph(Grids.Sample("solid"));
        var tripping = incident with { FaultType = Evidence.FaultType.LLL };
        var plan2 = SwitchingPlanner.Plan(solid, tripping, plan.IsolatedSections[0]);
        var first2 = plan2.Steps.First(s => s.ChangesNetwork);
        Assert.Equal(SwitchKind.Breaker, solid.Grid.Switch(first2.Device!.Value).Kind);
        Assert.Empty(new PlanChecker(solid.Grid).Check(tripping, plan2, plan.Sections[0].Segments[0], standing: false).Problems);
    }

    [Fact]
    public void Unknown_section_is_refused_with_its_id()
    {
        var (graph, incident) = Load("solid-lg-trip-a1.incident.json", "solid");
        var e = Assert.Throws<PlanningException>(() => SwitchingPlanner.Plan(graph, incident, new SectionId("SEC-NOPE")));
        Assert.Contains("SEC-NOPE", e.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void Options_out_of_range_are_refused()
    {
        var (graph, incident) = Load("solid-lg-trip-a1.incident.json", "solid");
        Assert.Throws<ArgumentOutOfRangeException>(() => SwitchingPlanner.Plan(graph, incident, new SectionId("SEC-S108"), null, new SwitchingOptions { ColdLoadFactor = 0.5 }));
        Assert.Throws<ArgumentOutOfRangeException>(() => SwitchingPlanner.Plan(graph, incident, new SectionId("SEC-S108"), null, new SwitchingOptions { VoltageLimitPu = 1.2 }));
    }

    internal static (NetworkGraph Graph, Evidence.Incident Incident) Load(string incidentFile, string scheme)
    {
        var grid = Grids.Sample(scheme);
        var incident = Core.Formats.IncidentReader.Parse(RepositoryFiles.Read("sample-grid", "incidents", incidentFile), grid).ValueOrThrow();
        return (new NetworkGraph(grid), incident);
    }
}
