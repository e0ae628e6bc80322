using System.Numerics;

namespace FeederLocate.Core.Tests.ReferenceCases;

/// <summary>
/// A small case to check by hand next to the IEC 60909-0 substation: a 20 kV busbar with S"k 250 MVA,
/// R/X 0.1, solidly grounded through Z0T = 0.15 + j1.9 Ω, and one 3 km cable of 0.206 + j0.116 Ω/km
/// (r0 + j·x0 = 0.82 + j0.40 Ω/km, no capacitance). Formulas: IEC 60909-0 network feeder (6.2, from memory) and the
/// symmetrical-component fault connections with Z2 = Z1; the numbers are worked by hand (derived).
/// <code>
/// c = 1.1, E = 1.1·20 kV/√3 = 12 701.7 V
/// |ZQ| = c·Un²/S"k = 1.1·400/250 = 1.76 Ω; XQ = 1.76/√1.01 = 1.75127 Ω; RQ = 0.17513 Ω
/// Z1F = ZQ + 3·(0.206 + j0.116) = 0.79313 + j2.09927 Ω, |Z1F| = 2.24410 Ω
/// Z0F = Z0T + 3·(0.82 + j0.40) = 2.61 + j3.10 Ω
/// I"k3 = E/|Z1F| = 5660.1 A
/// I"k2 = √3·E/|2·Z1F| = √3/2·I"k3 = 4901.8 A
/// I"k1 = 3·E/|2·Z1F + Z0F| = 3·12 701.7/|4.19625 + j7.29853| = 38 105.1/8.41885 = 4526.2 A
/// LLG to earth: |3I0| = 3·E/|Z1F + 2·Z0F| = 38 105.1/|6.01313 + j8.29927| = 3718.1 A
/// </code>
/// </summary>
public static class HandWorkedMvFeeder
{
    public const double CableLengthKm = 3;

    public const double ThreePhaseCurrentA = 5660.1;

    public const double TwoPhaseCurrentA = 4901.8;

    public const double SinglePhaseCurrentA = 4526.2;

    public const double TwoPhaseToEarthEarthCurrentA = 3718.1;

    /// <summary>Worked to 0.1 A; ±0.05 A rounding plus the hand working's own rounding.</summary>
    public const double ToleranceA = 0.2;

    /// <summary>Z1F at the cable end, Ω (hand working above).</summary>
    public static readonly Complex PositiveSequenceAtEndOhm = new(0.79313, 2.09927);

    /// <summary>Z0F at the cable end, Ω (hand working above).</summary>
    public static readonly Complex ZeroSequenceAtEndOhm = new(2.61, 3.10);

    public const string GridJson = """
        {
          "format": "feederlocate-grid/1",
          "name": "Hand-worked 20 kV feeder",
          "frequencyHz": 50,
          "lineTypes": [
            { "id": "CAB", "construction": "cable", "r1OhmPerKm": 0.206, "x1OhmPerKm": 0.116,
              "r0OhmPerKm": 0.82, "x0OhmPerKm": 0.40, "c0NfPerKm": 0, "ampacityA": 320 }
          ],
          "substations": [{
            "id": "SUB", "busNode": "BUS", "nominalVoltageKv": 20, "shortCircuitMva": 250, "rOverX": 0.1,
            "transformerZ0Ohm": { "r": 0.15, "x": 1.9 },
            "grounding": { "scheme": "solid" }
          }],
          "nodes": [ { "id": "BUS" }, { "id": "N1" }, { "id": "N2" } ],
          "segments": [ { "id": "S1", "from": "N1", "to": "N2", "lineType": "CAB", "lengthKm": 3 } ],
          "switches": [ { "id": "CB1", "from": "BUS", "to": "N1", "kind": "breaker", "normallyOpen": false, "remote": true } ],
          "indicators": [ { "id": "FI1", "segment": "S1", "node": "N1", "phasePickupA": 400, "earthPickupA": 20, "directional": false, "remote": true } ]
        }
        """;
}
