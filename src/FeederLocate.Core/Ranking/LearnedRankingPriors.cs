using System.Collections.Immutable;
using FeederLocate.Core.Evidence;
using FeederLocate.Core.Learning;
using FeederLocate.Core.Model;
using FeederLocate.Core.Topology;

namespace FeederLocate.Core.Ranking;

/// <summary>A logged incident with the segment where its fault was confirmed.</summary>
public sealed record ConfirmedIncident(Incident Incident, SegmentId Segment);

/// <summary>A confirmed incident with what it teaches about its indicators (see <see cref="LearnedRankingPriors.ObservationsOf"/>).</summary>
public sealed record ObservedIncident(ConfirmedIncident Outcome, IReadOnlyList<IndicatorObservation> Observations);

/// <summary>
/// Turns logged outcomes into priors for the ranking: each confirmed fault counts for its segment's
/// fault rate; each indication is compared with what the engine says the indicator should have shown
/// for the best-fitting fault on the confirmed segment (type, resistance and position refined against
/// the incident's own records), and counts as a hit, a miss or a false report.
/// </summary>
public static class LearnedRankingPriors
{
    /// <summary>
    /// Learning as the ranking uses it: a segment's own record outweighs its line type only after
    /// 100 km·years (faults are rare; a single one on a short segment must not triple its rate), and
    /// the error-rate priors equal the ranking's defaults (misreading is added by the ranking itself).
    /// </summary>
    public static LearningOptions Options { get; } = new(
        FaultRateOptions.Default with { SegmentShrinkKmYears = 100 },
        IndicatorReliabilityOptions.Default with
        {
            FieldMissProbability = RankingOptions.Default.FieldRates.MissProbability,
            FieldFalseReportProbability = RankingOptions.Default.FieldRates.FalseReportProbability,
        });

    public static LearnedPriors Learn(NetworkGraph graph, IReadOnlyList<ConfirmedIncident> outcomes, LearningOptions? options = null)
    {
        options ??= Options;
        ArgumentNullException.ThrowIfNull(graph);
        ArgumentNullException.ThrowIfNull(outcomes);
        return Learn(graph.Grid, [.. outcomes.Select(o => new ObservedIncident(o, ObservationsOf(graph, o)))], options);
    }

    /// <summary>
    /// Learning from incidents whose observations are already known: the same as <see cref="Learn(NetworkGraph, IReadOnlyList{ConfirmedIncident}, LearningOptions?)"/>
    /// without refining a fault per incident again, for callers that learn from many subsets of one history.
    /// </summary>
    public static LearnedPriors Learn(Grid grid, IReadOnlyList<ObservedIncident> observed, LearningOptions? options = null)
    {
        options ??= Options;
        ArgumentNullException.ThrowIfNull(grid);
        ArgumentNullException.ThrowIfNull(observed);
        var faults = observed.Select(o => new ConfirmedFault(o.Outcome.Segment, o.Outcome.Incident.ReportedAt)).ToList();
        return HistoryLearning.Learn(grid, faults, observed.SelectMany(o => o.Observations).ToList(), options);
    }

    /// <summary>
    /// What one confirmed incident teaches about its indicators: each listed indicator's state against the one
    /// expected for the best-fitting fault on the confirmed segment. The costly part of learning (one refined fault per incident).
    /// </summary>
    public static IReadOnlyList<IndicatorObservation> ObservationsOf(NetworkGraph graph, ConfirmedIncident outcome)
    {
        ArgumentNullException.ThrowIfNull(outcome);
        return IndicatorObservation.ForIncident(outcome.Incident, ExpectedAtConfirmed(graph, outcome.Incident, outcome.Segment));
    }

    /// <summary>The ranking's priors: learned fault rates for every segment; learned error rates once history exists.</summary>
    public static RankingPriors ToRankingPriors(LearnedPriors learned, bool hasHistory)
    {
        ArgumentNullException.ThrowIfNull(learned);
        var rates = learned.FaultRates.Segments.ToImmutableDictionary(s => s.Segment, s => s.FaultsPerKmYear);
        var indicators = hasHistory
            ? learned.Indicators.Indicators.ToImmutableDictionary(i => i.Indicator, i => new IndicatorErrorRates(
                Math.Min(0.45, i.MissProbability), Math.Min(0.45, i.FalseReportProbability)))
            : ImmutableDictionary<IndicatorId, IndicatorErrorRates>.Empty;
        return new RankingPriors(rates, indicators);
    }

    /// <summary>Learns from the outcomes and gives the ranking's priors in one step.</summary>
    public static RankingPriors From(NetworkGraph graph, IReadOnlyList<ConfirmedIncident> outcomes, LearningOptions? options = null) =>
        outcomes.Count == 0 ? RankingPriors.None : ToRankingPriors(Learn(graph, outcomes, options), hasHistory: true);

    /// <summary>What each indicator the incident lists should have shown for the best-fitting fault on the confirmed segment.</summary>
    public static IReadOnlyDictionary<IndicatorId, IndicatorState> ExpectedAtConfirmed(NetworkGraph graph, Incident incident, SegmentId segment)
    {
        ArgumentNullException.ThrowIfNull(graph);
        ArgumentNullException.ThrowIfNull(incident);
        var computation = new RankingComputation(graph, incident with { Indications = [.. incident.Indications.Select(i => i with { Suspect = false })] },
            RankingOptions.Default, RankingPriors.None);
        var index = graph.Grid.SegmentIndex(segment);
        if (!computation.Network.IsSegmentEnergised(index))
        {
            return new Dictionary<IndicatorId, IndicatorState>();
        }

        var best = computation.Refine(index);
        var fault = computation.Model.Solve(index, best.Position, best.Type, best.FaultResistanceOhm);
        var expected = computation.ExpectedStates(index, fault);
        return computation.Observed.Select((o, i) => (o.Indicator.Id, expected[i])).ToDictionary(p => p.Id, p => p.Item2);
    }
}
