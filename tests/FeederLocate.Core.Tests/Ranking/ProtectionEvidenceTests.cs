using System.Collections.Immutable;
using FeederLocate.Core.Electrical;
using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;
using FeederLocate.Core.Ranking;
using FeederLocate.Core.Synthetic;
using FeederLocate.Core.Tests.Support;
using FeederLocate.Core.Topology;

namespace FeederLocate.Core.Tests.Ranking;

/// <summary>
/// The protection's own results as evidence: fuses, relay directions, fault-locator reactance and reclosing.
/// Each case is checked on a sample grid and on generated grids of other shapes and every grounding scheme.
/// </summary>
public class ProtectionEvidenceTests
{
    public static TheoryData<GroundingScheme, int> GeneratedGrids => new()
    {
        { GroundingScheme.Isolated, 1 },
        { GroundingScheme.Resonant, 2 },
        { GroundingScheme.Solid, 3 },
        { GroundingScheme.Impedance, 4 },
    };

    [Theory]
    [InlineData("solid")]
    [InlineData("resonant")]
    public void A_blown_fuse_puts_the_fault_beyond_it(string scheme)
    {
        // The feeder breaker CB-A1 tripped on a short circuit and nothing else is known: the fault is
        // anywhere on feeder A1, by prior alone. The crew finds FU-A1-6 blown: it cleared a fault beyond it
        // (common practice), so everything not beyond it is scaled by the fuse error probability e = 2 %:
        // by hand, after = before / (before + (1 − before)·e).
        var grid = Grids.Sample(scheme);
        var network = Grids.Normal(grid);
        var incident = EngineIncidents.WithIndications(new SwitchId("CB-A1"), FaultType.LL);
        var blown = incident with { Fuses = ImmutableDictionary<SwitchId, FuseCondition>.Empty.Add(new SwitchId("FU-A1-6"), FuseCondition.Blown) };

        var before = BeyondShare(grid, network, FaultRanking.Rank(grid, incident), "FU-A1-6");
        var after = BeyondShare(grid, network, FaultRanking.Rank(grid, blown), "FU-A1-6");

        Assert.True(before < 0.5, $"beyond FU-A1-6 before: {before:F3}");
        Assert.Equal(before / (before + ((1 - before) * 0.02)), after, 9);
    }

    [Theory]
    [InlineData(FaultType.LL)]
    [InlineData(FaultType.LLL)]
    public void An_intact_unrated_fuse_puts_a_short_circuit_elsewhere(FaultType type)
    {
        // A short circuit would have blown any fuse it passed through (common practice): FU-A1-6 found intact
        // scales the segments beyond it by the fuse error probability e = 2 %: by hand, after = b·e / (b·e + 1 − b).
        var grid = Grids.Sample("solid");
        var network = Grids.Normal(grid);
        var incident = EngineIncidents.WithIndications(new SwitchId("CB-A1"), type);
        var intact = incident with { Fuses = ImmutableDictionary<SwitchId, FuseCondition>.Empty.Add(new SwitchId("FU-A1-6"), FuseCondition.Intact) };

        var before = BeyondShare(grid, network, FaultRanking.Rank(grid, incident), "FU-A1-6");
        var after = BeyondShare(grid, network, FaultRanking.Rank(grid, intact), "FU-A1-6");

        Assert.True(before > 0.05, $"beyond FU-A1-6 before: {before:F3}");
        Assert.Equal(before * 0.02 / ((before * 0.02) + 1 - before), after, 9);
    }

    [Fact]
    public void An_intact_fuse_says_nothing_of_an_earth_fault_on_a_resonant_network()
    {
        // The residual current of an earth fault on a resonant network is a few amperes: no fuse blows (common practice).
        var grid = Grids.Sample("resonant");
        var incident = EngineIncidents.WithIndications(null, FaultType.LG);
        var intact = incident with { Fuses = ImmutableDictionary<SwitchId, FuseCondition>.Empty.Add(new SwitchId("FU-A1-6"), FuseCondition.Intact) };

        AssertSameProbabilities(FaultRanking.Rank(grid, incident), FaultRanking.Rank(grid, intact));
    }

    [Fact]
    public void An_intact_rated_fuse_rules_out_only_faults_whose_current_exceeds_its_rating()
    {
        // With a rating above any current a 20 kV earth fault through the impedance sample's 12 Ω neutral
        // resistor can drive (below 20 000 / √3 / 12 ≈ 962 A, IEC 60909-0 with c = 1.1: ≈ 1058 A at most),
        // an intact fuse says nothing of an LG fault; rated 10 A, it rules out the segments beyond it.
        var grid = Grids.Sample("impedance");
        var network = Grids.Normal(grid);
        Grid Rated(double amperes) => Grid.Create(grid.Name, grid.FrequencyHz, grid.LineTypes, grid.Substations, grid.Nodes, grid.Segments,
            grid.Switches.Select(s => s.Id.Value == "FU-A1-6" ? s with { RatedCurrentA = amperes } : s), grid.Indicators);
        var incident = EngineIncidents.WithIndications(new SwitchId("CB-A1"), FaultType.LG);
        var intact = incident with { Fuses = ImmutableDictionary<SwitchId, FuseCondition>.Empty.Add(new SwitchId("FU-A1-6"), FuseCondition.Intact) };

        var unknown = BeyondShare(grid, network, FaultRanking.Rank(Rated(2000), incident), "FU-A1-6");
        var high = BeyondShare(grid, network, FaultRanking.Rank(Rated(2000), intact), "FU-A1-6");
        var low = BeyondShare(grid, network, FaultRanking.Rank(Rated(10), intact), "FU-A1-6");

        Assert.Equal(unknown, high, 9);
        Assert.True(low < unknown * 0.2, $"rated 10 A: {unknown:F3} -> {low:F3}");
    }

