using FeederLocate.Core.Model;

namespace FeederLocate.Core.Switching;

/// <summary>
/// The load flow of the plan's final state with the cold-load factor applied.
/// </summary>
/// <param name="MinimumVoltagePu">Lowest live node voltage, pu of nominal.</param>
/// <param name="MinimumVoltageNode">Where it occurs.</param>
/// <param name="MaximumLoadingPercent">Highest live segment current as percent of its ampacityA.</param>
/// <param name="MaximumLoadingSegment">Where it occurs; null when nothing is loaded.</param>
public sealed record FinalSupply(
    double MinimumVoltagePu,
    NodeId? MinimumVoltageNode,
    double MaximumLoadingPercent,
    SegmentId? MaximumLoadingSegment);
