using System.Collections.Immutable;
using FeederLocate.Core.Model;

namespace FeederLocate.Core.Topology;

/// <summary>
/// The radial network energised for one switching state: per node its substation and the edge it is fed
/// through; per segment its supplied end. Nodes are numbered in pre-order from each bus, so "lies beyond"
/// is an interval test. Pure topology: <see cref="RadialCheck"/> decides whether the state is radial, and
/// the electrical sums over the network are <see cref="Electrical.NetworkAggregates"/>.
/// </summary>
public sealed class EnergisedNetwork
{
    private readonly int[] _substationOfNode;
    private readonly EdgeRef[] _parentEdge;
    private readonly int[] _parentNode;
    private readonly int[] _preorder;
    private readonly int[] _subtreeSize;
    private readonly int[] _upNodeOfSegment;
    private readonly int[] _downNodeOfSegment;

    private EnergisedNetwork(NetworkGraph graph, SwitchStates states, int nodeCount, int segmentCount)
    {
        Graph = graph;
        States = states;
        _substationOfNode = Enumerable.Repeat(-1, nodeCount).ToArray();
        _parentEdge = Enumerable.Repeat(EdgeRef.None, nodeCount).ToArray();
        _parentNode = Enumerable.Repeat(-1, nodeCount).ToArray();
        _preorder = new int[nodeCount];
        _subtreeSize = new int[nodeCount];
        _upNodeOfSegment = Enumerable.Repeat(-1, segmentCount).ToArray();
        _downNodeOfSegment = Enumerable.Repeat(-1, segmentCount).ToArray();
    }

    public NetworkGraph Graph { get; }

    public Grid Grid => Graph.Grid;

    public SwitchStates States { get; }

    /// <summary>Node indices in breadth-first order from the buses (parents before children).</summary>
    public ImmutableArray<int> FeedOrder { get; private set; }

    internal static EnergisedNetwork Build(NetworkGraph graph, SwitchStates states) =>
        TryBuild(graph, states, out var network, out var problem) ? network! : throw new TopologyException(problem!);

    internal static bool TryBuild(NetworkGraph graph, SwitchStates states, out EnergisedNetwork? network, out TopologyProblem? problem)
    {
        ArgumentNullException.ThrowIfNull(graph);
        ArgumentNullException.ThrowIfNull(states);
        var check = RadialCheck.Of(graph, states);
        if (!check.IsRadial)
        {
            network = null;
            problem = Describe(graph, check);
            return false;
        }

        var grid = graph.Grid;
        network = new EnergisedNetwork(graph, states, grid.Nodes.Length, grid.Segments.Length);
        network.Feed();
        problem = null;
        return true;
    }

    /// <summary>Index of the substation feeding the node, or -1 when the node is dead.</summary>
    public int SubstationIndexOf(int node) => _substationOfNode[node];

    public Substation? SubstationOf(NodeId node) =>
        _substationOfNode[Grid.NodeIndex(node)] is var s and >= 0 ? Grid.Substations[s] : null;

    public bool IsEnergised(int node) => _substationOfNode[node] >= 0;

    public bool IsEnergised(NodeId node) => IsEnergised(Grid.NodeIndex(node));

    public bool IsSegmentEnergised(int segment) => _upNodeOfSegment[segment] >= 0;

    public bool IsSegmentEnergised(SegmentId segment) => IsSegmentEnergised(Grid.SegmentIndex(segment));

    /// <summary>The end of the segment toward its source (its supplied end), or -1 when it is dead.</summary>
    public int SuppliedEndOf(int segment) => _upNodeOfSegment[segment];

    /// <summary>The end of the segment away from its source, or -1 when it is dead.</summary>
    public int FarEndOf(int segment) => _downNodeOfSegment[segment];

    public EdgeRef FeedingEdgeOf(int node) => _parentEdge[node];

    public int ParentOf(int node) => _parentNode[node];

    /// <summary>True when <paramref name="node"/> lies in the part fed through <paramref name="ancestor"/> (or is it).</summary>
    public bool IsAtOrBeyond(int ancestor, int node) =>
        _substationOfNode[ancestor] >= 0 && _substationOfNode[node] == _substationOfNode[ancestor]
        && _preorder[node] >= _preorder[ancestor] && _preorder[node] < _preorder[ancestor] + _subtreeSize[ancestor];

    /// <summary>The edges from the node's bus to the node, in feeding order; empty for a bus or a dead node.</summary>
    public IReadOnlyList<EdgeRef> PathFromSource(NodeId node)
    {
        var path = new List<EdgeRef>();
        for (var v = Grid.NodeIndex(node); v >= 0 && !_parentEdge[v].IsNone; v = _parentNode[v])
        {
            path.Add(_parentEdge[v]);
        }

        path.Reverse();
        return path;
    }