    [Fact]
    public void Relay_directions_select_the_feeder_of_a_standing_earth_fault_on_a_resonant_network()
    {
        // The wattmetric element of CB-A2 points forward, the other feeder breakers of bus A reverse and
        // those of bus B (another galvanically separate network) none: the fault is on feeder A2.
        var grid = Grids.Sample("resonant");
        var network = Grids.Normal(grid);
        var incident = EngineIncidents.WithIndications(null, FaultType.LG);
        var relays = incident with
        {
            Relays =
            [
                new RelayResult(new SwitchId("CB-A1"), EarthFaultDirection.Reverse),
                new RelayResult(new SwitchId("CB-A2"), EarthFaultDirection.Forward),
                new RelayResult(new SwitchId("CB-B1"), EarthFaultDirection.None),
                new RelayResult(new SwitchId("CB-B2"), EarthFaultDirection.None),
            ],
        };

        var before = BeyondShare(grid, network, FaultRanking.Rank(grid, incident), "CB-A2");
        var ranking = FaultRanking.Rank(grid, relays);
        var after = BeyondShare(grid, network, ranking, "CB-A2");

        Assert.True(before < 0.5, $"feeder A2 before: {before:F3}");
        Assert.True(after > 0.99, $"feeder A2 with the relays: {after:F3}");
        Assert.Contains(ranking.Assumptions, a => a.StartsWith("relays:", StringComparison.Ordinal));
    }

    [Theory]
    [MemberData(nameof(GeneratedGrids))]
    public void A_forward_relay_selects_its_feeder_on_generated_grids(GroundingScheme scheme, int seed)
    {
        // Every feeder breaker reports: forward on the faulted feeder, reverse on the others of its bus,
        // none on the other buses. The faulted feeder takes nearly all the probability on every scheme.
        var grid = SyntheticGrid.Generate(new SyntheticGridOptions(400, seed, scheme, 0.1, 50, 5, 2));
        var network = Grids.Normal(grid);
        var segment = grid.Segments[(seed * 97) % grid.Segments.Length].Id;
        var head = FeederHead(network, segment);
        var sub = network.SubstationIndexOf(network.SuppliedEndOf(grid.SegmentIndex(segment)));
        var relays = grid.Switches.Where(s => s.Kind == SwitchKind.Breaker).Select(s => new RelayResult(s.Id,
            s.Id == head ? EarthFaultDirection.Forward
            : network.SubstationIndexOf(grid.NodeIndex(s.From)) == sub ? EarthFaultDirection.Reverse
            : EarthFaultDirection.None));
        var incident = EngineIncidents.WithIndications(null, FaultType.LG) with { Relays = [.. relays] };
        if (scheme is GroundingScheme.Solid or GroundingScheme.Impedance)
        {
            incident = incident with { TrippedDevice = head };
        }

        var share = BeyondShare(grid, network, FaultRanking.Rank(grid, incident), head.Value);

        Assert.True(share > 0.98, $"{scheme}: feeder of {head} holds {share:F3}");
    }

    [Fact]
    public void A_fault_locator_reactance_narrows_the_distance_along_the_feeder()
    {
        // A three-phase fault on feeder A1 of the solid sample, CB-A1 tripped, no indications. CB-A1's fault
        // locator reads the lines' positive-sequence reactance to the midpoint of S112 (summed by hand from the
        // line data along the path, x1·length per segment): the segments around that reactance rank first.
        var grid = Grids.Sample("solid");
        var network = Grids.Normal(grid);
        var target = new SegmentId("S112");
        var reactance = ReactanceFromBusOhm(network, target, 0.5);
        var incident = EngineIncidents.WithIndications(new SwitchId("CB-A1"), FaultType.LLL) with
        {
            Relays = [new RelayResult(new SwitchId("CB-A1"), null, reactance)],
        };

        var ranking = FaultRanking.Rank(grid, incident);
        var plain = FaultRanking.Rank(grid, EngineIncidents.WithIndications(new SwitchId("CB-A1"), FaultType.LLL));

        var top = ranking.Segments.Take(5).Select(s => s.Id).ToList();
        Assert.Contains(target, top);
        var p = ranking.Segments.Single(s => s.Id == target).Probability;
        var q = plain.Segments.Single(s => s.Id == target).Probability;
        Assert.True(p > 2 * q, $"S112: {q:F3} -> {p:F3}");
        foreach (var s in ranking.Segments.Take(5))
        {
            var lo = ReactanceFromBusOhm(network, s.Id, 0);
            var hi = ReactanceFromBusOhm(network, s.Id, 1);
            Assert.True(Math.Min(lo, hi) <= (reactance * 1.3) + 0.5 && Math.Max(lo, hi) >= (reactance * 0.7) - 0.5, $"{s.Id} spans {lo:F2}..{hi:F2} Ω, reading {reactance:F2} Ω");
        }
    }

