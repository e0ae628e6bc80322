using System.Collections.Frozen;
using FeederLocate.Core.Model;

namespace FeederLocate.Core.Topology;

/// <summary>
/// Names segments for people by the section they lie in: the section's name alone for a section of one
/// segment, else with the segment's place in it counted from the supply side in the normal state
/// ("A1: LB-A1-1 → DS-A1-2, part 2 of 3"). The ids stay the key everywhere; these names are for people.
/// </summary>
public sealed class SegmentNames
{
    private readonly FrozenDictionary<SegmentId, string> _names;

    private SegmentNames(FrozenDictionary<SegmentId, string> names) => _names = names;

    /// <summary>The name of a segment; its id when the grid has no such segment.</summary>
    public string this[SegmentId id] => _names.GetValueOrDefault(id) ?? id.Value;

    public IReadOnlyDictionary<SegmentId, string> All => _names;

    public static SegmentNames Build(NetworkGraph graph, FeederMap feeders, SectionNames sections)
    {
        ArgumentNullException.ThrowIfNull(graph);
        ArgumentNullException.ThrowIfNull(feeders);
        ArgumentNullException.ThrowIfNull(sections);
        var grid = graph.Grid;
        var normal = feeders.Normal;
        var names = new Dictionary<SegmentId, string>();
        foreach (var section in graph.Sections.All)
        {
            var name = sections[section.Id];
            if (section.Segments.Length == 1)
            {
                names[section.Segments[0]] = name;
                continue;
            }

            var members = section.Nodes.Select(grid.NodeIndex).ToHashSet();

            // Steps from the section's supplied end to the segment's far end along the normal feeding tree.
            int Depth(SegmentId id)
            {
                var index = grid.SegmentIndex(id);
                if (normal is null || !normal.IsSegmentEnergised(index))
                {
                    return int.MaxValue;
                }

                var depth = 0;
                for (var v = normal.FarEndOf(index); v >= 0 && members.Contains(v); v = normal.ParentOf(v))
                {
                    depth++;
                }

                return depth;
            }

            var ordered = section.Segments
                .Select(id => (Id: id, Depth: Depth(id), Index: grid.SegmentIndex(id)))
                .OrderBy(s => s.Depth)
                .ThenBy(s => s.Index)
                .ToList();
            for (var k = 0; k < ordered.Count; k++)
            {
                names[ordered[k].Id] = $"{name}, part {k + 1} of {ordered.Count}";
            }
        }

        return new SegmentNames(names.ToFrozenDictionary());
    }
}
