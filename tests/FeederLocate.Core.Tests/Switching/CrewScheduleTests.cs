using System.Collections.Immutable;
using FeederLocate.Core.Evidence;
using FeederLocate.Core.Formats;
using FeederLocate.Core.Model;
using FeederLocate.Core.Switching;
using FeederLocate.Core.Topology;

namespace FeederLocate.Core.Tests.Switching;

/// <summary>
/// Hand-checkable schedules on a small invented feeder: BUS –CB (remote breaker)– N1 –S1– N2 –D1 (manual
/// disconnector)– N3 –S2– N4 –D2 (manual disconnector)– N5 –S3– N6. D1's own travel time is 20 min, D2's 40 min;
/// the base DEPOT (at N1) gives D2 30 min. Customers: N2 100, N4 50, N6 30. A fault on S2 trips CB: the plan opens
/// D1, recloses CB (S1 back), and opens D2 (the far side has no other supply). Default times (SwitchingOptions,
/// common practice): manual operation 5 min after arrival, remote 1 min.
/// </summary>
public class CrewScheduleTests
{
    private static readonly SwitchId D1 = new("D1"), D2 = new("D2"), Cb = new("CB");

    [Fact]
    public void One_crew_goes_on_to_the_second_device_after_the_first()
    {
        var plan = Plan(Feeder("""[ { "id": "DEPOT", "node": "N1", "count": 1, "travelMinutes": { "D2": 30 } } ]"""));

        // DEPOT/1 leaves at 0, reaches D1 at 20, opens it by 25. CB (remote, no crew) closes 25 + 1 = 26.
        // DEPOT/1 leaves D1 at 25 and needs DEPOT's 30 min to D2: arrives 55, opens it by 60.
        Assert.Equal(25, Done(plan, StepAction.Open, D1).At.TotalMinutes, 9);
        Assert.Equal(26, Done(plan, StepAction.Close, Cb).At.TotalMinutes, 9);
        Assert.Equal(60, Done(plan, StepAction.Open, D2).At.TotalMinutes, 9);
        Assert.Equal("DEPOT/1", Done(plan, StepAction.Open, D1).Crew);
        Assert.Equal("DEPOT/1", Done(plan, StepAction.Open, D2).Crew);
        Assert.Null(Done(plan, StepAction.Close, Cb).Crew);

        // The crew's second trip is written after the step it leaves from, at the minute it leaves.
        var onward = Assert.Single(plan.Steps, s => s.Action == StepAction.Dispatch && s.Device == D2);
        Assert.Equal(25, onward.At.TotalMinutes, 9);
        Assert.Equal(Done(plan, StepAction.Open, D1).Order + 1, onward.Order);
        Assert.Equal("crew DEPOT/1 goes on from D1 to D2 (manual; about 30 min to reach it)", onward.Reason);
        Assert.Contains(plan.Approximations, a => a.StartsWith("crews: 1 from the grid (1 at DEPOT)", StringComparison.Ordinal));
    }

    [Fact]
    public void Two_crews_travel_at_the_same_time()
    {
        var plan = Plan(Feeder("""[ { "id": "DEPOT", "node": "N1", "count": 2, "travelMinutes": { "D2": 30 } } ]"""));

        // DEPOT/1 opens D1 by 20 + 5 = 25; CB closes at 26; DEPOT/2 left at 0 and reached D2 at 30, opens it by 35
        // (DEPOT/1 would only arrive at 25 + 30 = 55).
        Assert.Equal(25, Done(plan, StepAction.Open, D1).At.TotalMinutes, 9);
        Assert.Equal(26, Done(plan, StepAction.Close, Cb).At.TotalMinutes, 9);
        Assert.Equal(35, Done(plan, StepAction.Open, D2).At.TotalMinutes, 9);
        Assert.Equal("DEPOT/2", Done(plan, StepAction.Open, D2).Crew);
        Assert.Equal(2, plan.Steps.Count(s => s.Action == StepAction.Dispatch && s.Device is not null && s.At == TimeSpan.Zero));
    }

    [Fact]
    public void Without_crews_in_the_grid_every_manual_device_has_a_crew_of_its_own_as_before()
    {
        var plan = Plan(Feeder(null));

        // D1 by 20 + 5 = 25, CB at 26, D2 on its own 40 min: by 40 + 5 = 45. No step names a crew.
        Assert.Equal(25, Done(plan, StepAction.Open, D1).At.TotalMinutes, 9);
        Assert.Equal(26, Done(plan, StepAction.Close, Cb).At.TotalMinutes, 9);
        Assert.Equal(45, Done(plan, StepAction.Open, D2).At.TotalMinutes, 9);
        Assert.All(plan.Steps, s => Assert.Null(s.Crew));
        Assert.Equal(["send a crew to D1 (manual; about 20 min to reach it)", "send a crew to D2 (manual; about 40 min to reach it)"],
            plan.Steps.Where(s => s.Action == StepAction.Dispatch && s.Device is not null).Select(s => s.Reason));
    }

    [Fact]
    public void Remote_steps_do_not_wait_for_a_busy_crew()
    {
        var plan = Plan(Feeder("""[ { "id": "DEPOT", "node": "N1", "count": 1, "travelMinutes": { "D2": 30 } } ]"""));

        // CB is closed the minute after D1 is open (26), long before the crew reaches D2 (55).
        var close = Done(plan, StepAction.Close, Cb);
        Assert.Equal(Done(plan, StepAction.Open, D1).At + SwitchingOptions.Default.RemoteOperationTime, close.At);
        Assert.True(close.Order < Done(plan, StepAction.Open, D2).Order);
    }