    [Fact]
    public void A_successful_reclosure_marks_the_fault_transient_and_still_ranks_beyond_the_recloser()
    {
        // RC-B1-1 tripped and its second shot held: the fault was transient (common practice). Nothing is
        // open now, yet the fault lay beyond the recloser: the ranking keeps it there for the patrol.
        var grid = Grids.Sample("solid");
        var network = Grids.Normal(grid);
        var incident = EngineIncidents.WithIndications(null, FaultType.LL) with
        {
            Reclosing = new Reclosing(new SwitchId("RC-B1-1"), 2, ReclosingResult.Success),
        };

        var ranking = FaultRanking.Rank(grid, incident);
        var locked = FaultRanking.Rank(grid, incident with { Reclosing = new Reclosing(new SwitchId("RC-B1-1"), 2, ReclosingResult.Lockout) });

        Assert.True(ranking.Transient);
        Assert.False(locked.Transient);
        Assert.True(BeyondShare(grid, network, ranking, "RC-B1-1") > 0.99);
        AssertSameProbabilities(ranking, locked);
        AssertSameProbabilities(ranking, FaultRanking.Rank(grid, EngineIncidents.WithIndications(new SwitchId("RC-B1-1"), FaultType.LL)));
    }

    [Fact]
    public void Without_protection_context_nothing_changes()
    {
        var grid = Grids.Sample("isolated");
        var incident = EngineIncidents.WithIndications(null, FaultType.LG, ("FPI-A1-01", IndicatorState.Fault));

        Assert.False(incident.HasProtectionContext);
        Assert.DoesNotContain(FaultRanking.Rank(grid, incident).Assumptions, a => a.StartsWith("relays:", StringComparison.Ordinal) || a.StartsWith("fuses:", StringComparison.Ordinal));
    }

    /// <summary>Σ x1·length along the energised path from the bus to the point, Ω: summed from the line data.</summary>
    internal static double ReactanceFromBusOhm(EnergisedNetwork network, SegmentId segment, double position)
    {
        var grid = network.Grid;
        var index = grid.SegmentIndex(segment);
        var seg = grid.Segments[index];
        var supplied = network.SuppliedEndOf(index);
        var upTo = network.PathFromSource(grid.Nodes[supplied].Id)
            .Where(e => e.Kind == EdgeKind.Segment)
            .Sum(e => grid.LineTypeOf(grid.Segments[e.Index]).X1OhmPerKm * grid.Segments[e.Index].LengthKm);
        var fromSupply = grid.NodeIndex(seg.From) == supplied ? position : 1 - position;
        return upTo + (fromSupply * seg.LengthKm * grid.LineTypeOf(seg).X1OhmPerKm);
    }

    /// <summary>The feeder breaker at the head of the segment's feeder.</summary>
    internal static SwitchId FeederHead(EnergisedNetwork network, SegmentId segment)
    {
        var grid = network.Grid;
        var supplied = network.SuppliedEndOf(grid.SegmentIndex(segment));
        return network.PathFromSource(grid.Nodes[supplied].Id).Where(e => e.Kind == EdgeKind.Switch)
            .Select(e => grid.Switches[e.Index]).First(s => s.Kind == SwitchKind.Breaker).Id;
    }

    /// <summary>The probability of the segments fed through the device.</summary>
    internal static double BeyondShare(Grid grid, EnergisedNetwork network, RankingResult ranking, string device)
    {
        var d = grid.Switch(new SwitchId(device));
        var far = network.FeedingEdgeOf(grid.NodeIndex(d.To)) == new EdgeRef(EdgeKind.Switch, grid.SwitchIndex(d.Id)) ? d.To : d.From;
        var farIndex = grid.NodeIndex(far);
        return ranking.Segments
            .Where(s => network.IsAtOrBeyond(farIndex, network.SuppliedEndOf(grid.SegmentIndex(s.Id))))
            .Sum(s => s.Probability);
    }

    /// <summary>
    /// The same posterior, segment by segment, to 1e-4: only the leading contenders of each ranking are refined
    /// on the finer quadrature (RankingComputation.RefineContenders), and which segments lead far behind the
    /// best depends on each case's own trip-zone factors, so a segment with some 1e-4 may differ in that digit.
    /// </summary>
    private static void AssertSameProbabilities(RankingResult expected, RankingResult actual)
    {
        var other = actual.Segments.ToDictionary(s => s.Id, s => s.Probability);
        Assert.Equal(expected.Segments.Length, other.Count);
        Assert.All(expected.Segments, s => Assert.Equal(s.Probability, other[s.Id], 1e-4));
    }
}
