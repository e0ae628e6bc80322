namespace FeederLocate.Core.Tests.ReferenceCases;

/// <summary>
/// IEC 60228 (conductors of insulated cables), Table 2, class 2 stranded conductors: maximum DC
/// resistance at 20 °C in Ω/km, as transcribed in shared/CHECK-VALUES.md.
/// </summary>
public static class Iec60228ConductorResistance
{
    public static readonly IReadOnlyDictionary<(string Material, double CrossSectionMm2), double> MaximumOhmPerKmAt20C =
        new Dictionary<(string, double), double>
        {
            [("Cu", 50)] = 0.387, [("Cu", 70)] = 0.268, [("Cu", 95)] = 0.193, [("Cu", 120)] = 0.153,
            [("Cu", 150)] = 0.124, [("Cu", 185)] = 0.0991, [("Cu", 240)] = 0.0754, [("Cu", 300)] = 0.0601,
            [("Al", 50)] = 0.641, [("Al", 70)] = 0.443, [("Al", 95)] = 0.320, [("Al", 120)] = 0.253,
            [("Al", 150)] = 0.206, [("Al", 185)] = 0.164, [("Al", 240)] = 0.125, [("Al", 300)] = 0.100,
        };
}
