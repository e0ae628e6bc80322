using System.Collections.Immutable;
using FeederLocate.Core.Model;

namespace FeederLocate.Core.Topology;

/// <summary>
/// A section: a maximal set of segments connected without crossing a switch, whatever the switch
/// states. What switching can isolate; bounded by <see cref="BoundarySwitches"/>.
/// </summary>
public sealed record Section(
    SectionId Id,
    ImmutableArray<SegmentId> Segments,
    ImmutableArray<NodeId> Nodes,
    ImmutableArray<SwitchId> BoundarySwitches,
    double LengthKm);

/// <summary>The sections of a grid and which section each segment belongs to.</summary>
public sealed class SectionMap
{
    private readonly int[] _sectionOfSegment;
    private readonly Dictionary<SectionId, int> _index;

    private SectionMap(ImmutableArray<Section> sections, int[] sectionOfSegment)
    {
        All = sections;
        _sectionOfSegment = sectionOfSegment;
        _index = sections.Select((s, i) => (s.Id, i)).ToDictionary(p => p.Id, p => p.i);
    }

    public ImmutableArray<Section> All { get; }

    public Section OfSegment(int segmentIndex) => All[_sectionOfSegment[segmentIndex]];

    public int IndexOfSegment(int segmentIndex) => _sectionOfSegment[segmentIndex];

    public Section this[SectionId id] => All[_index[id]];

    public bool Contains(SectionId id) => _index.ContainsKey(id);

    internal static SectionMap Build(Grid grid, NodePartition switchFreeParts)
    {
        // Sections are the parts of the graph with only its segment edges that hold a segment.
        // Number sections in grid order of their first segment, so ids and order are stable.
        var sectionOfComponent = new Dictionary<int, int>();
        var sectionOfSegment = new int[grid.Segments.Length];
        var members = new List<List<int>>();
        for (var i = 0; i < grid.Segments.Length; i++)
        {
            var component = switchFreeParts.PartOf(grid.NodeIndex(grid.Segments[i].From));
            if (!sectionOfComponent.TryGetValue(component, out var section))
            {
                section = members.Count;
                sectionOfComponent[component] = section;
                members.Add([]);
            }

            sectionOfSegment[i] = section;
            members[section].Add(i);
        }

        // One pass over nodes and one over switches: each node belongs to at most one section.
        var sectionOfNode = new int[grid.Nodes.Length];
        Array.Fill(sectionOfNode, -1);
        foreach (var segment in grid.Segments)
        {
            var section = sectionOfSegment[grid.SegmentIndex(segment.Id)];
            sectionOfNode[grid.NodeIndex(segment.From)] = section;
            sectionOfNode[grid.NodeIndex(segment.To)] = section;
        }

        var nodesOf = members.Select(_ => new List<NodeId>()).ToList();
        for (var v = 0; v < grid.Nodes.Length; v++)
        {
            if (sectionOfNode[v] >= 0)
            {
                nodesOf[sectionOfNode[v]].Add(grid.Nodes[v].Id);
            }
        }

        var boundaryOf = members.Select(_ => new List<SwitchId>()).ToList();
        foreach (var device in grid.Switches)
        {
            var a = sectionOfNode[grid.NodeIndex(device.From)];
            var b = sectionOfNode[grid.NodeIndex(device.To)];
            if (a >= 0)
            {
                boundaryOf[a].Add(device.Id);
            }

            if (b >= 0 && b != a)
            {
                boundaryOf[b].Add(device.Id);
            }
        }

        var sections = members.Select((segmentIndices, k) => new Section(
            new SectionId($"SEC-{grid.Segments[segmentIndices[0]].Id}"),
            [.. segmentIndices.Select(i => grid.Segments[i].Id)],
            [.. nodesOf[k]],
            [.. boundaryOf[k]],
            segmentIndices.Sum(i => grid.Segments[i].LengthKm)));
        return new SectionMap([.. sections], sectionOfSegment);
    }
}
