using System.Collections.Immutable;
using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;

namespace FeederLocate.Core.Ranking;

/// <summary>One fault type to consider, its prior weight, and the fault resistances to marginalise over.</summary>
internal sealed record FaultTypePlan(FaultType Type, double LogWeight, ImmutableArray<double> ResistancesOhm);

/// <summary>Which fault types and resistances to consider, from the incident, the grounding and whether anything tripped.</summary>
internal static class HypothesisPlan
{
    public static ImmutableArray<FaultTypePlan> For(GroundingScheme scheme, Incident incident, RankingOptions options)
    {
        var lowCurrentEarthing = scheme is GroundingScheme.Isolated or GroundingScheme.Resonant;
        IEnumerable<(FaultType Type, double Weight)> types;
        if (incident.FaultType is { } given)
        {
            types = [(given, 1)];
        }
        else if (lowCurrentEarthing)
        {
            // An earth fault on an isolated or resonant network does not trip: a trip means a short
            // circuit, a standing fault means an earth fault (common practice).
            types = incident.TrippedDevice is null
                ? [(FaultType.LG, 1)]
                : [(FaultType.LL, 0.4), (FaultType.LLG, 0.3), (FaultType.LLL, 0.3)];
        }
        else
        {
            // Most MV faults are single phase to earth (common practice, from memory).
            types = [(FaultType.LG, 0.6), (FaultType.LL, 0.15), (FaultType.LLG, 0.15), (FaultType.LLL, 0.1)];
        }

        return [.. types.Select(t => new FaultTypePlan(t.Type, Math.Log(t.Weight), Resistances(t.Type, lowCurrentEarthing, options)))];
    }

    private static ImmutableArray<double> Resistances(FaultType type, bool lowCurrentEarthing, RankingOptions options) => type switch
    {
        FaultType.LG or FaultType.LLG when lowCurrentEarthing => options.HighResistanceEarthFaultOhms,
        FaultType.LG or FaultType.LLG => options.LowResistanceEarthFaultOhms,
        _ => options.ShortCircuitOhms,
    };
}
