namespace FeederLocate.Core.Model;

/// <summary>How the MV neutral of a substation is connected to earth.</summary>
public enum GroundingScheme
{
    Isolated,
    Resonant,
    Solid,
    Impedance,
}

/// <summary>
/// Neutral grounding of a substation. Parameters that do not apply to the scheme are 0.
/// </summary>
/// <param name="DetuningPercent">Resonant: v = (I_L − I_C)/I_C in percent; positive is overcompensated.</param>
/// <param name="DampingPercent">Isolated and resonant: active residual current as percent of I_C.</param>
/// <param name="NeutralResistanceOhm">Impedance: resistor in the transformer neutral.</param>
/// <param name="NeutralReactanceOhm">Impedance: optional reactor part of the neutral impedance.</param>
public sealed record Grounding(
    GroundingScheme Scheme,
    double DetuningPercent = 0,
    double DampingPercent = 0,
    double NeutralResistanceOhm = 0,
    double NeutralReactanceOhm = 0);
