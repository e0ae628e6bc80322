using System.Globalization;
using FeederLocate.Core.Formats;
using FeederLocate.Core.Model;

namespace FeederLocate.Core.Tests.Support;

/// <summary>Small invented grids for electrical checks, written as grid files and read through the real reader.</summary>
public static class SmallGrids
{
    /// <summary>
    /// One 20 kV busbar (S"k 250 MVA, R/X 0.1, Z0T 0.15 + j1.9 Ω), a breaker and one Al 150 cable
    /// (0.206 + j0.116, r0 0.82 + j0.40 Ω/km) of <paramref name="lengthKm"/> with <paramref name="c0NfPerKm"/>.
    /// Indicator FI1 at the feeder head, FI2 at the far end facing the source (both non-directional, earth 1 A).
    /// </summary>
    public static Grid SingleCable(string groundingJson, double lengthKm, double c0NfPerKm)
    {
        var json = $$"""
            {
              "format": "feederlocate-grid/1",
              "name": "Single cable 20 kV",
              "frequencyHz": 50,
              "lineTypes": [
                { "id": "CAB-AL150", "construction": "cable", "r1OhmPerKm": 0.206, "x1OhmPerKm": 0.116,
                  "r0OhmPerKm": 0.82, "x0OhmPerKm": 0.40, "c0NfPerKm": {{Number(c0NfPerKm)}}, "ampacityA": 320 }
              ],
              "substations": [{
                "id": "SUB", "busNode": "BUS", "nominalVoltageKv": 20, "shortCircuitMva": 250, "rOverX": 0.1,
                "transformerZ0Ohm": { "r": 0.15, "x": 1.9 },
                "grounding": {{groundingJson}}
              }],
              "nodes": [ { "id": "BUS" }, { "id": "N1" }, { "id": "N2" } ],
              "segments": [ { "id": "S1", "from": "N1", "to": "N2", "lineType": "CAB-AL150", "lengthKm": {{Number(lengthKm)}} } ],
              "switches": [ { "id": "CB1", "from": "BUS", "to": "N1", "kind": "breaker", "normallyOpen": false, "remote": true } ],
              "indicators": [
                { "id": "FI1", "segment": "S1", "node": "N1", "earthPickupA": 1, "directional": false, "remote": true },
                { "id": "FI2", "segment": "S1", "node": "N2", "earthPickupA": 1, "directional": false, "remote": true }
              ]
            }
            """;
        return GridReader.Parse(json).ValueOrThrow();
    }

    private static string Number(double value) => value.ToString("R", CultureInfo.InvariantCulture);
}
