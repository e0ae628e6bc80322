using System.Globalization;
using FeederLocate.Core.Formats;
using FeederLocate.Core.Model;

namespace FeederLocate.Core.Tests.Switching;

/// <summary>
/// Small invented grids for the switching planner, written as grid files and read through the real reader.
/// Line data are the sample catalogue's typical 20 kV values (common practice).
/// </summary>
public static class SwitchingGrids
{
    /// <summary>
    /// A 20 kV bus, a breaker and one segment of <paramref name="resistanceOhm"/> + j<paramref name="reactanceOhm"/>
    /// (1 km of that per-km impedance) feeding one load of <paramref name="loadKw"/> + j<paramref name="loadKvar"/>.
    /// </summary>
    public static Grid TwoNode(double resistanceOhm, double reactanceOhm, double loadKw, double? loadKvar, double ampacityA = 400)
    {
        var kvar = loadKvar is { } q ? $", \"loadKvar\": {N(q)}" : string.Empty;
        return Parse($$"""
            {
              "format": "feederlocate-grid/1", "name": "Two node 20 kV", "frequencyHz": 50,
              "lineTypes": [ { "id": "L", "construction": "overhead", "r1OhmPerKm": {{N(resistanceOhm)}}, "x1OhmPerKm": {{N(reactanceOhm)}},
                               "r0OhmPerKm": 0.5, "x0OhmPerKm": 1.5, "c0NfPerKm": 5, "ampacityA": {{N(ampacityA)}} } ],
              "substations": [ { "id": "SUB", "busNode": "BUS", "nominalVoltageKv": 20, "shortCircuitMva": 250, "rOverX": 0.1,
                                 "transformerZ0Ohm": { "r": 0.15, "x": 1.9 }, "grounding": { "scheme": "solid" } } ],
              "nodes": [ { "id": "BUS" }, { "id": "N1" }, { "id": "N2", "loadKw": {{N(loadKw)}}{{kvar}}, "customers": 10 } ],
              "segments": [ { "id": "S1", "from": "N1", "to": "N2", "lineType": "L", "lengthKm": 1 } ],
              "switches": [ { "id": "CB1", "from": "BUS", "to": "N1", "kind": "breaker", "normallyOpen": false, "remote": true } ],
              "indicators": []
            }
            """);
    }

