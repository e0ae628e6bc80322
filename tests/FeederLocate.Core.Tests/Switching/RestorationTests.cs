using System.Collections.Immutable;
using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;
using FeederLocate.Core.Switching;
using FeederLocate.Core.Topology;

namespace FeederLocate.Core.Tests.Switching;

public class RestorationTests
{
    private static Incident Trip(string device) => new(
        new DateTimeOffset(2026, 3, 1, 8, 0, 0, TimeSpan.Zero), null, ImmutableDictionary<SwitchId, SwitchPosition>.Empty,
        new SwitchId(device), FaultType.LLL, [], []);

    private static SectionId SectionOf(Grid grid, string segment) =>
        new NetworkGraph(grid).Sections.OfSegment(grid.SegmentIndex(new SegmentId(segment))).Id;

    public static TheoryData<string, double, double?> Cases() => new()
    {
        { "S1", 1.0, null }, { "S2", 1.0, null }, { "S3", 1.0, null }, { "S4", 1.0, null }, { "S5", 1.0, null }, { "S6", 1.0, null },
        { "S1", 1.4, null }, { "S2", 1.4, null }, { "S1", 0.6, null }, { "S3", 1.8, null }, { "S1", 1.0, 4.0 }, { "S2", 1.0, 3.5 },
    };

    [Theory]
    [MemberData(nameof(Cases))]
    public void Plan_restores_as_many_customers_as_the_best_switching(string faultSegment, double loadScale, double? ratedMva)
    {
        var grid = SwitchingGrids.Fenwick(loadScale, ratedMva);
        var incident = Trip("CB-P1");
        var section = SectionOf(grid, faultSegment);
        var plan = SwitchingPlanner.Plan(new NetworkGraph(grid), incident, section);

        var (best, closed) = ExhaustiveRestoration.Best(grid, incident, section, plan.ColdLoadFactor, plan.VoltageLimitPu);
        Assert.True(best == plan.RestoredCustomers, $"exhaustive search restores {best} (closing {string.Join(", ", closed)}), the plan {plan.RestoredCustomers}");
        var (problems, back) = new PlanChecker(grid).Check(incident, plan, new SegmentId(faultSegment), standing: false);
        Assert.Empty(problems);
        Assert.False(back);
    }

    [Fact]
    public void Partial_restoration_splits_the_dead_area_between_two_ties()
    {
        // At 1.4 times the load, T2 alone cannot take everything beyond S1 at a cold-load factor of 2.
        var grid = SwitchingGrids.Fenwick(1.4);
        var plan = SwitchingPlanner.Plan(new NetworkGraph(grid), Trip("CB-P1"), SectionOf(grid, "S1"), null, new SwitchingOptions { ColdLoadFactor = 2.0 });

        var closes = plan.Steps.Where(s => s.Action == StepAction.Close).Select(s => s.Device!.Value.Value).ToList();
        Assert.Contains("T1", closes);
        Assert.Contains("T2", closes);
        var boundary = new NetworkGraph(grid).Sections[SectionOf(grid, "S1")].BoundarySwitches;
        Assert.Contains(plan.Steps, s => s.Action == StepAction.Open && !boundary.Contains(s.Device!.Value));
        Assert.InRange(plan.FinalSupply.MinimumVoltagePu, plan.VoltageLimitPu, 1.0);
    }

    [Fact]
    public void Transformer_rating_bounds_what_a_substation_takes_on()
    {
        var free = SwitchingPlanner.Plan(new NetworkGraph(SwitchingGrids.Fenwick()), Trip("CB-P1"), SectionOf(SwitchingGrids.Fenwick(), "S1"));
        var bounded = SwitchingPlanner.Plan(new NetworkGraph(SwitchingGrids.Fenwick(1.0, 4.0)), Trip("CB-P1"), SectionOf(SwitchingGrids.Fenwick(), "S1"));

        Assert.True(bounded.RestoredCustomers < free.RestoredCustomers, $"{bounded.RestoredCustomers} with a 4 MVA transformer, {free.RestoredCustomers} without");
        Assert.True(bounded.RestoredCustomers > 0);
    }

    [Fact]
    public void Cold_load_factor_of_one_restores_at_least_as_much()
    {
        var grid = SwitchingGrids.Fenwick(1.4);
        var warm = SwitchingPlanner.Plan(new NetworkGraph(grid), Trip("CB-P1"), SectionOf(grid, "S1"), null, new SwitchingOptions { ColdLoadFactor = 1.0 });
        var cold = SwitchingPlanner.Plan(new NetworkGraph(grid), Trip("CB-P1"), SectionOf(grid, "S1"));

        Assert.Equal(1.0, warm.ColdLoadFactor);
        Assert.True(warm.RestoredCustomers >= cold.RestoredCustomers);
        Assert.True(warm.FinalSupply.MinimumVoltagePu > cold.FinalSupply.MinimumVoltagePu);
    }
}