    [Theory]
    [InlineData(1, 7400)]
    [InlineData(2, 5400)]
    public void Customer_minutes_follow_the_crews_schedule(int crews, double expected)
    {
        var plan = Plan(Feeder($$"""[ { "id": "DEPOT", "node": "N1", "count": {{crews}}, "travelMinutes": { "D2": 30 } } ]"""));

        // IEEE 1366 CMI: all 180 customers out from 0; N2's 100 back when CB closes at 26; the other 80 stay out
        // to the last switching step (D2 open: 60 with one crew, 35 with two).
        // One crew:  180·26 + 80·(60 − 26) = 4680 + 2720 = 7400.
        // Two crews: 180·26 + 80·(35 − 26) = 4680 +  720 = 5400.
        Assert.Equal(expected, plan.CustomerMinutesInterrupted, 6);
    }

    [Fact]
    public void The_checkers_pass_the_plan_and_its_return()
    {
        var grid = Feeder("""[ { "id": "DEPOT", "node": "N1", "count": 1, "travelMinutes": { "D2": 30 } } ]""");
        var graph = new NetworkGraph(grid);
        var plan = Plan(grid);
        var back = SwitchingPlanner.PlanReturn(graph, Trip(), plan);
        var crews = new CrewCheck(grid, SwitchingOptions.Default);

        Assert.Empty(new PlanChecker(grid).Check(Trip(), plan, new SegmentId("S2"), standing: false).Problems);
        Assert.Empty(crews.Check(plan));
        Assert.Empty(new PlanChecker(grid).CheckReturn(Trip(), plan, back));
        Assert.Empty(crews.Check(back));

        // The return closes D1 and D2 again: one crew, D1 (20 min) first, then on to D2 (30 min from the base).
        Assert.All(back.Steps.Where(s => s.ChangesNetwork && s.Device != Cb), s => Assert.Equal("DEPOT/1", s.Crew));
        Assert.Equal(4, crews.CheckedOperations);
    }

    [Fact]
    public void The_crew_check_finds_a_crew_in_two_places_at_once()
    {
        var grid = Feeder("""[ { "id": "DEPOT", "node": "N1", "count": 1, "travelMinutes": { "D2": 30 } } ]""");
        var plan = Plan(grid);

        // The same plan with D2 opened as if the crew had been there from the start (by 35 instead of 60).
        var early = plan with { Steps = [.. plan.Steps.Select(s => s.Action == StepAction.Open && s.Device == D2 ? s with { At = TimeSpan.FromMinutes(35) } : s)] };

        var problem = Assert.Single(new CrewCheck(grid, SwitchingOptions.Default).Check(early));
        Assert.Contains("crew DEPOT/1 finishes Open D2 at 35 min, before it can (60 min", problem, StringComparison.Ordinal);
    }

    private static SwitchingStep Done(SwitchingPlan plan, StepAction action, SwitchId device) =>
        plan.Steps.Single(s => s.Action == action && s.Device == device);

    private static SwitchingPlan Plan(Grid grid)
    {
        var graph = new NetworkGraph(grid);
        return SwitchingPlanner.Plan(graph, Trip(), graph.Sections.OfSegment(grid.SegmentIndex(new SegmentId("S2"))).Id);
    }

    private static Incident Trip() => new(
        new DateTimeOffset(2026, 3, 1, 8, 0, 0, TimeSpan.Zero), null, ImmutableDictionary<SwitchId, SwitchPosition>.Empty,
        Cb, FaultType.LLL, [], []);

    /// <summary>The feeder, with <paramref name="crews"/> as the grid's <c>crews</c> array (none when null). Line data: the sample catalogue's 20 kV cable (common practice).</summary>
    internal static Grid Feeder(string? crews) => GridReader.Parse(FeederText(crews)).ValueOrThrow();

    /// <summary>The feeder's grid file.</summary>
    internal static string FeederText(string? crews) => $$"""
        {
          "format": "feederlocate-grid/1", "name": "Crew test feeder 20 kV", "frequencyHz": 50,
          "lineTypes": [ { "id": "CAB", "construction": "cable", "r1OhmPerKm": 0.206, "x1OhmPerKm": 0.116, "r0OhmPerKm": 0.82, "x0OhmPerKm": 0.4, "c0NfPerKm": 250, "ampacityA": 320 } ],
          "substations": [ { "id": "SUB", "busNode": "BUS", "nominalVoltageKv": 20, "shortCircuitMva": 250, "rOverX": 0.1,
                             "transformerZ0Ohm": { "r": 0.15, "x": 1.9 }, "grounding": { "scheme": "solid" } } ],
          "nodes": [ { "id": "BUS" }, { "id": "N1" }, { "id": "N2", "loadKw": 500, "customers": 100 }, { "id": "N3" },
                     { "id": "N4", "loadKw": 250, "customers": 50 }, { "id": "N5" }, { "id": "N6", "loadKw": 150, "customers": 30 } ],
          "segments": [
            { "id": "S1", "from": "N1", "to": "N2", "lineType": "CAB", "lengthKm": 2 },
            { "id": "S2", "from": "N3", "to": "N4", "lineType": "CAB", "lengthKm": 2 },
            { "id": "S3", "from": "N5", "to": "N6", "lineType": "CAB", "lengthKm": 2 }
          ],
          "switches": [
            { "id": "CB", "from": "BUS", "to": "N1", "kind": "breaker", "normallyOpen": false, "remote": true },
            { "id": "D1", "from": "N2", "to": "N3", "kind": "disconnector", "normallyOpen": false, "remote": false, "travelMinutes": 20 },
            { "id": "D2", "from": "N4", "to": "N5", "kind": "disconnector", "normallyOpen": false, "remote": false, "travelMinutes": 40 }
          ],
          "indicators": []{{(crews is null ? string.Empty : $",\n  \"crews\": {crews}")}}
        }
        """;
}
