using Bunit;
using FeederLocate.Core.Formats;
using FeederLocate.Core.Ranking;
using FeederLocate.Core.Switching;
using FeederLocate.Web.Components.Workspace;
using FeederLocate.Web.Tests.Support;

namespace FeederLocate.Web.Tests.Components;

/// <summary>The plan's summary states its assumptions in figures a person reads at a glance.</summary>
public class PlanSummaryTests : ComponentTest
{
    [Fact]
    public void The_cold_load_factor_and_the_voltage_limit_are_rounded_for_people()
    {
        var grid = LoadedGrids.Sample("solid");
        var incident = IncidentReader.Parse(RepositoryFiles.Read("sample-grid", "incidents", "solid-lg-trip-a1.incident.json"), grid.Grid).ValueOrThrow();
        var plan = SwitchingPlanner.Plan(grid.Graph, incident, FaultRanking.Rank(grid.Graph, incident))
            with { ColdLoadFactor = 1.6933333333333334, VoltageLimitPu = 0.9 };

        var cut = Render<PlanSteps>(p => p.Add(c => c.Plan, plan).Add(c => c.OnTick, _ => { }));

        var assumed = cut.Find(".plan-summary .assumed").TextContent;
        Assert.Equal("Cold-load factor 1.69, voltage limit 0.9 pu.", assumed);
    }
}
