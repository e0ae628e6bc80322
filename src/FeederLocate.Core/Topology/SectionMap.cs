using System.Collections.Immutable;
using FeederLocate.Core.Model;
using QuikGraph;
using QuikGraph.Algorithms;

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

    internal static SectionMap Build(Grid grid, UndirectedGraph<int, TaggedEdge<int, EdgeRef>> network)
    {
        // Sections are the connected components of the graph with only its segment edges.
        var segmentsOnly = new UndirectedGraph<int, TaggedEdge<int, EdgeRef>>(allowParallelEdges: true);
        segmentsOnly.AddVertexRange(network.Vertices);
        segmentsOnly.AddEdgeRange(network.Edges.Where(e => e.Tag.Kind == EdgeKind.Segment));
        var componentOfNode = new Dictionary<int, int>();
        segmentsOnly.ConnectedComponents(componentOfNode);

        // Number sections in grid order of their first segment, so ids and order are stable.
        var sectionOfComponent = new Dictionary<int, int>();
        var sectionOfSegment = new int[grid.Segments.Length];
        var members = new List<List<int>>();
        for (var i = 0; i < grid.Segments.Length; i++)
        {
            var component = componentOfNode[grid.NodeIndex(grid.Segments[i].From)];
            if (!sectionOfComponent.TryGetValue(component, out var section))
            {
                section = members.Count;
                sectionOfComponent[component] = section;
                members.Add([]);
            }

            sectionOfSegment[i] = section;
            members[section].Add(i);
        }

        var sections = members.Select(segmentIndices =>
        {
            var nodes = segmentIndices
                .SelectMany(i => new[] { grid.Segments[i].From, grid.Segments[i].To })
                .Distinct()
                .ToHashSet();
            var boundary = grid.Switches.Where(s => nodes.Contains(s.From) || nodes.Contains(s.To)).Select(s => s.Id);
            var first = grid.Segments[segmentIndices[0]];
            return new Section(
                new SectionId($"SEC-{first.Id}"),
                [.. segmentIndices.Select(i => grid.Segments[i].Id)],
                [.. grid.Nodes.Select(n => n.Id).Where(nodes.Contains)],
                [.. boundary],
                segmentIndices.Sum(i => grid.Segments[i].LengthKm));
        });
        return new SectionMap([.. sections], sectionOfSegment);
    }
}
