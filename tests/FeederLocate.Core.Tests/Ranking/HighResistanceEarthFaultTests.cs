using FeederLocate.Core.Electrical;
using FeederLocate.Core.Evaluation;
using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;
using FeederLocate.Core.Ranking;
using FeederLocate.Core.Synthetic;
using FeederLocate.Core.Tests.Support;
using FeederLocate.Core.Topology;

namespace FeederLocate.Core.Tests.Ranking;

/// <summary>
/// Earth faults through a high resistance on earthed networks: a conductor down on dry ground draws a
/// few amperes through 1 kΩ and trips nothing (common practice), yet the residual currents and U0 at the
/// feeder breakers and the indicators still say where it is.
/// </summary>
public class HighResistanceEarthFaultTests
{
    [Theory]
    [InlineData("impedance", "S104")]
    [InlineData("impedance", "S203")]
    [InlineData("impedance", "S305")]
    [InlineData("solid", "S203")]
    public void A_one_kilohm_earth_fault_that_trips_nothing_ranks_its_own_feeder_first(string scheme, string segment)
    {
        // 20 kV, Rf = 1000 Ω: |I_f| ≤ 3E / 3Rf = E / Rf ≈ 11.5 A (with c = 1.1: 12.7 A), far below any
        // overcurrent setting — nothing trips. By hand for the impedance sample (12 Ω neutral resistor):
        // I_f ≈ 1.1·20 000/√3 / (1000 + 12 + line and transformer parts) ≈ 12.5 A; the engine must agree within 2 %.
        var grid = Grids.Sample(scheme);
        var network = Grids.Normal(grid);
        var fault = FaultCurrents.At(network, new FaultCase(new SegmentId(segment), 0.5, FaultType.LG, 1000));
        if (scheme == "impedance")
        {
            Assert.InRange(fault.FaultCurrentA, 12.5 * 0.98, 12.7 * 1.02);
        }

        var incident = EngineIncidents.Exact(fault, null, EngineIncidents.FeederRecords(grid, fault, phase: false, earth: true));

        var ranking = FaultRanking.Rank(grid, incident);

        var head = ProtectionEvidenceTests.FeederHead(network, new SegmentId(segment));
        var top = ranking.Segments[0].Id;
        Assert.Equal(head, ProtectionEvidenceTests.FeederHead(network, top));
        Assert.True(ProtectionEvidenceTests.BeyondShare(grid, network, ranking, head.Value) > 0.5);
        var section = ranking.Sections.Select(s => s.Id).ToList().IndexOf(ranking.Segments.Single(s => s.Id.Value == segment).Section);
        Assert.InRange(section, 0, 2);
    }

    [Theory]
    [InlineData(GroundingScheme.Solid, 11)]
    [InlineData(GroundingScheme.Impedance, 12)]
    public void A_high_resistance_earth_fault_ranks_its_own_feeder_first_on_generated_grids(GroundingScheme scheme, int seed)
    {
        // 2 kΩ earth faults, nothing tripped, indications and feeder-breaker records (residual, U0) exact:
        // the simulator with every error rate and the record noise at zero.
        var grid = SyntheticGrid.Generate(new SyntheticGridOptions(300, seed, scheme, 0.15, 40, 5, 2));
        var graph = new NetworkGraph(grid);
        var network = graph.Energise(SwitchStates.Normal(grid));
        var simulator = new IncidentSimulator(graph, new SimulationSettings(0, 0, 0, 0));
        foreach (var k in new[] { 17, 111, 222 })
        {
            var segment = grid.Segments[k % grid.Segments.Length].Id;
            var incident = simulator.At(segment, 0.4, FaultType.LG, 2000, new Random(k)).Incident;
            Assert.Null(incident.TrippedDevice);

            var ranking = FaultRanking.Rank(graph, incident);

            var head = ProtectionEvidenceTests.FeederHead(network, segment);
            Assert.Equal(head, ProtectionEvidenceTests.FeederHead(network, ranking.Segments[0].Id));
        }
    }

    [Fact]
    public void Where_nothing_tripped_the_assumptions_name_the_high_resistance_range()
    {
        var grid = Grids.Sample("impedance");
        var ranking = FaultRanking.Rank(grid, EngineIncidents.WithIndications(null, FaultType.LG));

        Assert.Contains(ranking.Assumptions, a => a.Contains("up to 5000 Ω", StringComparison.Ordinal));
    }
}