    /// <summary>
    /// Feeder P1 from substation P with five sections in a row behind remote load-break switches, a lateral
    /// behind a manual disconnector, and three normally-open ties to two feeders of substation Q: T1 (remote)
    /// at P1's end to Q1, T2 (remote) halfway to Q2, T3 (manual, 20 min) from the lateral to Q1. Q1 is long
    /// overhead line of small section, so it cannot take all of P1 at a cold-load factor of 2 (voltage limit).
    /// <paramref name="loadScale"/> scales every load.
    /// </summary>
    public static Grid Fenwick(double loadScale = 1.0, double? transformerRatedMva = null)
    {
        string Load(double kw, int customers) => $"\"loadKw\": {N(kw * loadScale)}, \"customers\": {customers}";
        var rated = transformerRatedMva is { } mva ? $", \"transformerRatedMva\": {N(mva)}" : string.Empty;
        return Parse($$"""
            {
              "format": "feederlocate-grid/1", "name": "Fenwick 20 kV (switching test)", "frequencyHz": 50,
              "lineTypes": [
                { "id": "CAB", "construction": "cable", "r1OhmPerKm": 0.206, "x1OhmPerKm": 0.116, "r0OhmPerKm": 0.82, "x0OhmPerKm": 0.4, "c0NfPerKm": 250, "ampacityA": 320 },
                { "id": "OHL", "construction": "overhead", "r1OhmPerKm": 0.594, "x1OhmPerKm": 0.38, "r0OhmPerKm": 0.74, "x0OhmPerKm": 1.6, "c0NfPerKm": 5, "ampacityA": 210 }
              ],
              "substations": [
                { "id": "P", "busNode": "P-BUS", "nominalVoltageKv": 20, "shortCircuitMva": 300, "rOverX": 0.1, "transformerZ0Ohm": { "r": 0.1, "x": 1.5 }, "grounding": { "scheme": "solid" } },
                { "id": "Q", "busNode": "Q-BUS", "nominalVoltageKv": 20, "shortCircuitMva": 250, "rOverX": 0.1, "transformerZ0Ohm": { "r": 0.1, "x": 1.5 }{{rated}}, "grounding": { "scheme": "solid" } }
              ],
              "nodes": [
                { "id": "P-BUS" }, { "id": "Q-BUS" },
                { "id": "P1" }, { "id": "P2", {{Load(600, 120)}} }, { "id": "P3" }, { "id": "P4", {{Load(700, 140)}} },
                { "id": "P5" }, { "id": "P6", {{Load(800, 150)}} }, { "id": "P7" }, { "id": "P8", {{Load(900, 160)}} },
                { "id": "P9" }, { "id": "P10", {{Load(900, 170)}} }, { "id": "P11" }, { "id": "P12", {{Load(300, 60)}} },
                { "id": "Q1" }, { "id": "Q2", {{Load(500, 90)}} }, { "id": "Q3", {{Load(400, 80)}} },
                { "id": "R1" }, { "id": "R2", {{Load(700, 130)}} }
              ],
              "segments": [
                { "id": "S1", "from": "P1", "to": "P2", "lineType": "CAB", "lengthKm": 2.0 },
                { "id": "S2", "from": "P3", "to": "P4", "lineType": "CAB", "lengthKm": 2.0 },
                { "id": "S3", "from": "P5", "to": "P6", "lineType": "OHL", "lengthKm": 3.0 },
                { "id": "S4", "from": "P7", "to": "P8", "lineType": "OHL", "lengthKm": 3.0 },
                { "id": "S5", "from": "P9", "to": "P10", "lineType": "OHL", "lengthKm": 3.0 },
                { "id": "S6", "from": "P11", "to": "P12", "lineType": "OHL", "lengthKm": 2.0 },
                { "id": "S7", "from": "Q1", "to": "Q2", "lineType": "OHL", "lengthKm": 8.0 },
                { "id": "S8", "from": "Q2", "to": "Q3", "lineType": "OHL", "lengthKm": 6.0 },
                { "id": "S9", "from": "R1", "to": "R2", "lineType": "CAB", "lengthKm": 3.0 }
              ],
              "switches": [
                { "id": "CB-P1", "from": "P-BUS", "to": "P1", "kind": "breaker", "normallyOpen": false, "remote": true },
                { "id": "LB1", "from": "P2", "to": "P3", "kind": "loadBreakSwitch", "normallyOpen": false, "remote": true },
                { "id": "LB2", "from": "P4", "to": "P5", "kind": "loadBreakSwitch", "normallyOpen": false, "remote": true },
                { "id": "LB3", "from": "P6", "to": "P7", "kind": "loadBreakSwitch", "normallyOpen": false, "remote": true },
                { "id": "LB4", "from": "P8", "to": "P9", "kind": "loadBreakSwitch", "normallyOpen": false, "remote": true },
                { "id": "DS5", "from": "P6", "to": "P11", "kind": "disconnector", "normallyOpen": false, "remote": false, "travelMinutes": 25 },
                { "id": "CB-Q1", "from": "Q-BUS", "to": "Q1", "kind": "breaker", "normallyOpen": false, "remote": true },
                { "id": "CB-Q2", "from": "Q-BUS", "to": "R1", "kind": "breaker", "normallyOpen": false, "remote": true },
                { "id": "T1", "from": "P10", "to": "Q3", "kind": "loadBreakSwitch", "normallyOpen": true, "remote": true },
                { "id": "T2", "from": "P8", "to": "R2", "kind": "loadBreakSwitch", "normallyOpen": true, "remote": true },
                { "id": "T3", "from": "P12", "to": "Q2", "kind": "loadBreakSwitch", "normallyOpen": true, "remote": false, "travelMinutes": 20 }
              ],
              "indicators": []
            }
            """);
    }

    private static Grid Parse(string json) => GridReader.Parse(json).ValueOrThrow();

    private static string N(double value) => value.ToString("R", CultureInfo.InvariantCulture);
}
