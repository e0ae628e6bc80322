using System.Collections.Immutable;
using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;

namespace FeederLocate.Core.Ranking;

/// <summary>
/// One fault type to consider, its prior weight, and the fault resistances to marginalise over, each with
/// its own log prior weight (the weights of one plan sum to 1).
/// </summary>
internal sealed record FaultTypePlan(FaultType Type, double LogWeight, ImmutableArray<double> ResistancesOhm, ImmutableArray<double> ResistanceLogWeights);

/// <summary>Which fault types and resistances to consider, from the incident, the grounding and whether anything tripped.</summary>
internal static class HypothesisPlan
{
    public static ImmutableArray<FaultTypePlan> For(GroundingScheme scheme, Incident incident, RankingOptions options)
    {
        var lowCurrentEarthing = scheme is GroundingScheme.Isolated or GroundingScheme.Resonant;
        // A reclosing sequence means a device tripped, even where it reclosed successfully and nothing is open now.
        var tripped = incident.TrippedDevice is not null || incident.Reclosing is not null;
        IEnumerable<(FaultType Type, double Weight)> types;
        if (incident.FaultType is { } given)
        {
            types = [(given, 1)];
        }
        else if (lowCurrentEarthing)
        {
            // An earth fault on an isolated or resonant network does not trip: a trip means a short
            // circuit, a standing fault means an earth fault (common practice).
            types = !tripped
                ? [(FaultType.LG, 1)]
                : [(FaultType.LL, 0.4), (FaultType.LLG, 0.3), (FaultType.LLL, 0.3)];
        }
        else if (!tripped)
        {
            // Nothing tripped on a solid or impedance network: a standing earth fault through a high
            // resistance (a conductor down on dry ground), or a short circuit the records must show.
            types = [(FaultType.LG, 0.9), (FaultType.LL, 0.03), (FaultType.LLG, 0.04), (FaultType.LLL, 0.03)];
        }
        else
        {
            // Most MV faults are single phase to earth (common practice, from memory).
            types = [(FaultType.LG, 0.6), (FaultType.LL, 0.15), (FaultType.LLG, 0.15), (FaultType.LLL, 0.1)];
        }

        return [.. types.Select(t => Plan(t.Type, Math.Log(t.Weight), lowCurrentEarthing, tripped, options))];
    }

    private static FaultTypePlan Plan(FaultType type, double logWeight, bool lowCurrentEarthing, bool tripped, RankingOptions options)
    {
        if (type is not (FaultType.LG or FaultType.LLG))
        {
            return Even(type, logWeight, options.ShortCircuitOhms);
        }

        if (lowCurrentEarthing)
        {
            return Even(type, logWeight, options.HighResistanceEarthFaultOhms);
        }

        // Solid and impedance networks: the tripping range, joined by the high-resistance range — with
        // a small share where a device tripped (a sensitive earth-fault element), an even one where
        // nothing tripped (the fault may be anywhere from a few ohms to several kΩ).
        var low = options.LowResistanceEarthFaultOhms;
        var high = options.HighResistanceEarthFaultOhms.Where(r => r > low.Max()).ToImmutableArray();
        if (high.IsEmpty)
        {
            return Even(type, logWeight, low);
        }

        var highShare = tripped ? options.HighResistanceTripShare : 0.5;
        var weights = low.Select(_ => Math.Log((1 - highShare) / low.Length)).Concat(high.Select(_ => Math.Log(highShare / high.Length)));
        return new FaultTypePlan(type, logWeight, [.. low, .. high], [.. weights]);
    }

    private static FaultTypePlan Even(FaultType type, double logWeight, ImmutableArray<double> resistances) =>
        new(type, logWeight, resistances, [.. resistances.Select(_ => -Math.Log(resistances.Length))]);
}
