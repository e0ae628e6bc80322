using FeederLocate.Core.Model;
using FeederLocate.Core.Ranking;
using FeederLocate.Core.Topology;

namespace FeederLocate.Core.Evaluation;

/// <summary>Top-1 and top-3 hit rates of one locator over the simulated incidents, 0 to 1.</summary>
public sealed record HitRates(double SectionTop1, double SectionTop3, double SegmentTop1, double SegmentTop3);

/// <summary>The evaluation of one run: the ranking as deployed, told the true error rates, and the baseline rule.</summary>
public sealed record EvaluationReport(int Incidents, HitRates Deployed, HitRates Limit, HitRates Baseline, double MillisecondsPerIncident);

/// <summary>
/// Simulates incidents with the reference model and scores the ranking against the truth:
/// (a) as deployed (its default error rates), (b) told the simulation's true rates (the limit the
/// evidence allows), (c) the deterministic baseline rule. The clock only times the ranking.
/// </summary>
public static class RankingEvaluation
{
    public static EvaluationReport Run(
        Grid grid,
        int incidents,
        int seed,
        SimulationSettings settings,
        TimeProvider clock,
        RankingOptions? deployed = null,
        IProgress<double>? progress = null)
    {
        ArgumentNullException.ThrowIfNull(grid);
        ArgumentOutOfRangeException.ThrowIfLessThan(incidents, 1);
        ArgumentNullException.ThrowIfNull(settings);
        ArgumentNullException.ThrowIfNull(clock);
        deployed ??= RankingOptions.Default;
        var truth = new IndicatorErrorRates(Math.Min(0.49, settings.MissProbability), Math.Min(0.49, settings.FalseProbability));
        var limit = deployed with { RemoteRates = truth, FieldRates = truth };
        var graph = new NetworkGraph(grid);
        var simulator = new IncidentSimulator(graph, settings);
        var baseline = new BaselineLocator(graph.Energise(SwitchStates.Normal(grid)));
        var random = new Random(seed);
        var tallies = new[] { new Tally(), new Tally(), new Tally() };
        var started = clock.GetTimestamp();
        for (var n = 0; n < incidents; n++)
        {
            var simulated = simulator.Next(random, n);
            var trueSection = graph.Sections.OfSegment(grid.SegmentIndex(simulated.Segment)).Id;
            tallies[0].Add(FaultRanking.Rank(graph, simulated.Incident, deployed), simulated.Segment, trueSection);
            tallies[1].Add(FaultRanking.Rank(graph, simulated.Incident, limit), simulated.Segment, trueSection);
            tallies[2].Add(baseline.Suspects(simulated.Incident, 30), graph.Sections, grid, simulated.Segment, trueSection);
            progress?.Report((n + 1) / (double)incidents);
        }

        var elapsed = clock.GetElapsedTime(started);
        return new EvaluationReport(incidents, tallies[0].Rates(), tallies[1].Rates(), tallies[2].Rates(), elapsed.TotalMilliseconds / incidents / 2);
    }

    internal sealed class Tally
    {
        private int _count;
        private int _section1;
        private int _section3;
        private int _segment1;
        private int _segment3;

        public void Add(RankingResult ranking, SegmentId segment, SectionId section) =>
            Count([.. ranking.Segments.Take(3).Select(s => s.Id)], [.. ranking.Sections.Take(3).Select(s => s.Id)], segment, section);

        public void Add(IReadOnlyList<SegmentId> suspects, SectionMap sections, Grid grid, SegmentId segment, SectionId section)
        {
            var sectionOrder = suspects.Select(s => sections.OfSegment(grid.SegmentIndex(s)).Id).Distinct().Take(3).ToList();
            Count([.. suspects.Take(3)], sectionOrder, segment, section);
        }

        public HitRates Rates() => new(
            _section1 / (double)_count, _section3 / (double)_count, _segment1 / (double)_count, _segment3 / (double)_count);

        private void Count(List<SegmentId> topSegments, List<SectionId> topSections, SegmentId segment, SectionId section)
        {
            _count++;
            _segment1 += topSegments.Count > 0 && topSegments[0] == segment ? 1 : 0;
            _segment3 += topSegments.Contains(segment) ? 1 : 0;
            _section1 += topSections.Count > 0 && topSections[0] == section ? 1 : 0;
            _section3 += topSections.Contains(section) ? 1 : 0;
        }
    }
}
