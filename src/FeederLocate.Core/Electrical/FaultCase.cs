using System.Collections.Immutable;
using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;

namespace FeederLocate.Core.Electrical;

/// <summary>
/// A fault to compute: segment, position as the fraction of its length from its <c>from</c> node
/// (0 to 1), type, fault resistance Rf (Ω, ≥ 0) and voltage factor c (IEC 60909-0; 1.1 = cmax for MV).
/// </summary>
public sealed record FaultCase(
    SegmentId Segment,
    double Position,
    FaultType Type,
    double FaultResistanceOhm = 0,
    double VoltageFactor = SourceImpedance.VoltageFactorMaxMediumVoltage);

/// <summary>What one indicator sees for a fault, and the state it is expected to report.</summary>
/// <param name="PhaseCurrentA">Fault current in its phases when it lies on the path to the fault, else 0 (load ignored).</param>
/// <param name="ResidualCurrentA">|3I0| through it; its sign convention is the forward direction.</param>
/// <param name="FaultBeyond">True when the fault lies on its forward side.</param>
public sealed record IndicatorResponse(
    IndicatorId Id,
    double PhaseCurrentA,
    double ResidualCurrentA,
    bool FaultBeyond,
    IndicatorState Expected);

/// <summary>The result of a fault computation with the reference model.</summary>
/// <param name="FaultCurrentA">To earth for LG and LLG, the faulted-phase current for LL and LLL.</param>
/// <param name="FaultedPhaseCurrentA">Largest faulted-phase current on the path from the source.</param>
/// <param name="NeutralVoltageV">|U0| at the bus; 0 for LL and LLL.</param>
/// <param name="HealthyPhaseVoltagesV">At the fault point: |Ub|, |Uc| for LG; |Ua| for LLG; empty for LL and LLL.</param>
public sealed record FaultResult(
    FaultCase Case,
    SubstationId Substation,
    double FaultCurrentA,
    double FaultedPhaseCurrentA,
    double NeutralVoltageV,
    ImmutableArray<double> HealthyPhaseVoltagesV,
    ImmutableArray<IndicatorResponse> Indicators);

/// <summary>Thrown when a fault is asked for where the model cannot place it (a dead segment).</summary>
public sealed class FaultCaseException(string message, SegmentId segment) : Exception(message)
{
    public SegmentId Segment { get; } = segment;
}
