using FeederLocate.Core.Model;
using FeederLocate.Core.Ranking;
using FeederLocate.Core.Switching;
using FeederLocate.Core.Tests.Ranking;
using FeederLocate.Core.Tests.Support;
using FeederLocate.Core.Topology;

namespace FeederLocate.Core.Tests.Switching;

public class CrossCountryPlanTests
{
    [Fact]
    public void A_pair_of_earth_faults_isolates_both_sections_and_recloses_onto_neither()
    {
        // The cross-country case of the ranking tests: earth faults on S105 (feeder A1, CB-A1 tripped) and S206 (feeder A2, still closed).
        var grid = Grids.Sample("isolated");
        var incident = CrossCountryTests.CrossCountryIncident(grid, CrossCountryTests.LoopCurrentA(grid, CrossCountryTests.ToMiddleOfS105, CrossCountryTests.ToMiddleOfS206));
        var graph = new NetworkGraph(grid);
        var ranking = FaultRanking.Rank(graph, incident);
        Assert.True(ranking.CrossCountry.Sum(p => p.Probability) > 0.5);

        var plan = SwitchingPlanner.Plan(graph, incident, ranking);

        Assert.Equal(["SEC-S105", "SEC-S206"], plan.IsolatedSections.Select(s => s.Value).Order());
        Assert.Contains(plan.Approximations, a => a.Contains("cross-country", StringComparison.Ordinal) && a.Contains("both sections are isolated", StringComparison.Ordinal));
        var checker = new PlanChecker(grid);
        foreach (var truth in new[] { "S105", "S206" })
        {
            // Either fault alone would trip again if a close reached it: neither may be re-energised.
            var (problems, back) = checker.Check(incident, plan, new SegmentId(truth), standing: false);
            Assert.True(problems.Count == 0, $"{truth}: {string.Join("; ", problems)}");
            Assert.False(back, $"a close re-energises {truth}");
        }

        // Both are worked on safely: every boundary switch of both sections is locked, proved dead and earthed.
        foreach (var id in plan.IsolatedSections)
        {
            foreach (var device in graph.Sections[id].BoundarySwitches)
            {
                Assert.Contains(plan.Steps, s => s.Action == StepAction.Earth && s.Device == device);
                Assert.Contains(plan.Steps, s => s.Action == StepAction.Lock && s.Device == device);
            }
        }

        Assert.Empty(checker.CheckReturn(incident, plan, SwitchingPlanner.PlanReturn(graph, incident, plan)));
    }

    [Fact]
    public void A_single_fault_ranking_isolates_one_section()
    {
        var (graph, incident) = PlanSafetyTests.Load("solid-lg-trip-a1.incident.json", "solid");
        var plan = SwitchingPlanner.Plan(graph, incident, FaultRanking.Rank(graph, incident));
        Assert.Single(plan.IsolatedSections);
        Assert.DoesNotContain(plan.Approximations, a => a.Contains("cross-country", StringComparison.Ordinal));
    }
}
