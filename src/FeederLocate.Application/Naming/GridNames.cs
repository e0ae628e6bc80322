using System.Runtime.CompilerServices;
using FeederLocate.Core.Topology;

namespace FeederLocate.Application.Naming;

/// <summary>
/// The operators' names of a grid's sections and segments (by feeder and bounding devices), built once per grid
/// as read and kept while the grid is in use.
/// </summary>
public static class GridNames
{
    private static readonly ConditionalWeakTable<NetworkGraph, SectionNames> SectionTable = [];
    private static readonly ConditionalWeakTable<NetworkGraph, SegmentNames> SegmentTable = [];

    public static SectionNames Sections(NetworkGraph graph)
    {
        ArgumentNullException.ThrowIfNull(graph);
        return SectionTable.GetValue(graph, g => SectionNames.Build(g, FeederMap.Build(g)));
    }

    public static SegmentNames Segments(NetworkGraph graph)
    {
        ArgumentNullException.ThrowIfNull(graph);
        return SegmentTable.GetValue(graph, g => SegmentNames.Build(g, FeederMap.Build(g), Sections(g)));
    }
}
