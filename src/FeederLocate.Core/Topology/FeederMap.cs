using System.Collections.Immutable;
using FeederLocate.Core.Model;

namespace FeederLocate.Core.Topology;

/// <summary>
/// A feeder: the part of the network fed, in the normal switching state, through one edge leaving a
/// substation's bus (usually its feeder breaker).
/// </summary>
/// <param name="Name">What operators call it: the head device's id without its kind prefix ("CB-A1" gives "A1").</param>
/// <param name="Head">The edge leaving the bus.</param>
/// <param name="HeadId">The id of that edge's device or segment.</param>
/// <param name="Substation">Index of the substation whose bus feeds it.</param>
/// <param name="Nodes">Node indices of the feeder, parents before children.</param>
public sealed record Feeder(string Name, EdgeRef Head, string HeadId, int Substation, ImmutableArray<int> Nodes);

/// <summary>The feeders of a grid in its normal switching state, and the feeder of every node.</summary>
public sealed class FeederMap
{
    private readonly int[] _feederOfNode;

    private FeederMap(EnergisedNetwork? normal, ImmutableArray<Feeder> feeders, int[] feederOfNode)
    {
        Normal = normal;
        All = feeders;
        _feederOfNode = feederOfNode;
    }

    /// <summary>The network energised in the normal state; null when the normal state is not radial.</summary>
    public EnergisedNetwork? Normal { get; }

    /// <summary>Feeders in the order of their substations, then of their head edges in the grid.</summary>
    public ImmutableArray<Feeder> All { get; }

    /// <summary>Index into <see cref="All"/> of the feeder a node lies on; -1 for a bus or a node fed from nowhere.</summary>
    public int FeederOf(int node) => _feederOfNode[node];

    /// <summary>The feeder of a segment (by its supplied end in the normal state), or null when it is dead then.</summary>
    public Feeder? OfSegment(int segment)
    {
        if (Normal is null || Normal.FarEndOf(segment) is not (var far and >= 0))
        {
            return null;
        }

        return _feederOfNode[far] is var f and >= 0 ? All[f] : null;
    }

    public static FeederMap Build(NetworkGraph graph)
    {
        ArgumentNullException.ThrowIfNull(graph);
        var grid = graph.Grid;
        var feederOf = Enumerable.Repeat(-1, grid.Nodes.Length).ToArray();
        if (!graph.TryEnergise(SwitchStates.Normal(grid), out var normal, out _))
        {
            return new FeederMap(null, [], feederOf);
        }

        var heads = new List<(int Node, EdgeRef Edge, int Substation)>();
        var members = new List<List<int>>();
        foreach (var v in normal!.FeedOrder)
        {
            var parent = normal.ParentOf(v);
            if (parent < 0)
            {
                continue;
            }

            if (normal.ParentOf(parent) < 0)
            {
                feederOf[v] = heads.Count;
                heads.Add((v, normal.FeedingEdgeOf(v), normal.SubstationIndexOf(v)));
                members.Add([v]);
            }
            else
            {
                feederOf[v] = feederOf[parent];
                members[feederOf[v]].Add(v);
            }
        }

        // Stable order: by substation, then by the head edge's place in the grid.
        var order = Enumerable.Range(0, heads.Count)
            .OrderBy(f => heads[f].Substation)
            .ThenBy(f => heads[f].Edge.Kind)
            .ThenBy(f => heads[f].Edge.Index)
            .ToArray();
        var renumber = new int[heads.Count];
        for (var k = 0; k < order.Length; k++)
        {
            renumber[order[k]] = k;
        }

        for (var v = 0; v < feederOf.Length; v++)
        {
            if (feederOf[v] >= 0)
            {
                feederOf[v] = renumber[feederOf[v]];
            }
        }

        var feeders = order.Select(f =>
        {
            var edge = heads[f].Edge;
            var id = edge.Kind == EdgeKind.Switch ? grid.Switches[edge.Index].Id.Value : grid.Segments[edge.Index].Id.Value;
            return new Feeder(NameOf(id), edge, id, heads[f].Substation, [.. members[f]]);
        });
        return new FeederMap(normal, [.. feeders], feederOf);
    }

    /// <summary>"CB-A1" gives "A1"; an id without a prefix is the name itself.</summary>
    public static string NameOf(string headId)
    {
        ArgumentNullException.ThrowIfNull(headId);
        var dash = headId.IndexOf('-', StringComparison.Ordinal);
        return dash > 0 && dash < headId.Length - 1 ? headId[(dash + 1)..] : headId;
    }
}
