using System.Collections.Concurrent;
using FeederLocate.Core.Learning;
using FeederLocate.Core.Ranking;
using FeederLocate.Storage.Incidents;

namespace FeederLocate.Web.Services;

/// <summary>
/// The ranking of an incident's current evidence, with priors learned from every outcome logged for
/// its grid; computed once per state of the incident's log and of the grid's history. Only the latest
/// result per incident is kept: pages show the current state.
/// </summary>
public sealed class IncidentAnalysis(IncidentBoard board)
{
    private readonly ConcurrentDictionary<long, ((int Events, int Outcomes) Key, RankingOutcome Value)> _rankings = new();
    private readonly ConcurrentDictionary<(string Grid, int Outcomes, long Excluded), RankingPriors> _priors = new();
    private readonly ConcurrentDictionary<long, ((int Events, int Outcomes) Key, PlanOutcome Value)> _plans = new();
    private readonly ConcurrentDictionary<string, (int Version, LearnedPriors Value)> _learned = new(StringComparer.Ordinal);

    /// <summary>
    /// What the grid's history has taught, computed once per grid and version of its history (which outcomes,
    /// on which segments), never per page.
    /// </summary>
    public LearnedPriors Learned(LoadedGrid grid)
    {
        ArgumentNullException.ThrowIfNull(grid);
        var outcomes = board.Outcomes(grid.Name);
        var version = outcomes.Aggregate(outcomes.Count, (hash, o) => HashCode.Combine(hash, o.Id.Value, o.ConfirmedSegment.Value));
        return Latest(_learned, grid.Name, version, () =>
            LearnedRankingPriors.Learn(grid.Graph, [.. outcomes.Select(o => new ConfirmedIncident(o.Incident, o.ConfirmedSegment))]));
    }

    /// <summary>The value kept for <paramref name="id"/> when it was made for <paramref name="key"/>; otherwise a new one, which replaces it.</summary>
    private static TValue Latest<TId, TKey, TValue>(ConcurrentDictionary<TId, (TKey Key, TValue Value)> cache, TId id, TKey key, Func<TValue> make)
        where TId : notnull
    {
        if (cache.TryGetValue(id, out var kept) && EqualityComparer<TKey>.Default.Equals(kept.Key, key))
        {
            return kept.Value;
        }

        var value = make();
        cache[id] = (key, value);
        return value;
    }

    /// <summary>The switching order for the ranking's most likely section, from the incident's start state.</summary>
    public PlanOutcome Plan(LoadedGrid grid, IncidentState state)
    {
        var ranking = Rank(grid, state);
        if (ranking.Result is not { } result)
        {
            return new PlanOutcome(null, ranking.Problem);
        }

        return Latest(_plans, state.Id.Value, (state.EventCount, board.Outcomes(grid.Name).Count), () =>
            FeederLocate.Core.Switching.SwitchingPlanner.TryPlan(grid.Graph, state.Incident, result, out var plan, out var problem)
                ? new PlanOutcome(plan, null)
                : new PlanOutcome(null, problem));
    }

    public RankingOutcome Rank(LoadedGrid grid, IncidentState state)
    {
        ArgumentNullException.ThrowIfNull(grid);
        ArgumentNullException.ThrowIfNull(state);
        var all = board.Outcomes(grid.Name);
        var outcomes = all.Where(o => o.Id != state.Id && grid.Grid.HasSegment(o.ConfirmedSegment)).ToList();
        // An incident's own outcome never feeds its ranking: the priors are per grid, per number of outcomes, and per incident left out.
        var excluded = all.Any(o => o.Id == state.Id) ? state.Id.Value : 0;
        var priors = _priors.GetOrAdd((grid.Name, outcomes.Count, excluded), _ =>
            LearnedRankingPriors.From(grid.Graph, [.. outcomes.Select(o => new ConfirmedIncident(o.Incident, o.ConfirmedSegment))]));
        return Latest(_rankings, state.Id.Value, (state.EventCount, outcomes.Count), () =>
        {
            try
            {
                return new RankingOutcome(FaultRanking.Rank(grid.Graph, state.Incident, priors: priors), null);
            }
            catch (RankingException e)
            {
                return new RankingOutcome(null, e.Message);
            }
        });
    }
}

/// <summary>A ranking, or why there is none.</summary>
public sealed record RankingOutcome(RankingResult? Result, string? Problem);

/// <summary>A switching order, or why there is none.</summary>
public sealed record PlanOutcome(FeederLocate.Core.Switching.SwitchingPlan? Plan, string? Problem);
