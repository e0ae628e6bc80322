using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;
using FeederLocate.Core.Ranking;
using FeederLocate.Core.Topology;

namespace FeederLocate.Core.Evaluation;

/// <summary>Hit rates of the ranking on the same incidents without and with their protection context.</summary>
public sealed record ProtectionEvaluationReport(int Incidents, HitRates Without, HitRates With, double MillisecondsPerIncident);

/// <summary>
/// Simulates incidents that carry the protection context (relay directions at every feeder breaker,
/// reclosing, fuses, fault locator) and ranks each twice: with that context stripped, and with it.
/// The clock only times the ranking.
/// </summary>
public static class ProtectionEvaluation
{
    public static ProtectionEvaluationReport Run(
        Grid grid,
        int incidents,
        int seed,
        SimulationSettings settings,
        TimeProvider clock,
        RankingOptions? options = null,
        IProgress<double>? progress = null)
    {
        ArgumentNullException.ThrowIfNull(grid);
        ArgumentOutOfRangeException.ThrowIfLessThan(incidents, 1);
        ArgumentNullException.ThrowIfNull(settings);
        ArgumentNullException.ThrowIfNull(clock);
        var graph = new NetworkGraph(grid);
        var simulator = new IncidentSimulator(graph, settings with { ProtectionContext = true });
        var random = new Random(seed);
        var without = new RankingEvaluation.Tally();
        var with = new RankingEvaluation.Tally();
        var started = clock.GetTimestamp();
        for (var n = 0; n < incidents; n++)
        {
            var simulated = simulator.Next(random, n);
            var trueSection = graph.Sections.OfSegment(grid.SegmentIndex(simulated.Segment)).Id;
            without.Add(FaultRanking.Rank(graph, WithoutProtection(simulated.Incident), options), simulated.Segment, trueSection);
            with.Add(FaultRanking.Rank(graph, simulated.Incident, options), simulated.Segment, trueSection);
            progress?.Report((n + 1) / (double)incidents);
        }

        var elapsed = clock.GetElapsedTime(started);
        return new ProtectionEvaluationReport(incidents, without.Rates(), with.Rates(), elapsed.TotalMilliseconds / incidents / 2);
    }

    /// <summary>The incident as it was before the protection's results could be entered.</summary>
    public static Incident WithoutProtection(Incident incident)
    {
        ArgumentNullException.ThrowIfNull(incident);
        return incident with
        {
            FaultAt = null,
            Reclosing = null,
            Fuses = System.Collections.Immutable.ImmutableDictionary<SwitchId, FuseCondition>.Empty,
            Relays = [],
        };
    }
}
