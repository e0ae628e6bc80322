using FeederLocate.Core.Model;
using QuikGraph;

namespace FeederLocate.Core.Topology;

/// <summary>
/// The one graph model of a grid: every node a vertex (by its index), every segment and switching
/// device an edge, whatever the switch states. Views for a switching state are built over it.
/// </summary>
public sealed class NetworkGraph
{
    public NetworkGraph(Grid grid)
    {
        ArgumentNullException.ThrowIfNull(grid);
        Grid = grid;
        Graph = new UndirectedGraph<int, TaggedEdge<int, EdgeRef>>(allowParallelEdges: true);
        Graph.AddVertexRange(Enumerable.Range(0, grid.Nodes.Length));
        for (var i = 0; i < grid.Segments.Length; i++)
        {
            var s = grid.Segments[i];
            Graph.AddEdge(new TaggedEdge<int, EdgeRef>(grid.NodeIndex(s.From), grid.NodeIndex(s.To), new EdgeRef(EdgeKind.Segment, i)));
        }

        for (var i = 0; i < grid.Switches.Length; i++)
        {
            var s = grid.Switches[i];
            Graph.AddEdge(new TaggedEdge<int, EdgeRef>(grid.NodeIndex(s.From), grid.NodeIndex(s.To), new EdgeRef(EdgeKind.Switch, i)));
        }

        Sections = SectionMap.Build(grid, Graph);
    }

    public Grid Grid { get; }

    /// <summary>The QuikGraph graph: vertices are node indices, edge tags say which element an edge is.</summary>
    public UndirectedGraph<int, TaggedEdge<int, EdgeRef>> Graph { get; }

    public SectionMap Sections { get; }

    /// <summary>The radial network energised in <paramref name="states"/>; throws <see cref="TopologyException"/> on a loop.</summary>
    public EnergisedNetwork Energise(SwitchStates states) => EnergisedNetwork.Build(this, states);

    /// <summary>Builds the radial network energised in <paramref name="states"/>, or says why it cannot.</summary>
    public bool TryEnergise(SwitchStates states, out EnergisedNetwork? network, out TopologyProblem? problem) =>
        EnergisedNetwork.TryBuild(this, states, out network, out problem);

    /// <summary>The name of an edge's element, e.g. "segment S7" or "switch LB2".</summary>
    public string Describe(EdgeRef edge) => edge.Kind == EdgeKind.Segment
        ? $"segment {Grid.Segments[edge.Index].Id}"
        : $"switch {Grid.Switches[edge.Index].Id}";
}
