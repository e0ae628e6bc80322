using System.Collections.Immutable;
using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;
using FeederLocate.Core.Switching;
using FeederLocate.Core.Topology;

namespace FeederLocate.Core.Tests.Switching;

/// <summary>The checker itself must catch unsafe plans, or passing it would mean nothing.</summary>
public class PlanCheckerTests
{
    private static readonly Incident Trip = new(
        DateTimeOffset.UnixEpoch, null, ImmutableDictionary<SwitchId, SwitchPosition>.Empty, new SwitchId("CB-P1"), FaultType.LLL, [], []);

    private static SwitchingPlan Good(Grid grid) =>
        SwitchingPlanner.Plan(new NetworkGraph(grid), Trip, new NetworkGraph(grid).Sections.OfSegment(grid.SegmentIndex(new SegmentId("S3"))).Id);

    private static SwitchingPlan WithSteps(SwitchingPlan plan, params (StepAction Action, string Device)[] steps) => plan with
    {
        Steps = [.. steps.Select((s, k) => new SwitchingStep(k + 1, s.Action, new SwitchId(s.Device), null, [], TimeSpan.FromMinutes(k), "test")),
            .. plan.Steps.Where(s => !s.ChangesNetwork && s.Action != StepAction.Dispatch)],
    };

    private static List<string> Problems(Grid grid, SwitchingPlan plan, string trueFault = "S3") =>
        new PlanChecker(grid).Check(Trip, plan, new SegmentId(trueFault), standing: false).Problems;

    [Fact]
    public void The_planners_plan_passes()
    {
        var grid = SwitchingGrids.Fenwick();
        Assert.Empty(Problems(grid, Good(grid)));
    }

    [Fact]
    public void Closing_onto_the_isolated_section_is_caught()
    {
        var grid = SwitchingGrids.Fenwick();
        var plan = WithSteps(Good(grid), (StepAction.Close, "CB-P1"));
        Assert.Contains(Problems(grid, plan), p => p.Contains("energises the isolated section", StringComparison.Ordinal));
    }

    [Fact]
    public void A_loop_is_caught()
    {
        // T1 and T2 both close onto the dead tail: Q1 and Q2 then meet through P8-P10.
        var grid = SwitchingGrids.Fenwick();
        var plan = WithSteps(Good(grid), (StepAction.Open, "LB2"), (StepAction.Open, "LB3"), (StepAction.Close, "T1"), (StepAction.Close, "T2"));
        Assert.Contains(Problems(grid, plan), p => p.Contains("loop", StringComparison.Ordinal) || p.Contains("two live parts", StringComparison.Ordinal));
    }

    [Fact]
    public void A_disconnector_operated_live_is_caught()
    {
        var grid = SwitchingGrids.Fenwick();
        // T3 makes the lateral (and S3 through DS5) live; DS5 then opens with both nodes live.
        var plan = WithSteps(Good(grid), (StepAction.Open, "LB2"), (StepAction.Open, "LB3"), (StepAction.Close, "T3"), (StepAction.Open, "DS5"));
        // The true fault is put elsewhere so that the check goes on past the close onto S3.
        Assert.Contains(Problems(grid, plan, trueFault: "S1"), p => p.Contains("disconnector DS5 live", StringComparison.Ordinal));
    }

    [Fact]
    public void An_overload_in_the_final_state_is_caught()
    {
        // At three times the load T1's long overhead line cannot carry everything beyond S3.
        var grid = SwitchingGrids.Fenwick(3.0);
        var plan = WithSteps(Good(grid), (StepAction.Open, "LB2"), (StepAction.Open, "LB3"), (StepAction.Open, "DS5"), (StepAction.Close, "T1"));
        Assert.Contains(Problems(grid, plan), p => p.Contains("pu below", StringComparison.Ordinal) || p.Contains("above", StringComparison.Ordinal) || p.Contains("converge", StringComparison.Ordinal));
    }

    [Fact]
    public void Missing_crew_steps_are_caught()
    {
        var grid = SwitchingGrids.Fenwick();
        var good = Good(grid);
        var plan = good with { Steps = [.. good.Steps.Where(s => s.Action != StepAction.Earth)] };
        Assert.Contains(Problems(grid, plan), p => p.Contains("no Earth step", StringComparison.Ordinal));
    }

    [Fact]
    public void An_isolation_point_left_unlocked_before_the_earths_is_caught()
    {
        var grid = SwitchingGrids.Fenwick();
        var good = Good(grid);
        Assert.Contains(good.Steps, s => s.Action == StepAction.Lock);
        var plan = good with { Steps = [.. good.Steps.Where(s => s.Action != StepAction.Lock)] };
        Assert.Contains(Problems(grid, plan), p => p.Contains("not locked, tagged or blocked before the first earth", StringComparison.Ordinal));
    }

    [Fact]
    public void A_field_indicator_read_only_after_a_close_is_caught()
    {
        // The solid sample's trip without its field readings: FPI-A1-07 and FPI-A1-17 lie in the tripped feeder, unread.
        var (graph, sample) = PlanSafetyTests.Load("solid-lg-trip-a1.incident.json", "solid");
        var incident = sample with { Indications = [.. sample.Indications.Where(i => i.Source != IndicationSource.Field)] };
        var plan = SwitchingPlanner.Plan(graph, incident, new SectionId("SEC-S108"));
        var checker = new PlanChecker(graph.Grid);
        var reads = plan.Steps.Where(s => s.Action == StepAction.Verify && s.Device is null).ToList();
        Assert.NotEmpty(reads);
        var firstClose = plan.Steps.First(s => s.Action == StepAction.Close);
        Assert.All(reads, r => Assert.True(r.Order < firstClose.Order));
        Assert.Empty(checker.Check(incident, plan, new SegmentId("S109"), standing: false).Problems);

        // The same reads moved after every other step.
        var rest = plan.Steps.Where(s => !reads.Contains(s)).ToList();
        var moved = plan with { Steps = [.. rest.Concat(reads).Select((s, k) => s with { Order = k + 1, At = s.At > rest[^1].At ? s.At : rest[^1].At })] };
        Assert.Contains(checker.Check(incident, moved, new SegmentId("S109"), standing: false).Problems,
            p => p.Contains("is not read before the first close", StringComparison.Ordinal));
    }

    [Fact]
    public void A_load_break_switch_closing_onto_a_suspect_in_the_test_order_is_caught()
    {
        // The impedance sample's split ranking: entry 1 leaves LB-A2-3, the entrance of suspect SEC-S209, open.
        var (graph, incident) = PlanSafetyTests.Load("impedance-lg-trip-a2.incident.json", "impedance");
        var plan = SwitchingPlanner.Plan(graph, incident, Core.Ranking.FaultRanking.Rank(graph, incident));
        var checker = new PlanChecker(graph.Grid);
        Assert.Empty(checker.CheckTestOrder(incident, plan, new SegmentId("S209"), standing: false).Problems);

        var first = plan.TestOrder[0];
        var extra = new SwitchingStep(first.Steps.Length + 1, StepAction.Close, new SwitchId("LB-A2-3"), null, [], first.Steps[^1].At, "test");
        var bad = plan with { TestOrder = [first with { Steps = [.. first.Steps, extra] }, .. plan.TestOrder.Skip(1)] };
        Assert.Contains(checker.CheckTestOrder(incident, bad, new SegmentId("S209"), standing: false).Problems,
            p => p.Contains("LB-A2-3 closes onto a section that may hold the fault", StringComparison.Ordinal));
    }
}
