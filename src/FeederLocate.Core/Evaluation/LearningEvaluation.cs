using System.Collections.Immutable;
using FeederLocate.Core.Model;
using FeederLocate.Core.Ranking;
using FeederLocate.Core.Topology;

namespace FeederLocate.Core.Evaluation;

/// <summary>
/// One point of the learning curve: section top-1 after <see cref="Outcomes"/> logged outcomes, with what was
/// learned about the two defects by then (before any outcome: the line type's rate and the kind's default).
/// </summary>
/// <param name="HotSegmentFaultsPer100KmYear">The hot segment's learned rate, faults per 100 km·year.</param>
/// <param name="NoisyFalseReportProbability">The noisy indicator's learned P(false report).</param>
/// <param name="Skipped">Outcomes the learning had to leave out (the grid could not explain them).</param>
public sealed record LearningPoint(int Outcomes, double SectionTop1, double HotSegmentFaultsPer100KmYear = double.NaN, double NoisyFalseReportProbability = double.NaN, int Skipped = 0)
{
    /// <summary>
    /// Test incidents on which this point's ranking and the ranking told the truth put different sections first: the
    /// only incidents where their section top-1 can differ. Where neither ranking is the better, each goes either way
    /// with even odds, so the difference in hits has a standard deviation of √ of this count.
    /// </summary>
    public int DisagreementsWithTruth { get; init; }

    /// <summary>Outcomes logged on the hot segment by then.</summary>
    public int HotSegmentOutcomes { get; init; }

    /// <summary>The history's length in years that the rates were learned over (0 before any outcome).</summary>
    public double ObservationYears { get; init; }

    /// <summary>
    /// The hot segment's own record: its outcomes over its length times the years, faults per 100 km·year
    /// (NaN before any outcome). What the data say, against which the learned rate is read.
    /// </summary>
    public double HotSegmentObservedFaultsPer100KmYear { get; init; } = double.NaN;
}

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
    double TruthSectionTop1)
{
    /// <summary>The hot segment's true rate, faults per 100 km·year.</summary>
    public double HotSegmentTrueFaultsPer100KmYear { get; init; } = double.NaN;

    /// <summary>
    /// The share of the gap between no history and the truth closed at a point: (top-1 − top-1 at 0) /
    /// (truth − top-1 at 0); NaN where there is no gap to close (the truth does no better than no history).
    /// </summary>
    public double GapRecovered(LearningPoint point)
    {
        ArgumentNullException.ThrowIfNull(point);
        var start = Curve.First(p => p.Outcomes == Curve.Min(q => q.Outcomes)).SectionTop1;
        var gap = TruthSectionTop1 - start;
        return gap > 0 ? (point.SectionTop1 - start) / gap : double.NaN;
    }
}

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
        IProgress<double>? progress = null,
        Learning.LearningOptions? learning = null)
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
            i => new IndicatorErrorRates(settings.MissProbability, i.Id == noisyIndicator ? Math.Min(LearnedRankingPriors.MaximumFalseReportProbability, noisyFalseProbability) : settings.FalseProbability));
        var truth = truePriorsForSimulation with { IndicatorRates = truthRates };

        var truthFirst = FirstSections(graph, tests, options, truth);
        var curve = ImmutableArray.CreateBuilder<LearningPoint>();
        var done = 0;
        var total = checkpoints.Count + 1;
        foreach (var k in checkpoints.Order())
        {
            var outcomes = history.Take(k).Select(h => new Outcome(h.Incident, h.Segment)).ToList();
            var learned = LearnedRankingPriors.Learn(graph, outcomes, learning);
            var priors = LearnedRankingPriors.ToRankingPriors(learned, hasHistory: k > 0);
            var first = FirstSections(graph, tests, options, priors);
            curve.Add(new LearningPoint(
                k,
                SectionTop1(graph, tests, first),
                learned.FaultRateOf(hotSegment).FaultsPer100KmYear,
                learned.ReliabilityOf(noisyIndicator).FalseReportProbability,
                learned.Skipped.Length)
            {
                DisagreementsWithTruth = first.Where((section, i) => section != truthFirst[i]).Count(),
                HotSegmentOutcomes = outcomes.Count(o => o.Segment == hotSegment),
                ObservationYears = learned.FaultRates.ObservationYears,
                HotSegmentObservedFaultsPer100KmYear = learned.FaultRates.ObservationYears > 0
                    ? 100 * outcomes.Count(o => o.Segment == hotSegment) / (grid.Segment(hotSegment).LengthKm * learned.FaultRates.ObservationYears)
                    : double.NaN,
            });
            progress?.Report(++done / (double)total);
        }

        var truthTop1 = SectionTop1(graph, tests, truthFirst);
        progress?.Report(1);
        return new LearningReport(hotSegment, hotSegmentRateFactor, noisyIndicator, noisyFalseProbability, testIncidents, curve.ToImmutable(), truthTop1)
        {
            HotSegmentTrueFaultsPer100KmYear = 100 * nominal * hotSegmentRateFactor,
        };
    }

    /// <summary>The section each test incident's ranking puts first.</summary>
    private static List<SectionId> FirstSections(NetworkGraph graph, List<SimulatedIncident> tests, RankingOptions options, RankingPriors priors) =>
        tests.Select(t => FaultRanking.Rank(graph, t.Incident, options, priors).Sections[0].Id).ToList();

    /// <summary>The share of test incidents whose faulted segment lies in the section put first.</summary>
    private static double SectionTop1(NetworkGraph graph, List<SimulatedIncident> tests, List<SectionId> first) =>
        tests.Where((t, i) => first[i] == graph.Sections.OfSegment(graph.Grid.SegmentIndex(t.Segment)).Id).Count() / (double)tests.Count;
}
