using System.Collections.Immutable;
using FeederLocate.Core.Model;

namespace FeederLocate.Core.Switching;

/// <summary>
/// A zone: the nodes joined by segments without crossing a switch. Every node is in one zone; a zone
/// with segments is a section, one without (a busbar, a node between two switches) has none.
/// </summary>
internal sealed record Zone(
    int Index,
    ImmutableArray<int> Nodes,
    ImmutableArray<int> Segments,
    ImmutableArray<int> Switches,
    int Customers,
    SectionId? Section);
