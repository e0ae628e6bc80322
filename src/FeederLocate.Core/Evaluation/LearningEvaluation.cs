using System.Collections.Immutable;
using FeederLocate.Core.Model;
using FeederLocate.Core.Ranking;
using FeederLocate.Core.Topology;

namespace FeederLocate.Core.Evaluation;

/// <summary>One point of the learning curve: section top-1 after <see cref="Outcomes"/> logged outcomes.</summary>
public sealed record LearningPoint(int Outcomes, double SectionTop1);

/// <summary>
/// The learning curve: section top-1 of the ranking with priors learned from a growing simulated
/// history, against the ranking told the truth (the history's true fault rates and error rates).
/// </summary>
public sealed record LearningReport(
    SegmentId HotSegment,
    double HotSegmentRateFactor,
    IndicatorId NoisyIndicator,
    double NoisyFalseProbability,
    int TestIncidents,
    ImmutableArray<LearningPoint> Curve,
    double TruthSectionTop1);

/// <summary>
/// Replays a simulated history in which one segment fails <c>factor</c> times as often as its line type
/// says and one indicator reports falsely with a high probability, and measures how the ranking improves
/// as outcomes accumulate.
/// </summary>
public static class LearningEvaluation
{
    public static LearningReport Run(
        Grid grid,
        IReadOnlyList<int> checkpoints,
        int testIncidents,
        int seed,
        SegmentId hotSegment,
        IndicatorId noisyIndicator,
        double hotSegmentRateFactor = 5,
        double noisyFalseProbability = 0.5,
        IProgress<double>? progress = null)
    {
        ArgumentNullException.ThrowIfNull(grid);
        ArgumentNullException.ThrowIfNull(checkpoints);
        var graph = new NetworkGraph(grid);
        var nominal = Units.PerKmYear(grid.LineTypeOf(grid.Segment(hotSegment)).EffectiveFaultsPer100KmYear);
        var truePriorsForSimulation = new RankingPriors(
            ImmutableDictionary<SegmentId, double>.Empty.Add(hotSegment, nominal * hotSegmentRateFactor),
            ImmutableDictionary<IndicatorId, IndicatorErrorRates>.Empty);
        var settings = new SimulationSettings(FalseProbabilityByIndicator: ImmutableDictionary<IndicatorId, double>.Empty.Add(noisyIndicator, noisyFalseProbability));
        var simulator = new IncidentSimulator(graph, settings, truePriorsForSimulation);
        var random = new Random(seed);
        var history = Enumerable.Range(0, checkpoints.Max()).Select(n => simulator.Next(random, n)).ToList();
        var tests = Enumerable.Range(0, testIncidents).Select(n => simulator.Next(random, checkpoints.Max() + n)).ToList();

        var options = RankingOptions.Default;
        var truthRates = grid.Indicators.ToImmutableDictionary(
            i => i.Id,
            i => new IndicatorErrorRates(settings.MissProbability, i.Id == noisyIndicator ? Math.Min(0.45, noisyFalseProbability) : settings.FalseProbability));
        var truth = truePriorsForSimulation with { IndicatorRates = truthRates };

        var curve = ImmutableArray.CreateBuilder<LearningPoint>();
        var done = 0;
        var total = checkpoints.Count + 1;
        foreach (var k in checkpoints.Order())
        {
            var outcomes = history.Take(k).Select(h => new ConfirmedIncident(h.Incident, h.Segment)).ToList();
            var priors = LearnedRankingPriors.From(graph, outcomes);
            curve.Add(new LearningPoint(k, SectionTop1(graph, tests, options, priors)));
            progress?.Report(++done / (double)total);
        }

        var truthTop1 = SectionTop1(graph, tests, options, truth);
        progress?.Report(1);
        return new LearningReport(hotSegment, hotSegmentRateFactor, noisyIndicator, noisyFalseProbability, testIncidents, curve.ToImmutable(), truthTop1);
    }

    private static double SectionTop1(NetworkGraph graph, List<SimulatedIncident> tests, RankingOptions options, RankingPriors priors)
    {
        var hits = 0;
        foreach (var t in tests)
        {
            var ranking = FaultRanking.Rank(graph, t.Incident, options, priors);
            hits += ranking.Sections[0].Id == graph.Sections.OfSegment(graph.Grid.SegmentIndex(t.Segment)).Id ? 1 : 0;
        }

        return hits / (double)tests.Count;
    }
}
