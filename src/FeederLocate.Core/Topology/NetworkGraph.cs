using System.Collections.Immutable;
using System.Diagnostics.CodeAnalysis;
using FeederLocate.Core.Model;
using QuikGraph;

namespace FeederLocate.Core.Topology;

/// <summary>
/// The one graph model of a grid: every node a vertex (by its index), every segment and switching
/// device an edge, whatever the switch states. Read-only; views for a switching state are built over it.
/// </summary>
public sealed class NetworkGraph
{
    private readonly UndirectedGraph<int, TaggedEdge<int, EdgeRef>> _graph;
    private readonly (int From, int To)[] _segmentEnds;
    private readonly (int From, int To)[] _switchEnds;

    public NetworkGraph(Grid grid)
    {
        ArgumentNullException.ThrowIfNull(grid);
        Grid = grid;
        _segmentEnds = [.. grid.Segments.Select(s => (grid.NodeIndex(s.From), grid.NodeIndex(s.To)))];
        _switchEnds = [.. grid.Switches.Select(s => (grid.NodeIndex(s.From), grid.NodeIndex(s.To)))];
        _graph = new UndirectedGraph<int, TaggedEdge<int, EdgeRef>>(allowParallelEdges: true);
        _graph.AddVertexRange(Enumerable.Range(0, grid.Nodes.Length));
        _graph.AddEdgeRange(Edges.Select(e =>
        {
            var (from, to) = EndsOf(e);
            return new TaggedEdge<int, EdgeRef>(from, to, e);
        }));

        SwitchFreeParts = NodePartition.Of(grid.Nodes.Length, _segmentEnds);
        Sections = SectionMap.Build(grid, SwitchFreeParts);
    }

    public Grid Grid { get; }

    public int NodeCount => Grid.Nodes.Length;

    /// <summary>Every edge: the segments in grid order, then the switching devices in grid order.</summary>
    public IEnumerable<EdgeRef> Edges =>
        Enumerable.Range(0, Grid.Segments.Length).Select(i => new EdgeRef(EdgeKind.Segment, i))
            .Concat(Enumerable.Range(0, Grid.Switches.Length).Select(i => new EdgeRef(EdgeKind.Switch, i)));

    /// <summary>Nodes grouped by "connected without crossing a switch", whatever the switch states: sections and switching zones.</summary>
    public NodePartition SwitchFreeParts { get; }

    public SectionMap Sections { get; }

    /// <summary>The edges at node index <paramref name="node"/>, each with the node at its other end.</summary>
    public IEnumerable<(EdgeRef Edge, int Neighbour)> EdgesAt(int node) =>
        _graph.AdjacentEdges(node).Select(e => (e.Tag, e.Source == node ? e.Target : e.Source));

    /// <summary>The node indices of an edge's from and to ends.</summary>
    public (int From, int To) EndsOf(EdgeRef edge) => edge.Kind == EdgeKind.Segment ? _segmentEnds[edge.Index] : _switchEnds[edge.Index];

    /// <summary>The radial network energised in <paramref name="states"/>; throws <see cref="TopologyException"/> on a loop.</summary>
    public EnergisedNetwork Energise(SwitchStates states) => EnergisedNetwork.Build(this, states);

    /// <summary>Builds the radial network energised in <paramref name="states"/>, or says why it cannot.</summary>
    public bool TryEnergise(SwitchStates states, [NotNullWhen(true)] out EnergisedNetwork? network, [NotNullWhen(false)] out TopologyProblem? problem)
    {
        ArgumentNullException.ThrowIfNull(states);
        lock (_energised)
        {
            foreach (var (closed, kept) in _energised)
            {
                if (closed.AsSpan().SequenceEqual(states.Closed.AsSpan()))
                {
                    (network, problem) = (kept, null);
                    return true;
                }
            }
        }

        if (!EnergisedNetwork.TryBuild(this, states, out network, out problem))
        {
            return false;
        }

        lock (_energised)
        {
            if (_energised.Count == KeptNetworks)
            {
                _energised.RemoveAt(0);
            }

            _energised.Add((states.Closed, network));
        }

        return true;
    }

    /// <summary>
    /// The radial networks last built by <see cref="TryEnergise"/>, by switch positions: the network of one set
    /// of positions is immutable, and most incidents of a grid are ranked on the same few (the normal ones, and
    /// an incident's own each time it is ranked again), so building one again is spared.
    /// </summary>
    private readonly List<(ImmutableArray<bool> Closed, EnergisedNetwork Network)> _energised = [];

    private const int KeptNetworks = 4;

    /// <summary>The name of an edge's element, e.g. "segment S7" or "switch LB2".</summary>
    public string Describe(EdgeRef edge) => $"{KindName(edge)} {IdOf(edge)}";

    /// <summary>The element kind as files and messages name it: "segment" or "switch".</summary>
    public static string KindName(EdgeRef edge) => edge.Kind == EdgeKind.Segment ? "segment" : "switch";

    /// <summary>The id of an edge's element.</summary>
    public string IdOf(EdgeRef edge) => edge.Kind == EdgeKind.Segment
        ? Grid.Segments[edge.Index].Id.Value
        : Grid.Switches[edge.Index].Id.Value;
}
