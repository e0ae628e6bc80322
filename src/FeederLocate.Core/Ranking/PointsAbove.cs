using FeederLocate.Core.Electrical;
using FeederLocate.Core.Topology;

namespace FeederLocate.Core.Ranking;

/// <summary>
/// Which of a list of measuring points at switching devices (looking away from the source) have a fault beyond
/// them: those whose far node lies on the path from the source to the fault's supplied end. Each point is
/// pushed on a chain at its far node; walking the chain up from a node visits exactly them, so a segment costs
/// the points above it rather than every point (the same as <see cref="FaultResponseModel.IsFaultBeyond"/>
/// for such points). Dead points and points looking toward the source are never listed.
/// </summary>
internal sealed class PointsAbove
{
    private readonly int[] _head;
    private readonly List<(int Point, int Next)> _chain = [];

    public PointsAbove(EnergisedNetwork network, IReadOnlyList<MeasuringPoint> points)
    {
        var atFarEnd = new Dictionary<int, List<int>>();
        for (var k = 0; k < points.Count; k++)
        {
            var p = points[k];
            if (p.Substation >= 0 && p.AwayFromSource && p.SelfSegment < 0)
            {
                (atFarEnd.TryGetValue(p.FarNode, out var list) ? list : atFarEnd[p.FarNode] = []).Add(k);
            }
        }

        _head = new int[network.Grid.Nodes.Length];
        UpstreamChain.Link(network, atFarEnd, _chain, _head);
    }

    /// <summary>Adds to <paramref name="into"/> the points with a fault supplied from <paramref name="suppliedNode"/> beyond them, in ascending order.</summary>
    public void Collect(int suppliedNode, List<int> into)
    {
        var start = into.Count;
        for (var link = _head[suppliedNode]; link >= 0; link = _chain[link].Next)
        {
            into.Add(_chain[link].Point);
        }

        into.Sort(start, into.Count - start, Comparer<int>.Default);
    }
}
