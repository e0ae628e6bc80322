using FeederLocate.Core.Evidence;

namespace FeederLocate.Core.Model;

/// <summary>
/// A fault passage indicator installed on <see cref="Segment"/> at its end <see cref="Node"/>.
/// Its forward direction is from <see cref="Node"/> into <see cref="Segment"/>.
/// </summary>
/// <param name="PhasePickupA">Phase element pickup; null means no phase element.</param>
/// <param name="EarthPickupA">Residual (earth) element pickup on |3I0|; null means no earth element.</param>
/// <param name="Directional">True: reports forward or reverse, never fault.</param>
/// <param name="Remote">Reports over telecontrol; false means read in the field.</param>
/// <param name="ResetMinutes">How long a flag stays up after the fault; null means it stays until reset.</param>
public sealed record Indicator(
    IndicatorId Id,
    SegmentId Segment,
    NodeId Node,
    double? PhasePickupA,
    double? EarthPickupA,
    bool Directional,
    bool Remote,
    double? ResetMinutes = null)
{
    /// <summary>
    /// The state the indicator shows for the currents through it: it picks up when the phase current
    /// (A, faulted phase) reaches <see cref="PhasePickupA"/> or |3I0| (A) reaches <see cref="EarthPickupA"/>;
    /// then see <see cref="PickedUpState(bool)"/>. An absent element never picks up.
    /// </summary>
    /// <param name="faultForward">True when the fault lies on the indicator's forward side.</param>
    public IndicatorState ExpectedState(double phaseCurrentA, double residualCurrentA, bool faultForward) =>
        ExpectedState(PhasePickupA ?? double.NaN, EarthPickupA ?? double.NaN, Directional, phaseCurrentA, residualCurrentA, faultForward);

    /// <summary>
    /// What a picked-up indicator reports: a directional one forward or reverse by the side the fault
    /// lies on, a non-directional one fault (common practice for fault passage indicators).
    /// </summary>
    public IndicatorState PickedUpState(bool faultForward) => PickedUpState(Directional, faultForward);

    /// <summary>The rule of <see cref="ExpectedState(double, double, bool)"/> on compiled pickups (NaN: element absent).</summary>
    internal static IndicatorState ExpectedState(
        double phasePickupA, double earthPickupA, bool directional, double phaseCurrentA, double residualCurrentA, bool faultForward) =>
        phaseCurrentA >= phasePickupA || residualCurrentA >= earthPickupA ? PickedUpState(directional, faultForward) : IndicatorState.None;

    internal static IndicatorState PickedUpState(bool directional, bool faultForward) =>
        !directional ? IndicatorState.Fault
        : faultForward ? IndicatorState.Forward : IndicatorState.Reverse;
}
