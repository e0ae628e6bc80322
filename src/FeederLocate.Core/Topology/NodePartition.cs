using System.Collections.Immutable;
using QuikGraph.Collections;

namespace FeederLocate.Core.Topology;

/// <summary>
/// The nodes of a grid (by index) grouped into parts connected through a chosen set of edges, e.g.
/// "connected without crossing a switch" (<see cref="NetworkGraph.SwitchFreeParts"/>). Parts are
/// numbered in the order of their lowest node, so numbers are stable for a grid.
/// </summary>
public sealed class NodePartition
{
    private readonly int[] _partOfNode;

    private NodePartition(int[] partOfNode, ImmutableArray<ImmutableArray<int>> parts)
    {
        _partOfNode = partOfNode;
        Parts = parts;
    }

    /// <summary>Per part, its node indices in ascending order.</summary>
    public ImmutableArray<ImmutableArray<int>> Parts { get; }

    public int NodeCount => _partOfNode.Length;

    public int PartOf(int node) => _partOfNode[node];

    public bool AreConnected(int a, int b) => _partOfNode[a] == _partOfNode[b];

    /// <summary>The parts of <paramref name="nodeCount"/> nodes joined by <paramref name="links"/> (pairs of node indices).</summary>
    public static NodePartition Of(int nodeCount, IEnumerable<(int From, int To)> links)
    {
        ArgumentNullException.ThrowIfNull(links);
        var connectivity = new Connectivity(nodeCount);
        foreach (var (from, to) in links)
        {
            connectivity.Join(from, to);
        }

        return connectivity.ToPartition();
    }

    /// <summary>Numbers the disjoint sets of <paramref name="sets"/> in the order of their lowest node.</summary>
    internal static NodePartition From(ForestDisjointSet<int> sets, int nodeCount)
    {
        var partOfNode = new int[nodeCount];
        var partOfRoot = new Dictionary<int, int>();
        var members = new List<ImmutableArray<int>.Builder>();
        for (var v = 0; v < nodeCount; v++)
        {
            var root = sets.FindSet(v);
            if (!partOfRoot.TryGetValue(root, out var part))
            {
                part = members.Count;
                partOfRoot[root] = part;
                members.Add(ImmutableArray.CreateBuilder<int>());
            }

            partOfNode[v] = part;
            members[part].Add(v);
        }

        return new NodePartition(partOfNode, [.. members.Select(m => m.ToImmutable())]);
    }
}

/// <summary>
/// Nodes joined one link at a time: the one union-find of the topology (QuikGraph's disjoint set,
/// near-linear; a depth-first component search grows much faster on long feeders).
/// </summary>
internal sealed class Connectivity
{
    private readonly ForestDisjointSet<int> _sets;
    private readonly int _nodeCount;

    public Connectivity(int nodeCount)
    {
        ArgumentOutOfRangeException.ThrowIfNegative(nodeCount);
        _nodeCount = nodeCount;
        _sets = new ForestDisjointSet<int>(nodeCount);
        for (var v = 0; v < nodeCount; v++)
        {
            _sets.MakeSet(v);
        }
    }

    /// <summary>Joins the parts of <paramref name="a"/> and <paramref name="b"/>; false when they were already one (the link closes a loop).</summary>
    public bool Join(int a, int b)
    {
        if (_sets.AreInSameSet(a, b))
        {
            return false;
        }

        _sets.Union(a, b);
        return true;
    }

    public int RootOf(int node) => _sets.FindSet(node);

    public NodePartition ToPartition() => NodePartition.From(_sets, _nodeCount);
}
