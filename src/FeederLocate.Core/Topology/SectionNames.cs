using System.Collections.Frozen;
using FeederLocate.Core.Model;

namespace FeederLocate.Core.Topology;

/// <summary>
/// Names sections the way an operator names a stretch of line: by its feeder and the devices that bound
/// it, from the supply side onward ("A1: LB-A1-1 → DS-A1-2, NO-A1-B1"). The ids stay the key everywhere;
/// these names are for people.
/// </summary>
public sealed class SectionNames
{
    /// <summary>How many far-side devices a name lists before it says how many more there are.</summary>
    public const int DevicesListed = 3;

    private readonly FrozenDictionary<SectionId, string> _names;

    private SectionNames(FrozenDictionary<SectionId, string> names) => _names = names;

    /// <summary>The name of a section; its id when the grid has no such section.</summary>
    public string this[SectionId id] => _names.GetValueOrDefault(id) ?? id.Value;

    public IReadOnlyDictionary<SectionId, string> All => _names;

    public static SectionNames Build(NetworkGraph graph, FeederMap feeders)
    {
        ArgumentNullException.ThrowIfNull(graph);
        ArgumentNullException.ThrowIfNull(feeders);
        var grid = graph.Grid;
        var names = new Dictionary<SectionId, string>();
        foreach (var section in graph.Sections.All)
        {
            names[section.Id] = Name(grid, feeders, section);
        }

        return new SectionNames(names.ToFrozenDictionary());
    }

    private static string Name(Grid grid, FeederMap feeders, Section section)
    {
        var normal = feeders.Normal;
        var members = section.Nodes.Select(grid.NodeIndex).ToHashSet();

        // The supply side: the edge feeding the section's first node in the normal state.
        string? supply = null;
        string? feeder = null;
        if (normal is not null)
        {
            foreach (var v in members)
            {
                var parent = normal.ParentOf(v);
                if (normal.IsEnergised(v) && (parent < 0 || !members.Contains(parent)))
                {
                    var edge = normal.FeedingEdgeOf(v);
                    supply = parent < 0
                        ? grid.Substations[normal.SubstationIndexOf(v)].Id.Value
                        : edge.Kind == EdgeKind.Switch ? grid.Switches[edge.Index].Id.Value : grid.Segments[edge.Index].Id.Value;
                    feeder = feeders.FeederOf(v) is var f and >= 0 ? feeders.All[f].Name
                        : grid.Substations[normal.SubstationIndexOf(v)].Id.Value;
                    break;
                }
            }
        }

        // Closed far-side devices first, then ties; each in the grid's order.
        var far = section.BoundarySwitches
            .Where(s => s.Value != supply)
            .Select(s => grid.Switch(s))
            .OrderBy(s => s.NormallyOpen)
            .ThenBy(s => grid.SwitchIndex(s.Id))
            .Select(s => s.Id.Value)
            .ToList();
        var ends = far.Count == 0 ? "end"
            : far.Count <= DevicesListed ? string.Join(", ", far)
            : $"{string.Join(", ", far.Take(DevicesListed - 1))} +{far.Count - (DevicesListed - 1)} more";

        return supply is null
            ? $"unfed: {ends}"
            : $"{feeder}: {supply} → {ends}";
    }
}
