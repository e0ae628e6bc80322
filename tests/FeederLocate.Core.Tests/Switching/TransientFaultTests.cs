using FeederLocate.Core.Evaluation;
using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;
using FeederLocate.Core.Ranking;
using FeederLocate.Core.Switching;
using FeederLocate.Core.Synthetic;
using FeederLocate.Core.Tests.Support;
using FeederLocate.Core.Topology;

namespace FeederLocate.Core.Tests.Switching;

/// <summary>A fault cleared by a reclosure that held (FORMATS.md, protection context): the plan switches nothing.</summary>
public class TransientFaultTests
{
    [Fact]
    public void Sample_transient_fault_is_patrolled_not_switched()
    {
        // The sample trip of CB-A1 (sample-grid/README.md), whose first reclosure held.
        var (graph, incident) = PlanSafetyTests.Load("solid-transient-a1.incident.json", "solid");
        Assert.True(incident.Reclosing!.Transient);
        var ranking = FaultRanking.Rank(graph, incident);
        var plan = SwitchingPlanner.Plan(graph, incident, ranking);

        Assert.Empty(plan.IsolatedSections);
        Assert.DoesNotContain(plan.Steps, s => s.ChangesNetwork);
        Assert.Equal(0, plan.UnservedCustomers);
        Assert.Equal(0, plan.RestoredCustomers);
        Assert.Empty(plan.TestOrder);

        // The patrol starts with the most likely section, and every patrolled section is named in the plan.
        var patrols = plan.Steps.Where(s => s.Action == StepAction.Patrol).ToList();
        Assert.Equal(graph.Sections[ranking.Sections[0].Id].Segments, patrols[0].Segments);
        Assert.All(patrols, p => Assert.Contains(plan.Sections, s => s.Segments.SequenceEqual(p.Segments)));
        Assert.Contains(plan.Steps, s => s.Action == StepAction.Verify && s.Device == new SwitchId("CB-A1"));
        Assert.Empty(new PlanChecker(graph.Grid).Check(incident, plan, new SegmentId("S109"), standing: false).Problems);
    }

    [Theory]
    [InlineData(GroundingScheme.Solid)]
    [InlineData(GroundingScheme.Impedance)]
    [InlineData(GroundingScheme.Isolated)]
    [InlineData(GroundingScheme.Resonant)]
    public void Transient_faults_on_generated_grids_switch_nothing(GroundingScheme scheme)
    {
        var grid = SyntheticGrid.Generate(new SyntheticGridOptions(60, 7, scheme, 0.3, SegmentsPerFeeder: 15, SegmentsPerSwitch: 3));
        var graph = new NetworkGraph(grid);
        var simulator = new IncidentSimulator(graph, new SimulationSettings());
        var random = new Random(11);
        var checker = new PlanChecker(grid);
        var planned = 0;
        for (var n = 0; n < 30 && planned < 6; n++)
        {
            var simulated = simulator.Next(random, n);
            if (simulated.Incident.TrippedDevice is not { } tripped || grid.Switch(tripped).Kind is not (SwitchKind.Breaker or SwitchKind.Recloser))
            {
                continue;
            }

            var incident = simulated.Incident with { Reclosing = new Reclosing(tripped, 1, ReclosingResult.Success), Fuses = simulated.Incident.Fuses.Clear() };
            var plan = SwitchingPlanner.Plan(graph, incident, FaultRanking.Rank(graph, incident));
            planned++;
            Assert.Empty(plan.IsolatedSections);
            Assert.Contains(plan.Steps, s => s.Action == StepAction.Patrol);
            var problems = checker.Check(incident, plan, simulated.Segment, standing: false).Problems;
            Assert.True(problems.Count == 0, string.Join("; ", problems));
        }

        Assert.True(planned > 0, "no tripping incident was simulated: the check would be vacuous");
    }
}
