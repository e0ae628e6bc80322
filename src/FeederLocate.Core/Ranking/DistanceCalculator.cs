using FeederLocate.Core.Topology;

namespace FeederLocate.Core.Ranking;

/// <summary>Distance from the substation bus along the energised path, km.</summary>
internal sealed class DistanceCalculator
{
    private readonly EnergisedNetwork _network;
    private readonly double[] _nodeKm;

    public DistanceCalculator(EnergisedNetwork network)
    {
        _network = network;
        var grid = network.Grid;
        _nodeKm = new double[grid.Nodes.Length];
        foreach (var v in network.FeedOrder)
        {
            var edge = network.FeedingEdgeOf(v);
            if (!edge.IsNone)
            {
                _nodeKm[v] = _nodeKm[network.ParentOf(v)] + (edge.Kind == EdgeKind.Segment ? grid.Segments[edge.Index].LengthKm : 0);
            }
        }
    }

    /// <summary>Distance to a point at <paramref name="position"/> (fraction from the segment's from node).</summary>
    public double AlongSegmentKm(int segment, double position)
    {
        var grid = _network.Grid;
        var seg = grid.Segments[segment];
        var up = _network.SuppliedEndOf(segment);
        var fromSupply = grid.NodeIndex(seg.From) == up ? position : 1 - position;
        return _nodeKm[up] + (fromSupply * seg.LengthKm);
    }
}
