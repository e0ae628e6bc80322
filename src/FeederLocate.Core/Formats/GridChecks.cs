using FeederLocate.Core.Model;
using FeederLocate.Core.Topology;

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
        UniqueIds(parts.CrewBases, "crewBase", b => b.Id.Value, log);

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

        var switches = parts.Switches.GroupBy(s => s.Id).ToDictionary(g => g.Key, g => g.First());
        foreach (var crewBase in parts.CrewBases)
        {
            NodeExists(nodes, "crewBase", crewBase.Id.Value, "node", crewBase.Node, log);
            foreach (var device in (crewBase.TravelTimes?.Keys ?? []).OrderBy(d => d.Value, StringComparer.Ordinal))
            {
                if (!switches.TryGetValue(device, out var known))
                {
                    log.Error("crewBase", crewBase.Id.Value, "travelMinutes", $"refers to unknown switch \"{device}\"");
                }
                else if (known.Remote)
                {
                    log.Warning("crewBase", crewBase.Id.Value, "travelMinutes", $"gives a time to {device}, which is remote: no crew is sent to it");
                }
            }
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
    /// no bus are warned about. A loop is reported with the elements on it. Runs on a grid whose
    /// elements passed <see cref="Run"/>.
    /// </summary>
    public static void NormalTopology(Grid grid, IssueLog log)
    {
        if (grid.Nodes.IsEmpty)
        {
            log.Warning("grid", grid.Name, "nodes", "is empty: there is nothing to locate a fault on, and the one-line view has nothing to draw");
        }

        var graph = new NetworkGraph(grid);
        var check = RadialCheck.Of(graph, SwitchStates.Normal(grid));
        foreach (var loop in check.Loops)
        {
            var elements = string.Join(", ", loop.Path.Append(loop.Closing).Select(graph.Describe));
            log.Error(NetworkGraph.KindName(loop.Closing), graph.IdOf(loop.Closing), string.Empty,
                $"closes a loop in the normal state (every normally-open switch open); the loop is: {elements}");
        }

        foreach (var paralleling in check.Parallelings)
        {
            log.Error("substation", grid.Substations[paralleling.Second].Id.Value, "busNode",
                $"is connected to the bus of substation {grid.Substations[paralleling.First].Id} in the normal state; each node must be fed from exactly one bus (open a tie between them)");
        }

        var unfed = Enumerable.Range(0, grid.Nodes.Length).Where(v => !check.IsFed(v)).Select(v => grid.Nodes[v].Id.Value).ToList();
        if (unfed.Count > 0)
        {
            log.Warning("grid", "file", "nodes",
                $"{unfed.Count} node(s) are reached from no substation bus in the normal state: {string.Join(", ", unfed.Take(20))}{(unfed.Count > 20 ? ", ..." : string.Empty)}");
        }
    }
}
