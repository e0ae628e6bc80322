using FeederLocate.Core.Evaluation;
using FeederLocate.Core.Model;
using FeederLocate.Core.Ranking;
using FeederLocate.Core.Switching;
using FeederLocate.Core.Tests.Support;
using FeederLocate.Core.Topology;

namespace FeederLocate.Core.Tests.Switching;

public class TestOrderTests
{
    /// <summary>Replays the test order with the fault on <paramref name="truth"/> through the plan checker; returns where it ends, how many entries it ran, and the trips.</summary>
    private static (IReadOnlyList<SectionId> FaultIn, int Entries, int Trips) Follow(Grid grid, Evidence.Incident incident, SwitchingPlan plan, SegmentId truth, bool standing)
    {
        var (problems, faultIn, entries, trips) = new PlanChecker(grid).CheckTestOrder(incident, plan, truth, standing);
        Assert.True(problems.Count == 0, string.Join("; ", problems));
        return (faultIn, entries, trips);
    }

    [Fact]
    public void Split_ranking_gets_trial_closures_by_the_tripped_breaker_least_likely_first()
    {
        // The impedance sample: the ranking splits between S209's and S212's sections (about 67/30 %).
        var (graph, incident) = PlanSafetyTests.Load("impedance-lg-trip-a2.incident.json", "impedance");
        var ranking = FaultRanking.Rank(graph, incident);
        Assert.True(ranking.Sections[0].Probability < 0.8);
        var plan = SwitchingPlanner.Plan(graph, incident, ranking);

        Assert.NotEmpty(plan.TestOrder);
        Assert.All(plan.TestOrder, e => Assert.Equal(TestObservation.Trip, e.Observe));

        // Every close that may re-energise a suspect is the tripped breaker's.
        Assert.All(plan.TestOrder, e => Assert.Equal(incident.TrippedDevice, e.Steps[^1].Device));
        Assert.All(plan.TestOrder, e => Assert.True(graph.Grid.Switch(e.Steps[^1].Device!.Value).Kind is SwitchKind.Breaker or SwitchKind.Recloser));
        Assert.Equal(plan.TestOrder.Sum(e => e.FaultProbability), plan.ExpectedReenergisationsOntoFault!.Value, 9);
        Assert.InRange(plan.ExpectedReenergisationsOntoFault!.Value, 0, 1);

        // Each entry's own probability is the ranking's mass of what it re-energises, and its reason quotes that figure.
        foreach (var e in plan.TestOrder)
        {
            var mass = ranking.Sections.Where(s => e.ReenergisesSections.Contains(s.Id)).Sum(s => s.Probability);
            Assert.Equal(mass, e.FaultProbability, 9);
            Assert.Contains($"probability {(e.FaultProbability * 100).ToString("0.#", System.Globalization.CultureInfo.InvariantCulture)} %", e.Reason, StringComparison.Ordinal);
        }

        // The most likely suspect is inferred, never re-energised, when nothing else lies beyond it.
        Assert.DoesNotContain(plan.TestOrder, e => e.ReenergisesSections.Contains(ranking.Sections[0].Id));
        Assert.Empty(new PlanChecker(graph.Grid).CheckTestOrder(incident, plan, graph.Sections[ranking.Sections[0].Id].Segments[0], standing: false).Problems);

        // The main steps never close a load-break switch onto the second suspect.
        var second = ranking.Sections[1].Id;
        var replay = new PlanChecker(graph.Grid).Check(incident, plan, graph.Sections[second].Segments[0], standing: false);
        Assert.Empty(replay.Problems);
        Assert.False(replay.Reenergised);
    }

    [Theory]
    [InlineData("solid")]
    [InlineData("impedance")]
    public void Trial_closures_end_at_the_true_section_with_at_most_one_trip(string scheme)
    {
        var grid = Grids.Sample(scheme);
        var graph = new NetworkGraph(grid);
        var simulator = new IncidentSimulator(graph, new SimulationSettings(MissProbability: 0.2, FalseProbability: 0.05, UnknownProbability: 0.3));
        var random = new Random(41);
        var followed = 0;
        for (var n = 0; n < 40 && followed < 8; n++)
        {
            var simulated = simulator.Next(random, n);
            var ranking = FaultRanking.Rank(graph, simulated.Incident);
            var plan = SwitchingPlanner.Plan(graph, simulated.Incident, ranking);
            var truth = graph.Sections.OfSegment(grid.SegmentIndex(simulated.Segment)).Id;
            if (plan.TestOrder.IsDefaultOrEmpty || !plan.TestOrder.Any(e => e.ReenergisesSections.Contains(truth) || e.Branches.Any(b => b.FaultIn.Contains(truth))))
            {
                continue;
            }

            followed++;
            var (faultIn, _, trips) = Follow(grid, simulated.Incident, plan, simulated.Segment, standing: false);
            Assert.Contains(truth, faultIn);
            Assert.InRange(trips, 0, 1);
        }

        Assert.True(followed > 0, "no split ranking among the simulated incidents: the check would be vacuous");
    }

    [Fact]
    public void Standing_earth_fault_search_opens_only_devices_that_may_break_it_and_finds_the_sample_fault()
    {
        // The resonant sample: the fault is on S310 (sample-grid/README.md), behind disconnector DS-B1-4.
        var (graph, incident) = PlanSafetyTests.Load("resonant-standing-earth-fault-b1.incident.json", "resonant");
        var plan = SwitchingPlanner.Plan(graph, incident, FaultRanking.Rank(graph, incident));

        Assert.NotEmpty(plan.TestOrder);
        Assert.Null(plan.ExpectedReenergisationsOntoFault);
        foreach (var e in plan.TestOrder)
        {
            Assert.Equal(TestObservation.NeutralVoltage, e.Observe);
            var last = e.Steps[^1];
            var kind = graph.Grid.Switch(last.Device!.Value).Kind;
            if (last.Action == StepAction.Open)
            {
                // IEC 62271-103 earth-fault breaking duty: load-break switches may; disconnectors and fuses never open live.
                Assert.True(kind is SwitchKind.Breaker or SwitchKind.Recloser or SwitchKind.LoadBreakSwitch, $"{last.Device} is a {kind}");
                Assert.Equal([TestResult.U0Stays, TestResult.U0Collapses], e.Branches.Select(b => b.Result));
            }
            else
            {
                Assert.Equal([TestResult.U0Returns, TestResult.U0StaysAbsent], e.Branches.Select(b => b.Result));
                Assert.True(kind is SwitchKind.Breaker or SwitchKind.Recloser, $"{last.Device} recloses onto the fault but is a {kind}");
            }
        }

        var truth = graph.Sections.OfSegment(graph.Grid.SegmentIndex(new SegmentId("S310"))).Id;
        var (faultIn, entries, _) = Follow(graph.Grid, incident, plan, new SegmentId("S310"), standing: true);
        Assert.Contains(truth, faultIn);
        Assert.InRange(entries, 1, 4);
    }

    [Theory]
    [InlineData("isolated")]
    [InlineData("resonant")]
    public void Standing_earth_fault_search_ends_at_the_true_section(string scheme)
    {
        var grid = Grids.Sample(scheme);
        var graph = new NetworkGraph(grid);
        var simulator = new IncidentSimulator(graph, new SimulationSettings());
        var random = new Random(97);
        var searched = 0;
        for (var n = 0; n < 40 && searched < 10; n++)
        {
            var simulated = simulator.Next(random, n);
            if (simulated.Incident.TrippedDevice is not null)
            {
                continue;
            }

            var ranking = FaultRanking.Rank(graph, simulated.Incident);
            var plan = SwitchingPlanner.Plan(graph, simulated.Incident, ranking);
            var truth = graph.Sections.OfSegment(grid.SegmentIndex(simulated.Segment)).Id;
            if (ranking.Sections.First(s => s.Id == truth).Probability <= 0)
            {
                continue;
            }

            searched++;
            Assert.NotEmpty(plan.TestOrder);
            var (faultIn, entries, _) = Follow(grid, simulated.Incident, plan, simulated.Segment, standing: true);
            Assert.Contains(truth, faultIn);
            Assert.InRange(entries, 1, plan.TestOrder.Length);
        }

        Assert.True(searched > 0, "no standing earth fault among the simulated incidents");
    }

    [Fact]
    public void Clear_ranking_of_a_trip_gets_no_test_order()
    {
        var (graph, incident) = PlanSafetyTests.Load("solid-lg-trip-a1.incident.json", "solid");
        var ranking = FaultRanking.Rank(graph, incident);
        Assert.True(ranking.Sections[0].Probability >= 0.8);

        var plan = SwitchingPlanner.Plan(graph, incident, ranking);
        Assert.Empty(plan.TestOrder);
        Assert.Null(plan.ExpectedReenergisationsOntoFault);
    }
}
