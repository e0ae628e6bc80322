using FeederLocate.Core.Evaluation;
using FeederLocate.Core.Model;
using FeederLocate.Core.Ranking;
using FeederLocate.Core.Switching;
using FeederLocate.Core.Synthetic;
using FeederLocate.Core.Topology;

namespace FeederLocate.Core.Tests.Switching;

/// <summary>
/// On generated grids with crews (every grounding scheme, several shapes and crew numbers, fixed seeds):
/// every plan, its test order and its return keep each crew in one place at a time, and the plan checker
/// passes them all.
/// </summary>
public class CrewPropertyTests(Xunit.Abstractions.ITestOutputHelper output)
{
    private const int IncidentsPerGrid = 6;

    public static TheoryData<GroundingScheme> Schemes => new() { GroundingScheme.Isolated, GroundingScheme.Resonant, GroundingScheme.Solid, GroundingScheme.Impedance };

    [Theory]
    [MemberData(nameof(Schemes))]
    public void Every_crew_does_one_thing_at_a_time_in_plans_test_orders_and_returns(GroundingScheme scheme)
    {
        var operations = 0;
        var entries = 0;
        var plans = 0;
        for (var seed = 1; seed <= 3; seed++)
        {
            // One base with one crew (everything queues), two bases of two, three bases of one: shapes as the restoration cases.
            var options = new SyntheticGridOptions(30 + (10 * seed), seed, scheme, 0.4, SegmentsPerFeeder: 10, SegmentsPerSwitch: 2, Substations: 2)
            {
                DisconnectorShare = 0.3,
                FuseShare = 0.2,
                ExtraTiesPerFeeder = seed - 1,
                CrewBases = seed,
                CrewsPerBase = seed == 2 ? 2 : 1,
            };
            var grid = SyntheticGrid.Generate(options);
            var graph = new NetworkGraph(grid);
            var simulator = new IncidentSimulator(graph, new SimulationSettings());
            var random = new Random(seed * 104_729);
            var checker = new PlanChecker(grid);
            var crews = new CrewCheck(grid, SwitchingOptions.Default);
            for (var n = 0; n < IncidentsPerGrid; n++)
            {
                var simulated = simulator.Next(random, n);
                var ranking = FaultRanking.Rank(graph, simulated.Incident);
                var truth = graph.Sections.OfSegment(grid.SegmentIndex(simulated.Segment)).Id;
                var standing = simulated.Incident.TrippedDevice is null;
                var plan = SwitchingPlanner.Plan(graph, simulated.Incident, truth, ranking);
                var where = $"seed {seed}, incident {n} ({simulated.Type} on {simulated.Segment})";

                Assert.Empty(Tagged(where, checker.Check(simulated.Incident, plan, simulated.Segment, standing).Problems));
                Assert.Empty(Tagged(where, checker.CheckTestOrder(simulated.Incident, plan, simulated.Segment, standing).Problems));
                Assert.Empty(Tagged(where, crews.Check(plan)));
                Assert.Equal(Recounted(graph, simulated.Incident, plan), plan.CustomerMinutesInterrupted, 6);
                var back = SwitchingPlanner.PlanReturn(graph, simulated.Incident, plan);
                Assert.Empty(Tagged(where, checker.CheckReturn(simulated.Incident, plan, back)));
                Assert.Empty(Tagged(where, crews.Check(back)));
                plans++;
            }

            operations += crews.CheckedOperations;
            entries += crews.CheckedEntries;
        }

        // Not vacuous: crews operated manual devices (in plans and returns).
        Assert.True(operations >= plans, $"only {operations} crew operations in {plans} plans");
        output.WriteLine($"{scheme}: {plans} plans, {operations} crew operations, {entries} test entries followed");
    }

    [Fact]
    public void Test_orders_carry_the_crews_from_entry_to_entry()
    {
        // Isolated and resonant networks with a standing earth fault give earth-fault searches: their entries are
        // followed with the crews where the entries before left them. Over these seeds some entry must use a crew.
        var used = 0;
        foreach (var scheme in new[] { GroundingScheme.Isolated, GroundingScheme.Resonant })
        {
            for (var seed = 1; seed <= 4; seed++)
            {
                var grid = SyntheticGrid.Generate(new SyntheticGridOptions(40, seed, scheme, 0.4, SegmentsPerFeeder: 10, SegmentsPerSwitch: 2)
                {
                    DisconnectorShare = 0.3,
                    CrewBases = 1,
                    CrewsPerBase = 1,
                });
                var graph = new NetworkGraph(grid);
                var simulator = new IncidentSimulator(graph, new SimulationSettings());
                var random = new Random(seed * 7_919);
                var crews = new CrewCheck(grid, SwitchingOptions.Default);
                for (var n = 0; n < IncidentsPerGrid; n++)
                {
                    var simulated = simulator.Next(random, n);
                    var ranking = FaultRanking.Rank(graph, simulated.Incident);
                    var truth = graph.Sections.OfSegment(grid.SegmentIndex(simulated.Segment)).Id;
                    var plan = SwitchingPlanner.Plan(graph, simulated.Incident, truth, ranking);
                    Assert.Empty(crews.Check(plan));
                    used += plan.TestOrder.SelectMany(e => e.Steps).Count(s => s.Crew is not null);
                }
            }
        }

        Assert.True(used > 0, "no test entry used a crew: the check of the test orders would be vacuous");
    }

    /// <summary>
    /// IEEE 1366 CMI counted again from the steps' times: everyone the trip left without supply is out from the
    /// start; each open or close changes who is out at its time; the count runs to the last switching step.
    /// </summary>
    private static double Recounted(NetworkGraph graph, Evidence.Incident incident, SwitchingPlan plan)
    {
        var grid = graph.Grid;
        var states = SwitchStates.AfterTrip(grid, incident);
        var affected = graph.Energise(SwitchStates.AtFaultTime(grid, incident));
        int Out(SwitchStates s)
        {
            var network = graph.Energise(s);
            return Enumerable.Range(0, grid.Nodes.Length).Where(v => affected.IsEnergised(v) && !network.IsEnergised(v)).Sum(v => grid.Nodes[v].Customers);
        }

        var atStart = Out(states);
        var changes = new List<SupplyChange>();
        foreach (var step in plan.Steps.Where(s => s.ChangesNetwork))
        {
            states = states.With(step.Device!.Value, step.Action == StepAction.Open ? Evidence.SwitchPosition.Open : Evidence.SwitchPosition.Closed);
            changes.Add(new SupplyChange(step.At, Out(states)));
        }

        return CustomerMinutes.Interrupted(atStart, changes, changes.Count > 0 ? changes[^1].At : TimeSpan.Zero);
    }

    private static IEnumerable<string> Tagged(string where, IEnumerable<string> problems) => problems.Select(p => $"{where}: {p}");
}