    /// <summary>True when the indicator's node is the supplied end of its segment (it looks away from the source).</summary>
    public bool FacesAwayFromSource(Indicator indicator)
    {
        var segment = Grid.SegmentIndex(indicator.Segment);
        return _upNodeOfSegment[segment] == Grid.NodeIndex(indicator.Node);
    }

    /// <summary>
    /// The energised segments on the indicator's forward side: its segment and everything reached
    /// through the segment's other end. Empty when its segment is dead.
    /// </summary>
    public IReadOnlyList<SegmentId> ForwardRegion(Indicator indicator)
    {
        ArgumentNullException.ThrowIfNull(indicator);
        var segment = Grid.SegmentIndex(indicator.Segment);
        if (!IsSegmentEnergised(segment))
        {
            return [];
        }

        var far = _downNodeOfSegment[segment];
        var away = FacesAwayFromSource(indicator);
        var region = new List<SegmentId>();
        for (var s = 0; s < Grid.Segments.Length; s++)
        {
            if (!IsSegmentEnergised(s) || _substationOfNode[_downNodeOfSegment[s]] != _substationOfNode[far])
            {
                continue;
            }

            var beyond = IsAtOrBeyond(far, _downNodeOfSegment[s]);
            if (s == segment || beyond == away)
            {
                region.Add(Grid.Segments[s].Id);
            }
        }

        return region;
    }

    /// <summary>Feeds the radial network breadth-first from each bus in turn (the radial check has passed).</summary>
    private void Feed()
    {
        var grid = Grid;
        var order = new List<int>(grid.Nodes.Length);
        for (var s = 0; s < grid.Substations.Length; s++)
        {
            var bus = grid.NodeIndex(grid.Substations[s].BusNode);
            _substationOfNode[bus] = s;
            order.Add(bus);
            for (var head = order.Count - 1; head < order.Count; head++)
            {
                var u = order[head];
                foreach (var (tag, v) in Graph.EdgesAt(u))
                {
                    if (tag == _parentEdge[u] || (tag.Kind == EdgeKind.Switch && !States.IsClosed(tag.Index)))
                    {
                        continue;
                    }

                    _substationOfNode[v] = s;
                    _parentEdge[v] = tag;
                    _parentNode[v] = u;
                    order.Add(v);
                    if (tag.Kind == EdgeKind.Segment)
                    {
                        _upNodeOfSegment[tag.Index] = u;
                        _downNodeOfSegment[tag.Index] = v;
                    }
                }
            }
        }

        FeedOrder = [.. order];
        Number(order);
    }

    /// <summary>Subtree sizes bottom-up, then pre-order numbers top-down.</summary>
    private void Number(List<int> order)
    {
        for (var i = order.Count - 1; i >= 0; i--)
        {
            var v = order[i];
            _subtreeSize[v] += 1;
            if (_parentNode[v] is var p and >= 0)
            {
                _subtreeSize[p] += _subtreeSize[v];
            }
        }

        // Each child's range starts after its parent and its earlier siblings.
        var nextFree = new int[_preorder.Length];
        var offset = 0;
        foreach (var v in order)
        {
            if (_parentNode[v] is var p and >= 0)
            {
                _preorder[v] = nextFree[p];
                nextFree[p] += _subtreeSize[v];
            }
            else
            {
                _preorder[v] = offset;
                offset += _subtreeSize[v];
            }

            nextFree[v] = _preorder[v] + 1;
        }
    }

    /// <summary>The first reason the check fails: a paralleling of substations, else the first loop connected to a bus.</summary>
    private static TopologyProblem Describe(NetworkGraph graph, RadialCheck check)
    {
        var grid = graph.Grid;
        if (check.Parallelings.FirstOrDefault() is { } p)
        {
            var elements = p.Path.Select(graph.Describe).ToImmutableArray();
            var through = elements.IsEmpty ? string.Empty : $" through {string.Join(", ", elements)}";
            return new TopologyProblem(
                $"the switching state parallels substations {grid.Substations[p.First].Id} and {grid.Substations[p.Second].Id}{through}; a node must be fed from one bus only",
                elements);
        }

        var loop = check.Loops.First(l => l.Fed);
        var onLoop = loop.Path.Append(loop.Closing).Select(graph.Describe).ToImmutableArray();
        return new TopologyProblem($"the switching state closes a loop: {string.Join(", ", onLoop)}", onLoop);
    }
}
