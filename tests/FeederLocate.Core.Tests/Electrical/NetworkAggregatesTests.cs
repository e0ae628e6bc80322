using System.Numerics;
using FeederLocate.Core.Electrical;
using FeederLocate.Core.Model;
using FeederLocate.Core.Synthetic;
using FeederLocate.Core.Tests.Support;
using FeederLocate.Core.Topology;

namespace FeederLocate.Core.Tests.Electrical;

public class NetworkAggregatesTests
{
    [Theory]
    [InlineData(12, 1, GroundingScheme.Isolated)]
    [InlineData(90, 7, GroundingScheme.Solid)]
    public void Path_impedance_is_the_sum_of_the_segments_on_the_path_from_the_bus(int segments, int seed, GroundingScheme scheme)
    {
        var grid = SyntheticGrid.Generate(new SyntheticGridOptions(segments, seed, scheme));
        var network = Grids.Normal(grid);
        var sums = NetworkAggregates.Of(network);

        foreach (var node in grid.Nodes.Where(n => network.IsEnergised(n.Id)))
        {
            var z1 = Complex.Zero;
            var z0 = Complex.Zero;
            foreach (var edge in network.PathFromSource(node.Id).Where(e => e.Kind == EdgeKind.Segment))
            {
                var segment = grid.Segments[edge.Index];
                var type = grid.LineTypeOf(segment);
                z1 += new Complex(type.R1OhmPerKm, type.X1OhmPerKm) * segment.LengthKm;
                z0 += new Complex(type.R0OhmPerKm, type.X0OhmPerKm) * segment.LengthKm;
            }

            var index = grid.NodeIndex(node.Id);
            Assert.True((sums.PositiveSequencePathOhm(index) - z1).Magnitude <= 1e-9 * (1 + z1.Magnitude), $"Z1 at {node.Id}");
            Assert.True((sums.ZeroSequencePathOhm(index) - z0).Magnitude <= 1e-9 * (1 + z0.Magnitude), $"Z0 at {node.Id}");
        }
    }

    [Theory]
    [InlineData(12, 1, GroundingScheme.Resonant)]
    [InlineData(90, 7, GroundingScheme.Impedance)]
    public void Capacitance_of_a_substation_is_that_of_every_energised_segment_it_feeds(int segments, int seed, GroundingScheme scheme)
    {
        var grid = SyntheticGrid.Generate(new SyntheticGridOptions(segments, seed, scheme));
        var network = Grids.Normal(grid);
        var sums = NetworkAggregates.Of(network);

        for (var s = 0; s < grid.Substations.Length; s++)
        {
            var expectedF = Enumerable.Range(0, grid.Segments.Length)
                .Where(i => network.IsSegmentEnergised(i) && network.SubstationIndexOf(network.SuppliedEndOf(i)) == s)
                .Sum(i => grid.LineTypeOf(grid.Segments[i]).C0NfPerKm * 1e-9 * grid.Segments[i].LengthKm);
            Assert.Equal(expectedF, sums.TotalCapacitanceF(s), 1e-9 * expectedF);
            var bus = grid.NodeIndex(grid.Substations[s].BusNode);
            Assert.Equal(sums.TotalCapacitanceF(s), sums.CapacitanceAtOrBeyondF(bus));
        }
    }
}
