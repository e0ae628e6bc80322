using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;

namespace FeederLocate.Web.Components.OneLine;

/// <summary>What the diagram shows on top of the drawing: switch positions, live parts, indications, suspicion.</summary>
public sealed record DiagramState(
    IReadOnlySet<SwitchId> ClosedSwitches,
    IReadOnlySet<SegmentId> LiveSegments,
    IReadOnlyDictionary<IndicatorId, DiagramIndication> Indications,
    IReadOnlyDictionary<SectionId, double> SectionProbability,
    IReadOnlySet<SectionId> IsolatedSections)
{
    public static DiagramState Empty { get; } = new(
        new HashSet<SwitchId>(), new HashSet<SegmentId>(), new Dictionary<IndicatorId, DiagramIndication>(),
        new Dictionary<SectionId, double>(), new HashSet<SectionId>());
}

/// <summary>An indicator's entered state as the diagram shows it.</summary>
public sealed record DiagramIndication(IndicatorState State, bool Distrusted);
