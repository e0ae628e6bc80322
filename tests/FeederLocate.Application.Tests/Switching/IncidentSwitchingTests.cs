using FeederLocate.Application.Switching;
using FeederLocate.Application.Tests.Support;
using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;
using FeederLocate.Core.Synthetic;
using FeederLocate.Core.Topology;
using FeederLocate.Storage.Events;

namespace FeederLocate.Application.Tests.Switching;

public sealed class IncidentSwitchingTests : IDisposable
{
    private readonly TestLog _test = new();

    public void Dispose() => _test.Dispose();

    public static TheoryData<string, int> Grids() => new()
    {
        { "solid", 0 }, { "impedance", 0 }, { "isolated", 0 }, { "resonant", 0 },
        { "synthetic", 3 }, { "synthetic", 5 },
    };

    private static Grid GridOf(string name, int seed) => name == "synthetic"
        ? SyntheticGrid.Generate(new SyntheticGridOptions(80, seed, (GroundingScheme)(seed % 4), SegmentsPerSwitch: 3))
        : Samples.Graph(name).Grid;

    [Theory]
    [MemberData(nameof(Grids))]
    public void Current_positions_are_normal_then_recorded_then_the_trip_then_the_ticked_steps_in_order(string name, int seed)
    {
        var grid = GridOf(name, seed);
        var breaker = grid.Switches.First(s => s.Kind == SwitchKind.Breaker);
        var tie = grid.Switches.First(s => s.NormallyOpen);
        var sectionaliser = grid.Switches.First(s => !s.NormallyOpen && s.Kind != SwitchKind.Breaker);
        var untouched = grid.Switches.Where(s => s.Id != breaker.Id && s.Id != tie.Id && s.Id != sectionaliser.Id).ToList();
        var log = _test.Log;
        var id = log.Open(grid, breaker.Id, FaultType.LG, new DateTimeOffset(2026, 11, 30, 6, 12, 0, TimeSpan.Zero), Samples.Operator);
        log.RecordAll(id, [
            new SwitchStateChanged(sectionaliser.Id, SwitchPosition.Open),
            new PlanStepCompleted(1, "close", tie.Id.Value),
            new PlanStepCompleted(2, "open", tie.Id.Value),
            new PlanStepCompleted(3, "close", breaker.Id.Value),
            new PlanStepCompleted(4, "proveDead", sectionaliser.Id.Value),
            new PlanStepCompleted(5, "close", "NOT-IN-THIS-GRID"),
        ], Samples.Operator);

        var states = IncidentSwitching.Current(grid, log.State(id));

        Assert.Equal(SwitchPosition.Open, states.PositionOf(sectionaliser.Id));
        Assert.Equal(SwitchPosition.Open, states.PositionOf(tie.Id));
        Assert.Equal(SwitchPosition.Closed, states.PositionOf(breaker.Id));
        Assert.All(untouched, s => Assert.Equal(SwitchStates.Normal(grid).PositionOf(s.Id), states.PositionOf(s.Id)));
    }

    [Fact]
    public void A_tripped_device_is_open_until_a_step_closes_it()
    {
        var grid = Samples.Graph("solid").Grid;
        var log = _test.Log;
        var id = log.Open(grid, new SwitchId("CB-A1"), FaultType.LG, new DateTimeOffset(2026, 11, 30, 6, 12, 0, TimeSpan.Zero), Samples.Operator);

        var states = IncidentSwitching.Current(grid, log.State(id));

        Assert.Equal(SwitchPosition.Open, states.PositionOf(new SwitchId("CB-A1")));
        Assert.Equal(new Dictionary<SwitchId, SwitchPosition> { [new SwitchId("CB-A1")] = SwitchPosition.Open }, states.Deviations());
    }
}
