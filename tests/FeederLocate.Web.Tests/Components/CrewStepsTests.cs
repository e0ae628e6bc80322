using Bunit;
using FeederLocate.Core.Formats;
using FeederLocate.Core.Model;
using FeederLocate.Core.Ranking;
using FeederLocate.Core.Switching;
using FeederLocate.Web.Components.Workspace;
using FeederLocate.Web.Tests.Support;

namespace FeederLocate.Web.Tests.Components;

/// <summary>The switching steps show the crew of each manual step where the grid names its crews, and nothing more where it does not.</summary>
public class CrewStepsTests : ComponentTest
{
    private static SwitchingPlan SamplePlan(string scheme, string incidentFile)
    {
        var grid = LoadedGrids.Sample(scheme);
        var incident = IncidentReader.Parse(RepositoryFiles.Read("sample-grid", "incidents", incidentFile), grid.Grid).ValueOrThrow();
        return SwitchingPlanner.Plan(grid.Graph, incident, FaultRanking.Rank(grid.Graph, incident));
    }

    [Fact]
    public void A_manual_step_names_its_crew_and_a_remote_one_none()
    {
        var plan = SamplePlan("impedance", "impedance-lg-trip-a2.incident.json");
        var manual = plan.Steps.Single(s => s.Action == StepAction.Open && s.Device == new SwitchId("LB-A2-3"));
        var remote = plan.Steps.First(s => s.Action == StepAction.Close && s.Device == new SwitchId("CB-A2"));

        var cut = Render<PlanSteps>(p => p.Add(c => c.Plan, plan).Add(c => c.OnTick, _ => { }));

        // LB-A2-3 is 20 min from DEPOT-A (its own travelMinutes) and 45 min from DEPOT-B (the base's time): DEPOT-A's crew goes.
        cut.Find($"[data-testid=crew-{manual.Order}]").MarkupMatches(
            $"<span class=\"crew\" data-testid=\"crew-{manual.Order}\" title=\"the crew that carries out this step\">crew DEPOT-A/1</span>");
        Assert.Empty(cut.FindAll($"[data-step=\"{remote.Order}\"] .crew"));
    }

    [Fact]
    public void A_grid_without_crews_shows_no_crew()
    {
        var plan = SamplePlan("solid", "solid-lg-trip-a1.incident.json");

        var cut = Render<PlanSteps>(p => p.Add(c => c.Plan, plan).Add(c => c.OnTick, _ => { }));

        Assert.NotEmpty(cut.FindAll("[data-step]"));
        Assert.Empty(cut.FindAll(".crew"));
    }

    [Fact]
    public void The_return_names_the_crew_of_each_manual_step()
    {
        var grid = LoadedGrids.Sample("impedance");
        var incident = IncidentReader.Parse(RepositoryFiles.Read("sample-grid", "incidents", "impedance-lg-trip-a2.incident.json"), grid.Grid).ValueOrThrow();
        var plan = SwitchingPlanner.Plan(grid.Graph, incident, FaultRanking.Rank(grid.Graph, incident));
        var back = SwitchingPlanner.PlanReturn(grid.Graph, incident, plan);
        var manual = back.Steps.First(s => s.Action == StepAction.Close && s.Device is { } d && !grid.Grid.Switch(d).Remote);

        var cut = Render<ReturnSteps>(p => p.Add(c => c.Attempt, new FeederLocate.Application.Analysis.ReturnAttempt(back, null)).Add(c => c.OnTick, _ => { }));

        Assert.NotNull(manual.Crew);
        cut.Find($"[data-testid=return-crew-{manual.Order}]").MarkupMatches(
            $"<span class=\"crew\" data-testid=\"return-crew-{manual.Order}\">crew {manual.Crew}</span>");
        Assert.Equal(back.Steps.Count(s => s.Crew is not null), cut.FindAll(".crew").Count);
    }
}
