using FeederLocate.Core.Model;

namespace FeederLocate.Core.Evidence;

/// <summary>How an auto-reclose sequence ended.</summary>
public enum ReclosingResult
{
    /// <summary>The fault persisted; the device locked out open.</summary>
    Lockout,

    /// <summary>A reclosure held: the fault was transient.</summary>
    Success,
}

/// <summary>The auto-reclose sequence of the tripped breaker or recloser.</summary>
/// <param name="Attempts">Reclosures made, 0 to 4.</param>
public sealed record Reclosing(SwitchId Device, int Attempts, ReclosingResult Result)
{
    /// <summary>The most reclosures a sequence may report (common practice: up to four shots).</summary>
    public const int MaximumAttempts = 4;

    /// <summary>True where a reclosure held, so the fault was transient.</summary>
    public bool Transient => Result == ReclosingResult.Success;
}

/// <summary>What the crew or the telecontrol found of a fuse.</summary>
public enum FuseCondition
{
    /// <summary>The fuse operated: it cleared a fault beyond it.</summary>
    Blown,

    /// <summary>The fuse is whole.</summary>
    Intact,
}

/// <summary>Where a directional or wattmetric earth-fault element pointed.</summary>
public enum EarthFaultDirection
{
    /// <summary>The fault is on this device's feeder (beyond the device).</summary>
    Forward,

    /// <summary>The element picked up toward the bus: the fault is elsewhere on the galvanically connected network.</summary>
    Reverse,

    /// <summary>The element did not pick up.</summary>
    None,
}

/// <summary>Results of the relay at a feeder breaker or recloser.</summary>
/// <param name="EarthFaultDirection">Directional or wattmetric earth-fault element; null where not reported.</param>
/// <param name="FaultReactanceOhm">
/// Fault locator: positive-sequence reactance of the lines from this device to the fault, Ω, the source
/// excluded; null where not reported. Must be ≥ 0.
/// </param>
public sealed record RelayResult(SwitchId Device, EarthFaultDirection? EarthFaultDirection, double? FaultReactanceOhm = null);
