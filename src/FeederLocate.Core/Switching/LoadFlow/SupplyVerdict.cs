namespace FeederLocate.Core.Switching;

/// <summary>Whether a live network keeps every limit: ampacity, voltage, transformer rating.</summary>
/// <param name="Violation">The first limit broken, in words; null when every limit holds.</param>
/// <param name="MinimumVoltageNode">Node index of the lowest voltage, or -1.</param>
/// <param name="MaximumLoadingSegment">Segment index of the highest loading, or -1.</param>
internal sealed record SupplyVerdict(
    string? Violation,
    double MinimumVoltagePu,
    int MinimumVoltageNode,
    double MaximumLoadingPercent,
    int MaximumLoadingSegment)
{
    public bool Holds => Violation is null;
}
