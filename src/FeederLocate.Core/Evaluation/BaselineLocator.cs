using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;
using FeederLocate.Core.Topology;

namespace FeederLocate.Core.Evaluation;

/// <summary>
/// The deterministic rule to beat: the fault lies just beyond the last indicator (farthest from the
/// source) that saw it — its own segment, then the segments beyond it in feeding order. Where no
/// indicator saw it: just beyond the tripped device, or beyond the feeder breaker that recorded the
/// largest residual current.
/// </summary>
public sealed class BaselineLocator
{
    private readonly Grid _grid;
    private readonly EnergisedNetwork _network;
    private readonly Dictionary<int, List<int>> _segmentsBeyondNode = [];

    public BaselineLocator(EnergisedNetwork network)
    {
        ArgumentNullException.ThrowIfNull(network);
        _network = network;
        _grid = network.Grid;
    }

    /// <summary>Segments in the rule's order of suspicion (at most <paramref name="count"/>).</summary>
    public IReadOnlyList<SegmentId> Suspects(Incident incident, int count)
    {
        ArgumentNullException.ThrowIfNull(incident);
        var start = StartNode(incident, out var firstSegment);
        var order = new List<int>();
        if (firstSegment >= 0)
        {
            order.Add(firstSegment);
        }

        if (start >= 0)
        {
            order.AddRange(SegmentsBeyond(start).Where(s => s != firstSegment));
        }

        return [.. order.Take(count).Select(s => _grid.Segments[s].Id)];
    }

    private int StartNode(Incident incident, out int firstSegment)
    {
        firstSegment = -1;
        var depth = -1.0;
        var node = -1;
        foreach (var indication in incident.Indications)
        {
            if (indication.Distrusted || indication.State is not (IndicatorState.Fault or IndicatorState.Forward))
            {
                continue;
            }

            var indicator = _grid.Indicator(indication.Indicator);
            var segment = _grid.SegmentIndex(indicator.Segment);
            if (!_network.IsSegmentEnergised(segment))
            {
                continue;
            }

            var far = _network.FarEndOf(segment);
            var d = Depth(far);
            if (d > depth)
            {
                depth = d;
                node = far;
                firstSegment = segment;
            }
        }

        if (node >= 0)
        {
            return node;
        }

        var device = incident.TrippedDevice
            ?? incident.Measurements.Where(m => m.ResidualCurrentA is not null).MaxBy(m => m.ResidualCurrentA)?.Device;
        if (device is not { } id)
        {
            return -1;
        }

        var s = _grid.Switch(id);
        var (a, b) = (_grid.NodeIndex(s.From), _grid.NodeIndex(s.To));
        return _network.ParentOf(b) == a ? b : _network.ParentOf(a) == b ? a : -1;
    }

    private int Depth(int node)
    {
        var depth = 0;
        for (var v = node; v >= 0; v = _network.ParentOf(v))
        {
            depth++;
        }

        return depth;
    }

    /// <summary>Segments fed through the node, breadth first.</summary>
    private List<int> SegmentsBeyond(int node)
    {
        if (_segmentsBeyondNode.TryGetValue(node, out var cached))
        {
            return cached;
        }

        var result = new List<int>();
        foreach (var v in _network.FeedOrder)
        {
            var edge = _network.FeedingEdgeOf(v);
            if (v != node && edge.Kind == EdgeKind.Segment && !edge.IsNone && _network.IsAtOrBeyond(node, v))
            {
                result.Add(edge.Index);
            }
        }

        _segmentsBeyondNode[node] = result;
        return result;
    }
}
