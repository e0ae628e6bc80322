using System.Collections.Immutable;
using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;
using FeederLocate.Core.Ranking;
using FeederLocate.Core.Switching;
using FeederLocate.Core.Synthetic;
using FeederLocate.Core.Topology;

namespace FeederLocate.Core.Tests.Switching;

public class ColdLoadTests
{
    [Fact]
    public void The_curve_is_linear_between_its_points_and_flat_beyond()
    {
        // The default curve: 1.5 at once, 1.6 after 30 min, 2.0 after 2 h, 2.5 after 6 h (common practice, points from memory).
        var o = SwitchingOptions.Default;
        Assert.Equal(1.5, o.ColdLoadAt(TimeSpan.Zero), 12);
        Assert.Equal(1.8, o.ColdLoadAt(TimeSpan.FromMinutes(75)), 12);
        Assert.Equal(2.5, o.ColdLoadAt(TimeSpan.FromHours(10)), 12);
        Assert.Equal(3.0, (o with { ColdLoadFactor = 3.0 }).ColdLoadAt(TimeSpan.FromHours(10)), 12);
        Assert.Throws<ArgumentOutOfRangeException>(() => (o with { ColdLoadCurve = [new(TimeSpan.FromMinutes(5), 1.5), new(TimeSpan.Zero, 2)] }).Validate());
    }

    [Fact]
    public void The_plan_reads_the_factor_at_the_outage_from_the_fault_to_its_last_switching_step_and_states_the_curve()
    {
        var (graph, sample) = PlanSafetyTests.Load("solid-lg-trip-a1.incident.json", "solid");
        var ranking = FaultRanking.Rank(graph, sample);
        var fresh = sample with { FaultAt = sample.ReportedAt };
        var late = sample with { FaultAt = sample.ReportedAt - TimeSpan.FromHours(5) };

        var a = SwitchingPlanner.Plan(graph, fresh, ranking);
        var b = SwitchingPlanner.Plan(graph, late, ranking);
        var last = a.Steps.Where(s => s.ChangesNetwork).Max(s => s.At);

        Assert.True(a.ColdLoadFactor >= SwitchingOptions.Default.ColdLoadAt(last) - 1e-9, $"{a.ColdLoadFactor} below the curve at {last}");
        Assert.True(b.ColdLoadFactor >= SwitchingOptions.Default.ColdLoadAt(TimeSpan.FromHours(5)) - 1e-9);
        Assert.True(b.ColdLoadFactor > a.ColdLoadFactor);
        Assert.Contains("from the curve", b.ColdLoadBasis, StringComparison.Ordinal);
        Assert.Equal(SwitchingOptions.Default.ColdLoadCurve, b.ColdLoadCurve);
        Assert.Empty(new PlanChecker(graph.Grid).Check(late, b, new SegmentId("S109"), standing: false).Problems);
    }

    [Fact]
    public void A_longer_outage_never_restores_more_on_generated_heavy_grids()
    {
        var differs = 0;
        for (var seed = 1; seed <= 4; seed++)
        {
            var grid = SyntheticGrid.Generate(new SyntheticGridOptions(40, seed, GroundingScheme.Solid, 0.2, SegmentsPerFeeder: 10, SegmentsPerSwitch: 2, Substations: 2) with { LoadScale = 2.0, ExtraTiesPerFeeder = 1 });
            var graph = new NetworkGraph(grid);
            var normal = graph.Energise(SwitchStates.Normal(grid));
            var checker = new PlanChecker(grid);
            foreach (var section in graph.Sections.All.Take(8))
            {
                var path = normal.PathFromSource(section.Nodes[0]);
                var head = path.FirstOrDefault(e => e.Kind == EdgeKind.Switch);
                if (head.IsNone || head.Kind != EdgeKind.Switch || grid.Switches[head.Index].Kind != SwitchKind.Breaker)
                {
                    continue;
                }

                var at = new DateTimeOffset(2026, 3, 1, 8, 0, 0, TimeSpan.Zero);
                var fresh = new Incident(at, null, ImmutableDictionary<SwitchId, SwitchPosition>.Empty, grid.Switches[head.Index].Id, FaultType.LLL, [], []) { FaultAt = at };
                var late = fresh with { FaultAt = at - TimeSpan.FromHours(8) };
                var a = SwitchingPlanner.Plan(graph, fresh, section.Id);
                var b = SwitchingPlanner.Plan(graph, late, section.Id);
                Assert.True(b.RestoredCustomers <= a.RestoredCustomers, $"{grid.Name} {section.Id}: {b.RestoredCustomers} after 8 h, {a.RestoredCustomers} at once");
                Assert.Empty(checker.Check(late, b, section.Segments[0], standing: false).Problems);
                differs += b.RestoredCustomers < a.RestoredCustomers ? 1 : 0;
            }
        }

        Assert.True(differs > 0, "the outage's duration never changed a plan: the check is vacuous on these grids");
    }
}
