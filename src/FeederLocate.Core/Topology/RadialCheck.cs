using System.Collections.Immutable;
using QuikGraph;
using QuikGraph.Algorithms;

namespace FeederLocate.Core.Topology;

/// <summary>
/// A loop of elements in service: <see cref="Closing"/> is the element that closed it (in the order
/// segments, then switching devices), <see cref="Path"/> the rest of the loop from one of its ends to the
/// other. <see cref="Fed"/> is true when the loop is connected to a substation bus.
/// </summary>
public sealed record ClosedLoop(EdgeRef Closing, ImmutableArray<EdgeRef> Path, bool Fed);

/// <summary>
/// Two substations whose buses are connected (<see cref="First"/> &lt; <see cref="Second"/>, indices in
/// the grid); <see cref="Path"/> is the elements from the first bus to the second, empty when they share a bus node.
/// </summary>
public sealed record ParalleledSubstations(int First, int Second, ImmutableArray<EdgeRef> Path);

/// <summary>
/// The one radial check: with the elements in service for a switching state, every loop (naming its
/// elements), every pair of substations fed into each other, and which nodes are reached from a bus.
/// Used by the grid loader's normal-state check and by <see cref="EnergisedNetwork"/>.
/// </summary>
public sealed class RadialCheck
{
    private readonly bool[] _fed;
    private readonly Lazy<NodePartition> _connected;

    private RadialCheck(Connectivity connectivity, bool[] fed, ImmutableArray<ClosedLoop> loops, ImmutableArray<ParalleledSubstations> parallelings)
    {
        _connected = new Lazy<NodePartition>(connectivity.ToPartition);
        _fed = fed;
        Loops = loops;
        Parallelings = parallelings;
    }

    /// <summary>The nodes grouped by "connected through elements in service".</summary>
    public NodePartition Connected => _connected.Value;

    /// <summary>Every loop, fed or not, in the order its closing element comes in the grid.</summary>
    public ImmutableArray<ClosedLoop> Loops { get; }

    /// <summary>Every substation whose bus is connected to an earlier substation's bus, with that substation.</summary>
    public ImmutableArray<ParalleledSubstations> Parallelings { get; }

    /// <summary>True when no node is fed from two buses and no loop is connected to a bus.</summary>
    public bool IsRadial => Parallelings.IsEmpty && !Loops.Any(l => l.Fed);

    /// <summary>True when node index <paramref name="node"/> is connected to a substation bus.</summary>
    public bool IsFed(int node) => _fed[node];

    /// <summary>Checks <paramref name="graph"/> with every segment in service and the switching devices closed in <paramref name="states"/>.</summary>
    public static RadialCheck Of(NetworkGraph graph, SwitchStates states)
    {
        ArgumentNullException.ThrowIfNull(graph);
        ArgumentNullException.ThrowIfNull(states);
        var grid = graph.Grid;
        var connectivity = new Connectivity(graph.NodeCount);
        var forest = new List<EdgeRef>();
        var closing = new List<EdgeRef>();
        foreach (var edge in graph.Edges.Where(e => e.Kind == EdgeKind.Segment || states.IsClosed(e.Index)))
        {
            var (from, to) = graph.EndsOf(edge);
            (connectivity.Join(from, to) ? forest : closing).Add(edge);
        }

        var buses = grid.Substations.Select(s => grid.NodeIndex(s.BusNode)).ToArray();
        var firstOnBus = new Dictionary<int, int>();
        var paralleled = new List<(int First, int Second)>();
        for (var s = 0; s < buses.Length; s++)
        {
            var root = connectivity.RootOf(buses[s]);
            if (!firstOnBus.TryAdd(root, s))
            {
                paralleled.Add((firstOnBus[root], s));
            }
        }

        var fed = new bool[graph.NodeCount];
        for (var v = 0; v < fed.Length; v++)
        {
            fed[v] = firstOnBus.ContainsKey(connectivity.RootOf(v));
        }

        if (closing.Count == 0 && paralleled.Count == 0)
        {
            return new RadialCheck(connectivity, fed, [], []);
        }

        // The forest's path between two connected nodes is unique: it names the rest of a loop or the
        // tie between two buses. Built only when there is something to report.
        var tree = new UndirectedGraph<int, TaggedEdge<int, EdgeRef>>(allowParallelEdges: false);
        tree.AddVertexRange(Enumerable.Range(0, graph.NodeCount));
        tree.AddEdgeRange(forest.Select(e =>
        {
            var (from, to) = graph.EndsOf(e);
            return new TaggedEdge<int, EdgeRef>(from, to, e);
        }));
        ImmutableArray<EdgeRef> PathBetween(int from, int to)
        {
            var tryGetPath = tree.ShortestPathsDijkstra(_ => 1.0, from);
            return tryGetPath(to, out var path) ? [.. path.Select(e => e.Tag)] : [];
        }

        var loops = closing.Select(e =>
        {
            var (from, to) = graph.EndsOf(e);
            return new ClosedLoop(e, PathBetween(from, to), fed[from]);
        });
        var parallelings = paralleled.Select(p => new ParalleledSubstations(p.First, p.Second, PathBetween(buses[p.First], buses[p.Second])));
        return new RadialCheck(connectivity, fed, [.. loops], [.. parallelings]);
    }
}
