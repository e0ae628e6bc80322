using FeederLocate.Core.Electrical;
using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;
using FeederLocate.Core.Ranking;
using FeederLocate.Core.Tests.Support;
using FeederLocate.Core.Topology;

namespace FeederLocate.Core.Tests.Ranking;

/// <summary>
/// On solid earthing the faulted-phase current recorded at the feeder breaker falls with distance, so it
/// narrows where along the suspect the fault can lie. Bolted faults (Rf 0) in the middle of a segment,
/// every indicator as the engine expects, and the breaker's record set to the engine's faulted-phase current.
/// </summary>
public class DistanceWindowTests
{
    public static TheoryData<string, string, double> Faults => new()
    {
        // segment, feeder breaker, position
        { "S108", "CB-A1", 0.5 },
        { "S110", "CB-A1", 0.5 },
        { "S204", "CB-A2", 0.5 },
        { "S211", "CB-A2", 0.5 },
        { "S303", "CB-B1", 0.5 },
        { "S308", "CB-B1", 0.5 },

        // Off the middle, where a window from the single best resistance alone used to miss the truth.
        { "S108", "CB-A1", 0.7 },
        { "S210", "CB-A2", 0.7 },
        { "S210", "CB-A2", 0.9 },
        { "S303", "CB-B1", 0.9 },
    };

    [Theory]
    [MemberData(nameof(Faults))]
    public void Top_suspect_window_holds_the_true_distance_from_the_bus_and_is_narrower_than_the_feeder(string segment, string breaker, double position)
    {
        var grid = Grids.Sample("solid");
        var network = Grids.Normal(grid);
        var result = FaultCurrents.At(network, new FaultCase(new SegmentId(segment), position, FaultType.LG));
        var incident = EngineIncidents.Exact(
            result,
            EngineIncidents.TrippingDevice(network, new SegmentId(segment)),
            [new SubstationMeasurement(new SwitchId(breaker), PhaseCurrentA: result.FaultedPhaseCurrentA)]);
        var trueKm = EngineIncidents.DistanceFromBusKm(network, new SegmentId(segment), position);

        var ranking = FaultRanking.Rank(grid, incident);

        var top = ranking.Explanations.FirstOrDefault(e => e.Segment.Value == segment)
            ?? throw new InvalidOperationException($"{segment} is not among the explained suspects");
        var window = top.DistanceWindow ?? throw new InvalidOperationException($"no distance window for {segment}");
        Assert.True(window.FromKm <= trueKm && trueKm <= window.ToKm, $"{segment}: true {trueKm:F3} km, window {window.FromKm:F3}–{window.ToKm:F3} km");
        var feederKm = FeederLengthKm(network, new SwitchId(breaker));
        Assert.True(window.ToKm - window.FromKm < feederKm, $"window {window.ToKm - window.FromKm:F3} km against a feeder of {feederKm:F3} km");
    }

    [Fact]
    public void Tiny_solid_three_phase_fault_at_the_end_of_the_overhead_line_is_placed_at_nine_km()
    {
        // The worked example's last row: bolted LLL at the far end of S2 (2564 A), 3 + 6 = 9 km from the bus.
        var grid = Grids.TinyFen("solid");
        var network = Grids.Normal(grid);
        var result = FaultCurrents.At(network, new FaultCase(new SegmentId("S2"), 1.0, FaultType.LLL));
        var incident = EngineIncidents.Exact(result, new SwitchId("CB1"), [new SubstationMeasurement(new SwitchId("CB1"), PhaseCurrentA: result.FaultedPhaseCurrentA)]);

        var top = FaultRanking.Rank(grid, incident).Explanations.First(e => e.Segment.Value == "S2");

        var window = top.DistanceWindow!;
        Assert.InRange(9.0, window.FromKm, window.ToKm + 1e-9);
    }

    [Fact]
    public void Tiny_solid_three_phase_fault_in_the_middle_of_the_overhead_line_is_placed_around_six_km()
    {
        // Tiny Fen solid: S1 (3 km cable) then S2 (6 km overhead). A bolted LLL fault in the middle of S2 lies
        // 3 + 0.5·6 = 6 km from the bus. The window lies within S2 (3 to 9 km) and holds 6 km.
        var grid = Grids.TinyFen("solid");
        var network = Grids.Normal(grid);
        var result = FaultCurrents.At(network, new FaultCase(new SegmentId("S2"), 0.5, FaultType.LLL));
        var incident = EngineIncidents.Exact(result, new SwitchId("CB1"), [new SubstationMeasurement(new SwitchId("CB1"), PhaseCurrentA: result.FaultedPhaseCurrentA)]);
        Assert.Equal(6.0, EngineIncidents.DistanceFromBusKm(network, new SegmentId("S2"), 0.5), 1e-12);

        var top = FaultRanking.Rank(grid, incident).Explanations[0];

        Assert.Equal("S2", top.Segment.Value);
        var window = top.DistanceWindow!;
        Assert.InRange(6.0, window.FromKm, window.ToKm);
        Assert.True(window.FromKm >= 3 && window.ToKm <= 9, $"window {window.FromKm:F2}–{window.ToKm:F2} km outside S2");
    }

    [Fact]
    public void An_earth_fault_on_an_isolated_network_gives_no_window()
    {
        // The earth-fault current of an isolated network is capacitive and does not fall with distance.
        var grid = Grids.Sample("isolated");
        var result = FaultCurrents.At(grid, new FaultCase(new SegmentId("S207"), 0.5, FaultType.LG, 300));
        var incident = EngineIncidents.Exact(result, null, EngineIncidents.FeederRecords(grid, result, phase: false, earth: true))
            with { Measurements = [new SubstationMeasurement(new SwitchId("CB-A2"), PhaseCurrentA: result.FaultedPhaseCurrentA)] };

        var ranking = FaultRanking.Rank(grid, incident);

        Assert.All(ranking.Explanations, e => Assert.Null(e.DistanceWindow));
    }

    /// <summary>Total length of the segments fed through the breaker, km.</summary>
    private static double FeederLengthKm(EnergisedNetwork network, SwitchId breaker)
    {
        var grid = network.Grid;
        var edge = new EdgeRef(EdgeKind.Switch, grid.SwitchIndex(breaker));
        return Enumerable.Range(0, grid.Segments.Length)
            .Where(s => network.IsSegmentEnergised(s) && network.PathFromSource(grid.Nodes[network.FarEndOf(s)].Id).Contains(edge))
            .Sum(s => grid.Segments[s].LengthKm);
    }
}
