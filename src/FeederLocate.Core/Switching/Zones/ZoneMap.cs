using System.Collections.Immutable;
using FeederLocate.Core.Model;
using FeederLocate.Core.Topology;

namespace FeederLocate.Core.Switching;

/// <summary>The zones of a grid and the switches between them: the graph switching acts on.</summary>
internal sealed class ZoneMap
{
    private readonly int[] _zoneOfNode;
    private readonly Dictionary<SectionId, int> _zoneOfSection;

    public ZoneMap(NetworkGraph graph)
    {
        var grid = graph.Grid;
        // Zones are the parts connected without crossing a switch, numbered by their lowest node.
        var parts = graph.SwitchFreeParts;
        _zoneOfNode = [.. Enumerable.Range(0, grid.Nodes.Length).Select(parts.PartOf)];
        var nodes = parts.Parts;
        var segments = nodes.Select(_ => new List<int>()).ToList();
        for (var i = 0; i < grid.Segments.Length; i++)
        {
            segments[_zoneOfNode[grid.NodeIndex(grid.Segments[i].From)]].Add(i);
        }

        var switches = nodes.Select(_ => new List<int>()).ToList();
        for (var i = 0; i < grid.Switches.Length; i++)
        {
            var a = _zoneOfNode[grid.NodeIndex(grid.Switches[i].From)];
            var b = _zoneOfNode[grid.NodeIndex(grid.Switches[i].To)];
            switches[a].Add(i);
            if (b != a)
            {
                switches[b].Add(i);
            }
        }

        All = [.. nodes.Select((members, z) => new Zone(
            z,
            [.. members],
            [.. segments[z]],
            [.. switches[z]],
            members.Sum(v => grid.Nodes[v].Customers),
            segments[z].Count > 0 ? graph.Sections.OfSegment(segments[z][0]).Id : null))];
        _zoneOfSection = All.Where(z => z.Section is not null).ToDictionary(z => z.Section!.Value, z => z.Index);
        Grid = grid;
    }

    public Grid Grid { get; }

    public ImmutableArray<Zone> All { get; }

    public int ZoneOfNode(int node) => _zoneOfNode[node];

    public bool TryZoneOf(SectionId section, out int zone) => _zoneOfSection.TryGetValue(section, out zone);

    /// <summary>The zone at the other end of switch <paramref name="device"/> from <paramref name="zone"/>.</summary>
    public int Across(int device, int zone)
    {
        var s = Grid.Switches[device];
        var a = _zoneOfNode[Grid.NodeIndex(s.From)];
        return a == zone ? _zoneOfNode[Grid.NodeIndex(s.To)] : a;
    }

    /// <summary>The node of switch <paramref name="device"/> that lies in <paramref name="zone"/>.</summary>
    public int NodeIn(int device, int zone)
    {
        var s = Grid.Switches[device];
        var from = Grid.NodeIndex(s.From);
        return _zoneOfNode[from] == zone ? from : Grid.NodeIndex(s.To);
    }
}
