using BitFaster.Caching;
using BitFaster.Caching.Lru;
using FeederLocate.Application.Incidents;
using FeederLocate.Core.Learning;
using FeederLocate.Core.Ranking;
using FeederLocate.Core.Topology;
using FeederLocate.Storage.Incidents;

namespace FeederLocate.Application.History;

/// <summary>
/// What the outcomes logged for a grid teach: its confirmed incidents, the learned fault rates and indicator
/// reliabilities, and the ranking's priors (with one incident's own outcome left out when ranking that incident).
/// Everything is kept per grid and per last event among the grid's incidents with an outcome: an outcome logged
/// anywhere on the grid, or a correction of one, makes a new key. What one confirmed incident teaches (a refined
/// fault per incident, the costly part) is kept per incident and per its last event, so learning from many subsets
/// of one history (each incident left out in turn) refines each fault once. Every cache is bounded (least recently used goes).
/// A logged outcome the learning cannot use (its evidence gives no radial network, or names what the grid no longer
/// has) is skipped and named in <see cref="Unusable"/>: no stored event can stop a ranking.
/// </summary>
public sealed class GridLearning
{
    private readonly IncidentLog _log;
    private readonly ICache<(NetworkGraph Graph, IncidentId Incident, long LastEvent), OutcomeReading> _observed;
    private readonly ICache<(NetworkGraph Graph, long OutcomesThrough, long LeftOut), RankingPriors> _priors;
    private readonly ICache<(NetworkGraph Graph, long OutcomesThrough), LearnedPriors> _learned;

    public GridLearning(IncidentLog log, int capacity = 4096)
    {
        ArgumentNullException.ThrowIfNull(log);
        ArgumentOutOfRangeException.ThrowIfLessThan(capacity, 3);
        _log = log;
        _observed = new ConcurrentLruBuilder<(NetworkGraph, IncidentId, long), OutcomeReading>().WithCapacity(capacity).WithAtomicGetOrAdd().Build();
        _priors = new ConcurrentLruBuilder<(NetworkGraph, long, long), RankingPriors>().WithCapacity(Math.Max(3, capacity / 16)).WithAtomicGetOrAdd().Build();
        _learned = new ConcurrentLruBuilder<(NetworkGraph, long), LearnedPriors>().WithCapacity(Math.Max(3, capacity / 64)).WithAtomicGetOrAdd().Build();
    }

    /// <summary>The grid's outcomes as they stand now, with the id of the last event among their incidents (0 when none).</summary>
    public GridOutcomes Outcomes(NetworkGraph graph)
    {
        ArgumentNullException.ThrowIfNull(graph);
        var grid = graph.Grid;
        var outcomes = _log.Outcomes(grid.Name).Where(o => grid.HasSegment(o.ConfirmedSegment)).ToList();
        return new GridOutcomes(outcomes, outcomes.Count == 0 ? 0 : outcomes.Max(o => o.LastEvent.Value));
    }

    /// <summary>The grid's outcomes that the learning uses (those in <see cref="Unusable"/> left out).</summary>
    public IReadOnlyList<Outcome> OutcomesForLearning(NetworkGraph graph)
    {
        ArgumentNullException.ThrowIfNull(graph);
        return [.. Read(graph, Outcomes(graph).All).Where(r => r.Observed is not null).Select(r => r.Observed!.Outcome)];
    }

    /// <summary>The grid's logged outcomes the learning skips, each with the reason, by incident id.</summary>
    public IReadOnlyList<UnusableOutcome> Unusable(NetworkGraph graph)
    {
        ArgumentNullException.ThrowIfNull(graph);
        return [.. Read(graph, Outcomes(graph).All).Where(r => r.Unusable is not null).Select(r => r.Unusable!).OrderBy(u => u.Incident.Value)];
    }

    /// <summary>Fault rates and indicator reliabilities learned from every outcome of the grid.</summary>
    public LearnedPriors Learned(NetworkGraph graph)
    {
        var outcomes = Outcomes(graph);
        return _learned.GetOrAdd((graph, outcomes.Through), _ => LearnedRankingPriors.Learn(graph, Observe(graph, outcomes.All)));
    }

    /// <summary>
    /// The ranking's priors from every outcome of the grid except that of <paramref name="leftOut"/> (an incident's
    /// own outcome never feeds its own ranking); no history gives <see cref="RankingPriors.None"/>.
    /// </summary>
    public RankingPriors Priors(NetworkGraph graph, IncidentId? leftOut = null) => Priors(graph, Outcomes(graph), leftOut);

    /// <summary>As <see cref="Priors(NetworkGraph, IncidentId?)"/> for outcomes already read.</summary>
    public RankingPriors Priors(NetworkGraph graph, GridOutcomes outcomes, IncidentId? leftOut)
    {
        ArgumentNullException.ThrowIfNull(graph);
        ArgumentNullException.ThrowIfNull(outcomes);
        var used = outcomes.All.Where(o => o.Id != leftOut).ToList();
        var excluded = used.Count < outcomes.All.Count ? leftOut!.Value.Value : 0;
        return _priors.GetOrAdd((graph, outcomes.Through, excluded), _ => Observe(graph, used) is { Count: > 0 } observed
            ? LearnedRankingPriors.ToRankingPriors(LearnedRankingPriors.Learn(graph, observed), hasHistory: true)
            : RankingPriors.None);
    }

    private List<ObservedIncident> Observe(NetworkGraph graph, IReadOnlyList<IncidentOutcome> outcomes) =>
        [.. Read(graph, outcomes).Where(r => r.Observed is not null).Select(r => r.Observed!)];

    private List<OutcomeReading> Read(NetworkGraph graph, IReadOnlyList<IncidentOutcome> outcomes) =>
        [.. outcomes.Select(o => _observed.GetOrAdd((graph, o.Id, o.LastEvent.Value), _ => OutcomeReading.Of(graph, o)))];

    /// <summary>What one logged outcome teaches, or why it teaches nothing.</summary>
    private sealed record OutcomeReading(ObservedIncident? Observed, UnusableOutcome? Unusable)
    {
        public static OutcomeReading Of(NetworkGraph graph, IncidentOutcome outcome)
        {
            if (UsableEvidence.Problem(graph.Grid, outcome.Incident) is { } missing)
            {
                return new(null, new UnusableOutcome(outcome.Id, outcome.ConfirmedSegment, missing));
            }

            var observed = LearnedRankingPriors.Observe(graph, LearningOutcomes.Of(graph.Grid, [outcome])[0]);
            return observed.Skipped is { } skipped
                ? new(null, new UnusableOutcome(outcome.Id, outcome.ConfirmedSegment, skipped.Reason))
                : new(observed, null);
        }
    }
}

/// <summary>A logged outcome the learning skips: its incident, the segment it confirms, and why it cannot be used.</summary>
public sealed record UnusableOutcome(IncidentId Incident, Core.Model.SegmentId ConfirmedSegment, string Problem)
{
    public override string ToString() => $"incident {Incident}: outcome on {ConfirmedSegment} not learned from: {Problem}";
}

/// <summary>A grid's outcomes as read at one moment, and the id of the last event among their incidents (0 when none).</summary>
public sealed record GridOutcomes(IReadOnlyList<IncidentOutcome> All, long Through);
