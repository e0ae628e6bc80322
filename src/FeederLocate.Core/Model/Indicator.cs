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
    double? ResetMinutes = null);
