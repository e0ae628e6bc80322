using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;

namespace FeederLocate.Core.Electrical;

/// <summary>
/// A place where current is measured, compiled for one energised network: the network on its forward
/// side is the part fed through <see cref="FarNode"/> (looking away from the source) or everything else
/// (looking toward it), plus <see cref="SelfSegment"/>. The gains give |3I0| per volt of |U0bus| with
/// the fault beyond it or not: 3·|Y0B − Y0bus| and 3·|Y0B|, Y0B the admittance on the forward side.
/// <see cref="Substation"/> is −1 where the point is dead. Pickups are NaN where the element is absent.
/// </summary>
internal readonly record struct MeasuringPoint(
    int Substation,
    int FarNode,
    bool AwayFromSource,
    int SelfSegment,
    double NotBeyondGainS,
    double BeyondGainS,
    double PhasePickupA,
    double EarthPickupA,
    bool Directional)
{
    /// <summary>True where a fault beyond the point drives the faulted-phase current through it.</summary>
    public bool OnPath(bool faultBeyond) => AwayFromSource ? faultBeyond : !faultBeyond;

    /// <summary>The indicator's state for the currents through it (<see cref="Indicator.ExpectedState(double, double, bool)"/>).</summary>
    public IndicatorState ExpectedState(double phaseCurrentA, double residualCurrentA, bool faultBeyond) =>
        Indicator.ExpectedState(PhasePickupA, EarthPickupA, Directional, phaseCurrentA, residualCurrentA, faultBeyond);

    /// <summary>What the indicator reports once picked up (<see cref="Indicator.PickedUpState(bool)"/>).</summary>
    public IndicatorState PickedUpState(bool faultBeyond) => Indicator.PickedUpState(Directional, faultBeyond);
}
