using System.Globalization;
using System.Numerics;
using FeederLocate.Core.Model;

namespace FeederLocate.Core.Tests.ReferenceCases;

/// <summary>
/// A 20 kV substation, derived by hand from the formulas of IEC 60909-0 (network feeder 6.2,
/// transformer with KT 6.3.1 and 6.3.3; edition 2016 and clause numbers from memory), as in shared CHECK-VALUES.md:
/// 3000 MVA, R/X 0.1 at 110 kV; 40 MVA 110/21 kV, ukr 12 %, PkrT 160 kW; Un 20 kV, c = 1.1.
/// A worked example of the standard's formulas, not an independent source.
/// </summary>
public static class Iec60909Substation20kV
{
    public const double NominalVoltageKv = 20;

    public const double VoltageFactor = 1.10;

    /// <summary>KT = 0.95·1.1/(1 + 0.6·xT), xT = 0.11993 (derived).</summary>
    public const double CorrectionFactor = 0.97485;

    /// <summary>Zk = ZQ/tr² + KT·ZT at the 20 kV busbar, Ω (derived).</summary>
    public static readonly Complex ShortCircuitOhm = new(0.05908, 1.44990);

    /// <summary>
    /// The derived impedances are given to five decimals; the formulas give XK = 1.4499071 Ω against the
    /// stated 1.44990 Ω (the hand working rounded intermediate values), so one unit of the fifth decimal.
    /// </summary>
    public const double ImpedanceToleranceOhm = 0.00001;

    public const double CorrectionFactorTolerance = 0.000006;

    /// <summary>I"k3 = c·Un/(√3·|Zk|) (derived).</summary>
    public const double ThreePhaseCurrentA = 8753;

    /// <summary>I"k2 = c·Un/|2·Zk| = √3/2·I"k3 (derived).</summary>
    public const double TwoPhaseCurrentA = 7580;

    /// <summary>The currents are given to 1 A (four significant digits in kA): ±0.5 A rounding, 0.1 A for the inputs.</summary>
    public const double CurrentToleranceA = 0.6;

    /// <summary>The cable of the second case: 5 km of 0.206 + j0.116 Ω/km (Al 150 mm², r1 from IEC 60228).</summary>
    public const double CableLengthKm = 5;

    public const double CableR1OhmPerKm = 0.206;

    public const double CableX1OhmPerKm = 0.116;

    /// <summary>I"k3 at the end of the 5 km cable (derived).</summary>
    public const double ThreePhaseCurrentAtCableEndA = 5514;

    /// <summary>Neutral resistor for a 1000 A limit: 20 kV/(√3·1000 A) (derived).</summary>
    public const double NeutralResistanceOhm = 11.547;

    /// <summary>I"k1 = 3·E/|2·Zk + ZTK + 3·RN| with Z0T = ZTK (derived), c = 1.1.</summary>
    public const double SinglePhaseCurrentA = 1087;

    /// <summary>I"k1 is stated as ≈ 1087 A: ±0.5 A rounding, 0.1 A for the inputs.</summary>
    public const double SinglePhaseToleranceA = 0.6;

    public static UpstreamNetwork Upstream => new(NominalVoltageKv: 110, ShortCircuitMva: 3000, ROverX: 0.1);

    public static TransformerData Transformer => new(RatedMva: 40, HvKv: 110, MvKv: 21, UkrPercent: 12, PkrKw: 160);

    /// <summary>ZTK = KT·ZT on the 21 kV side (derived): 0.042991 + j1.289001 Ω; the zero-sequence impedance of the grounded case.</summary>
    public static readonly Complex CorrectedTransformerOhm = new(0.042991, 1.289001);

    /// <summary>
    /// ZT before correction, IEC 60909-0 eqs. (7)–(9): RT = 160 kW·(21 kV)²/(40 MVA)² = 0.0441 Ω,
    /// |ZT| = 0.12·(21 kV)²/40 MVA = 1.323 Ω, XT = √(1.323² − 0.0441²) = 1.322265 Ω (derived).
    /// </summary>
    public static readonly Complex UncorrectedTransformerOhm = new(0.0441, 1.322265);

    public static Substation Substation(Grounding grounding, ImpedanceOhm? transformerZ0Ohm = null) => new(
        new SubstationId("SUB"), new NodeId("BUS"), NominalVoltageKv, new UpstreamViaTransformer(Upstream, Transformer),
        transformerZ0Ohm, null, grounding);

    /// <summary>
    /// The substation as a grid file: the supply as upstream network and transformer, a breaker and one
    /// cable of <paramref name="cableLengthKm"/> without capacitance (so the zero-sequence shunt is the
    /// neutral alone). <paramref name="grounding"/> is the grounding object's JSON.
    /// </summary>
    public static string GridJson(double cableLengthKm, string grounding = """{ "scheme": "solid" }""")
    {
        var length = cableLengthKm.ToString(CultureInfo.InvariantCulture);
        // The transformer's zero-sequence impedance as a grid gives it: uncorrected, equal to ZT (the engine
        // applies KT to it, IEC 60909-0 §6.3.3).
        var r = UncorrectedTransformerOhm.Real.ToString(CultureInfo.InvariantCulture);
        var x = UncorrectedTransformerOhm.Imaginary.ToString(CultureInfo.InvariantCulture);
        return $$"""
            {
              "format": "feederlocate-grid/1",
              "name": "IEC 60909-0 derived 20 kV substation",
              "frequencyHz": 50,
              "lineTypes": [
                { "id": "CAB", "construction": "cable", "r1OhmPerKm": 0.206, "x1OhmPerKm": 0.116,
                  "r0OhmPerKm": 0.82, "x0OhmPerKm": 0.40, "c0NfPerKm": 0, "ampacityA": 320 }
              ],
              "substations": [{
                "id": "SUB", "busNode": "BUS", "nominalVoltageKv": 20,
                "upstream": { "nominalVoltageKv": 110, "shortCircuitMva": 3000, "rOverX": 0.1 },
                "transformer": { "ratedMva": 40, "hvKv": 110, "mvKv": 21, "ukrPercent": 12, "pkrKw": 160 },
                "transformerZ0Ohm": { "r": {{r}}, "x": {{x}} },
                "grounding": {{grounding}}
              }],
              "nodes": [ { "id": "BUS" }, { "id": "N1" }, { "id": "N2" } ],
              "segments": [ { "id": "S1", "from": "N1", "to": "N2", "lineType": "CAB", "lengthKm": {{length}} } ],
              "switches": [ { "id": "CB1", "from": "BUS", "to": "N1", "kind": "breaker", "normallyOpen": false, "remote": true } ],
              "indicators": [ { "id": "FI1", "segment": "S1", "node": "N1", "phasePickupA": 400, "directional": false, "remote": true } ]
            }
            """;
    }
}
