using FeederLocate.Core.Model;
using QuikGraph;
using QuikGraph.Algorithms;
using QuikGraph.Collections;

namespace FeederLocate.Core.Formats;

/// <summary>Checks of a grid's elements against each other: ids, references, and the normal-state topology.</summary>
internal static class GridChecks
{
    public static void Run(GridParts parts, IssueLog log)
    {
        UniqueIds(parts.LineTypes, "lineType", t => t.Id.Value, log);
        UniqueIds(parts.Substations, "substation", s => s.Id.Value, log);
        UniqueIds(parts.Nodes, "node", n => n.Id.Value, log);
        UniqueIds(parts.Segments, "segment", s => s.Id.Value, log);
        UniqueIds(parts.Switches, "switch", s => s.Id.Value, log);
        UniqueIds(parts.Indicators, "indicator", i => i.Id.Value, log);

        var nodes = parts.Nodes.Select(n => n.Id).ToHashSet();
        var lineTypes = parts.LineTypes.Select(t => t.Id).ToHashSet();
        var segments = parts.Segments.GroupBy(s => s.Id).ToDictionary(g => g.Key, g => g.First());

        foreach (var substation in parts.Substations)
        {
            NodeExists(nodes, "substation", substation.Id.Value, "busNode", substation.BusNode, log);
        }

        foreach (var busNode in parts.Substations.GroupBy(s => s.BusNode).Where(g => g.Count() > 1))
        {
            log.Error("substation", busNode.Skip(1).First().Id.Value, "busNode",
                $"\"{busNode.Key}\" is already the bus of substation {busNode.First().Id}");
        }

        foreach (var segment in parts.Segments)
        {
            Ends(nodes, "segment", segment.Id.Value, segment.From, segment.To, log);
            if (segment.LineType.Value.Length > 0 && !lineTypes.Contains(segment.LineType))
            {
                log.Error("segment", segment.Id.Value, "lineType", $"refers to unknown line type \"{segment.LineType}\"");
            }
        }

        foreach (var device in parts.Switches)
        {
            Ends(nodes, "switch", device.Id.Value, device.From, device.To, log);
        }

        foreach (var indicator in parts.Indicators)
        {
            if (indicator.Segment.Value.Length == 0)
            {
                continue;
            }

            if (!segments.TryGetValue(indicator.Segment, out var segment))
            {
                log.Error("indicator", indicator.Id.Value, "segment", $"refers to unknown segment \"{indicator.Segment}\"");
            }
            else if (indicator.Node.Value.Length > 0 && indicator.Node != segment.From && indicator.Node != segment.To)
            {
                log.Error("indicator", indicator.Id.Value, "node",
                    $"\"{indicator.Node}\" is not an end of segment {segment.Id} (its ends are {segment.From} and {segment.To})");
            }
        }

        if (!log.HasErrors)
        {
            NormalTopology(parts, log);
        }
    }

    private static void UniqueIds<T>(IEnumerable<T> items, string kind, Func<T, string> id, IssueLog log)
    {
        foreach (var group in items.GroupBy(id).Where(g => g.Count() > 1 && !g.Key.StartsWith('#')))
        {
            log.Error(kind, group.Key, "id", $"is used by {group.Count()} {kind} elements; ids must be unique");
        }
    }

    private static void Ends(HashSet<NodeId> nodes, string kind, string id, NodeId from, NodeId to, IssueLog log)
    {
        NodeExists(nodes, kind, id, "from", from, log);
        NodeExists(nodes, kind, id, "to", to, log);
        if (from == to && from.Value.Length > 0)
        {
            log.Error(kind, id, "to", $"must differ from from (both are \"{from}\")");
        }
    }

    private static void NodeExists(HashSet<NodeId> nodes, string kind, string id, string field, NodeId node, IssueLog log)
    {
        if (node.Value.Length > 0 && !nodes.Contains(node))
        {
            log.Error(kind, id, field, $"refers to unknown node \"{node}\"");
        }
    }

    /// <summary>
    /// With every normally-open switch open: no closed loop, no node fed from two buses; nodes fed from
    /// no bus are warned about. A loop is reported with the elements on it.
    /// </summary>
    private static void NormalTopology(GridParts parts, IssueLog log)
    {
        var disjoint = new ForestDisjointSet<NodeId>(parts.Nodes.Count);
        foreach (var node in parts.Nodes)
        {
            disjoint.MakeSet(node.Id);
        }

        // The spanning forest so far, to name the elements of a loop when an edge closes one.
        var forest = new UndirectedGraph<NodeId, TaggedEdge<NodeId, string>>(allowParallelEdges: true);
        forest.AddVertexRange(parts.Nodes.Select(n => n.Id));
        var closedEdges = parts.Segments.Select(s => (s.From, s.To, Name: $"segment {s.Id}"))
            .Concat(parts.Switches.Where(s => !s.NormallyOpen).Select(s => (s.From, s.To, Name: $"switch {s.Id}")));
        foreach (var (from, to, name) in closedEdges)
        {
            if (disjoint.AreInSameSet(from, to))
            {
                var path = PathBetween(forest, from, to);
                var elements = string.Join(", ", path.Append(name));
                var kind = name.Split(' ')[0];
                log.Error(kind, name[(kind.Length + 1)..], string.Empty,
                    $"closes a loop in the normal state (every normally-open switch open); the loop is: {elements}");
                continue;
            }

            disjoint.Union(from, to);
            forest.AddEdge(new TaggedEdge<NodeId, string>(from, to, name));
        }

        var busOf = new Dictionary<NodeId, SubstationId>();
        foreach (var substation in parts.Substations)
        {
            var root = disjoint.FindSet(substation.BusNode);
            if (busOf.TryGetValue(root, out var other))
            {
                log.Error("substation", substation.Id.Value, "busNode",
                    $"is connected to the bus of substation {other} in the normal state; each node must be fed from exactly one bus (open a tie between them)");
            }
            else
            {
                busOf[root] = substation.Id;
            }
        }

        var unfed = parts.Nodes.Where(n => !busOf.ContainsKey(disjoint.FindSet(n.Id))).Select(n => n.Id.Value).ToList();
        if (unfed.Count > 0)
        {
            log.Warning("grid", "file", "nodes",
                $"{unfed.Count} node(s) are reached from no substation bus in the normal state: {string.Join(", ", unfed.Take(20))}{(unfed.Count > 20 ? ", ..." : string.Empty)}");
        }
    }

    private static IEnumerable<string> PathBetween(UndirectedGraph<NodeId, TaggedEdge<NodeId, string>> forest, NodeId from, NodeId to)
    {
        var tryGetPath = forest.ShortestPathsDijkstra(_ => 1.0, from);
        return tryGetPath(to, out var path) ? path.Select(e => e.Tag) : [];
    }
}
