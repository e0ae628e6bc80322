namespace FeederLocate.Core.Model;

public enum SwitchKind
{
    Breaker,
    Recloser,
    LoadBreakSwitch,
    Disconnector,
    Fuse,
}

/// <summary>A switching device between two nodes. It has no impedance.</summary>
/// <param name="NormallyOpen">True marks a tie point, open in the normal state.</param>
/// <param name="Remote">Operable from the control room.</param>
/// <param name="TravelMinutes">Time for a crew to reach it, for manual devices.</param>
/// <param name="RatedCurrentA">Fuses only: rated current of the fuse link, A; null where not given.</param>
public sealed record SwitchingDevice(
    SwitchId Id,
    NodeId From,
    NodeId To,
    SwitchKind Kind,
    bool NormallyOpen,
    bool Remote,
    double? TravelMinutes = null,
    double? RatedCurrentA = null)
{
    /// <summary>True where the device is open in the normal state.</summary>
    public bool IsTie => NormallyOpen;

    /// <summary>The end other than <paramref name="node"/>.</summary>
    public NodeId OtherEnd(NodeId node) => node == From ? To : From;
}
