using FeederLocate.Core.Evidence;
using Complex = System.Numerics.Complex;

namespace FeederLocate.Core.Electrical;

/// <summary>
/// Sequence currents into a fault (phase a the reference; LL and LLG involve b and c), A, and the
/// bus neutral displacement, V.
/// </summary>
public readonly record struct SequenceCurrents(Complex ZeroA, Complex PositiveA, Complex NegativeA, Complex NeutralVoltageAtBusV)
{
    /// <summary>Current to earth, 3·I0, A.</summary>
    public Complex EarthCurrentA => 3 * ZeroA;
}

/// <summary>
/// Solves the sequence networks at the fault point with the symmetrical-component connection for each
/// fault type (IEC 60909-0 clause 4 and the usual textbook connections; Z2 = Z1). The zero-sequence
/// shunt enters as an admittance so that an isolated network (Y0 → 0) and a solid one (Y0 large) are
/// both computed without dividing by zero.
/// </summary>
public static class SequenceFault
{
    /// <param name="phaseVoltageV">E = c·Un/√3, V (real reference phasor).</param>
    /// <param name="positiveSequenceOhm">Z1F: source plus series path to the fault, Ω.</param>
    /// <param name="zeroSequencePathOhm">Z0path: series zero-sequence path from the bus to the fault, Ω.</param>
    /// <param name="zeroSequenceBusAdmittanceS">Y0bus: shunt behind the bus (capacitance, damping, neutral), S.</param>
    /// <param name="faultResistanceOhm">Rf ≥ 0: to earth for LG and LLG, between phases for LL, per phase for LLL.</param>
    public static SequenceCurrents Solve(
        FaultType type,
        double phaseVoltageV,
        Complex positiveSequenceOhm,
        Complex zeroSequencePathOhm,
        Complex zeroSequenceBusAdmittanceS,
        double faultResistanceOhm)
    {
        if (faultResistanceOhm < 0)
        {
            throw new ArgumentOutOfRangeException(nameof(faultResistanceOhm), faultResistanceOhm, "must be >= 0");
        }
        var e = new Complex(phaseVoltageV, 0);
        var z1 = positiveSequenceOhm;
        var y0 = zeroSequenceBusAdmittanceS;
        var rf = faultResistanceOhm;
        switch (type)
        {
            case FaultType.LLL:
                return new SequenceCurrents(Complex.Zero, e / (z1 + rf), Complex.Zero, Complex.Zero);
            case FaultType.LL:
            {
                var i1 = e / ((2 * z1) + rf);
                return new SequenceCurrents(Complex.Zero, i1, -i1, Complex.Zero);
            }

            case FaultType.LG:
            {
                // I0 = E/(2·Z1F + Z0path + 1/Y0 + 3Rf), written as E·Y0/(1 + Y0·(2·Z1F + Z0path + 3Rf)).
                var d = 1 + (y0 * ((2 * z1) + zeroSequencePathOhm + (3 * rf)));
                var i0 = e * y0 / d;
                return new SequenceCurrents(i0, i0, i0, -e / d);
            }

            case FaultType.LLG:
            {
                // Z2 ∥ (Z0F + 3Rf) with Z0F = Z0path + 1/Y0, multiplied through by Y0.
                var wp = zeroSequencePathOhm + (3 * rf);
                var d = (y0 * (z1 + (2 * wp))) + 2;
                var i0 = -e * y0 / d;
                var i2 = -e * ((y0 * wp) + 1) / (z1 * d);
                return new SequenceCurrents(i0, -(i0 + i2), i2, e / d);
            }

            default:
                throw new ArgumentOutOfRangeException(nameof(type), type, "unknown fault type");
        }
    }

    /// <summary>The largest faulted-phase current magnitude, A.</summary>
    public static double FaultedPhaseCurrentA(FaultType type, SequenceCurrents currents)
    {
        var (a, b, c) = SymmetricalComponents.ToPhasesScalar(currents.ZeroA, currents.PositiveA, currents.NegativeA);
        return type switch
        {
            FaultType.LG => a.Magnitude,
            FaultType.LLL => currents.PositiveA.Magnitude,
            _ => Math.Max(b.Magnitude, c.Magnitude),
        };
    }

    /// <summary>The current reported as "fault current": to earth for LG and LLG, in the faulted phases otherwise, A.</summary>
    public static double FaultCurrentA(FaultType type, SequenceCurrents currents) => type switch
    {
        FaultType.LG or FaultType.LLG => currents.EarthCurrentA.Magnitude,
        _ => FaultedPhaseCurrentA(type, currents),
    };
}
