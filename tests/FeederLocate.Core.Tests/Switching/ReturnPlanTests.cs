using FeederLocate.Core.Model;
using FeederLocate.Core.Ranking;
using FeederLocate.Core.Switching;

namespace FeederLocate.Core.Tests.Switching;

public class ReturnPlanTests
{
    [Fact]
    public void Return_after_the_sample_trip_clears_the_crew_then_restores_the_normal_open_points_break_before_make()
    {
        var (graph, incident) = PlanSafetyTests.Load("solid-lg-trip-a1.incident.json", "solid");
        var plan = SwitchingPlanner.Plan(graph, incident, FaultRanking.Rank(graph, incident));
        var back = SwitchingPlanner.PlanReturn(graph, incident, plan);

        Assert.Empty(new PlanChecker(graph.Grid).CheckReturn(incident, plan, back));

        // The plan picked the far parts up through the ties NO-A1-A2 and NO-A1-B1: each opens again before the
        // normal path into its part closes (DS-A1-5, LB-A1-3), so that A1 never runs in parallel with A2 or B1.
        int Order(StepAction action, string device) => back.Steps.Single(s => s.Action == action && s.Device == new SwitchId(device)).Order;
        Assert.True(Order(StepAction.Open, "NO-A1-A2") < Order(StepAction.Close, "DS-A1-5"));
        Assert.True(Order(StepAction.Open, "NO-A1-B1") < Order(StepAction.Close, "LB-A1-3"));

        // The disconnector DS-A1-5 closes dead: the load-break switch feeding it is opened for it and closed again.
        var ds = back.Steps.Single(s => s.Action == StepAction.Close && s.Device == new SwitchId("DS-A1-5"));
        Assert.Equal(StepAction.Open, back.Steps[ds.Order - 2].Action);
        Assert.Equal(back.Steps[ds.Order - 2].Device, back.Steps[ds.Order].Device);
        Assert.Equal(StepAction.Close, back.Steps[ds.Order].Action);
        Assert.True(back.Steps.Where(s => s.ChangesNetwork).Min(s => s.Order) > back.Steps.Where(s => s.Action is StepAction.RemoveEarth or StepAction.Unlock).Max(s => s.Order));
        Assert.Equal(StepAction.Verify, back.Steps[0].Action);
        Assert.True(back.MostCustomersInterrupted > 0);
        Assert.Equal(Cautions.All, back.Cautions);
    }

    [Fact]
    public void The_return_checker_catches_a_close_that_parallels_two_feeders()
    {
        var (graph, incident) = PlanSafetyTests.Load("solid-lg-trip-a1.incident.json", "solid");
        var plan = SwitchingPlanner.Plan(graph, incident, FaultRanking.Rank(graph, incident));
        var back = SwitchingPlanner.PlanReturn(graph, incident, plan);

        // Make before break: every close moved ahead of every open.
        var switching = back.Steps.Where(s => s.ChangesNetwork).OrderBy(s => s.Action == StepAction.Close ? 0 : 1).ThenBy(s => s.Order).ToList();
        var crew = back.Steps.Where(s => !s.ChangesNetwork).ToList();
        var reordered = back with { Steps = [.. crew.Concat(switching).Select((s, k) => s with { Order = k + 1 })] };
        Assert.Contains(new PlanChecker(graph.Grid).CheckReturn(incident, plan, reordered),
            p => p.Contains("joins two live parts", StringComparison.Ordinal) || p.Contains("loop or parallels", StringComparison.Ordinal) || p.Contains("live", StringComparison.Ordinal));
    }

    [Fact]
    public void A_transient_faults_plan_has_nothing_to_return()
    {
        var (graph, incident) = PlanSafetyTests.Load("solid-transient-a1.incident.json", "solid");
        var plan = SwitchingPlanner.Plan(graph, incident, FaultRanking.Rank(graph, incident));
        var back = SwitchingPlanner.PlanReturn(graph, incident, plan);
        Assert.DoesNotContain(back.Steps, s => s.ChangesNetwork);
        Assert.Empty(new PlanChecker(graph.Grid).CheckReturn(incident, plan, back));
    }
}
