using System.Numerics;
using FeederLocate.Core.Model;

namespace FeederLocate.Core.Electrical;

/// <summary>
/// Zero-sequence shunt admittances per phase, S: the network's capacitance with its damping, and the
/// neutral's path to earth for each grounding scheme (reference model, shared DOMAIN notes).
/// </summary>
public static class NeutralAdmittance
{
    /// <summary>
    /// Admittance of capacitance <paramref name="capacitanceF"/> with damping d: (jω + d·ω)·C, S.
    /// </summary>
    public static Complex OfCapacitance(double capacitanceF, double angularFrequencyRadPerS, double dampingPercent) =>
        new Complex(dampingPercent / 100 * angularFrequencyRadPerS, angularFrequencyRadPerS) * capacitanceF;

    /// <summary>
    /// YN, the neutral's admittance in the zero-sequence circuit, S: 0 (isolated),
    /// −j(1 + v)·ω·C0total (resonant, v the detuning), 1/(Z0T + 3·(RN + j·XN)) (impedance), 1/Z0T (solid).
    /// Z0T is corrected by KT where the supply is given as upstream network and transformer (IEC 60909-0
    /// §6.3.3); 3·ZN is never corrected.
    /// </summary>
    public static Complex OfNeutral(Substation substation, double totalCapacitanceF, double angularFrequencyRadPerS)
    {
        ArgumentNullException.ThrowIfNull(substation);
        var g = substation.Grounding;
        var z0T = SourceImpedance.TransformerZeroSequenceOhm(substation);
        return g.Scheme switch
        {
            GroundingScheme.Isolated => Complex.Zero,
            GroundingScheme.Resonant => new Complex(0, -(1 + (g.DetuningPercent / 100)) * angularFrequencyRadPerS * totalCapacitanceF),
            GroundingScheme.Impedance => 1 / (z0T + (3 * new Complex(g.NeutralResistanceOhm, g.NeutralReactanceOhm))),
            GroundingScheme.Solid => 1 / z0T,
            _ => throw new ArgumentOutOfRangeException(nameof(substation), g.Scheme, "unknown grounding scheme"),
        };
    }

    /// <summary>Y0bus = (jω + d·ω)·C0total + YN: everything in the zero-sequence circuit behind the bus, S.</summary>
    public static Complex AtBus(Substation substation, double totalCapacitanceF, double angularFrequencyRadPerS)
    {
        ArgumentNullException.ThrowIfNull(substation);
        return OfCapacitance(totalCapacitanceF, angularFrequencyRadPerS, substation.Grounding.DampingPercent)
            + OfNeutral(substation, totalCapacitanceF, angularFrequencyRadPerS);
    }
}
