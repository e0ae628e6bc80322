using System.Collections.Concurrent;
using FeederLocate.Core.Ranking;
using FeederLocate.Storage.Incidents;

namespace FeederLocate.Web.Services;

/// <summary>
/// The ranking of an incident's current evidence, with priors learned from every outcome logged for
/// its grid; computed once per state of the incident's log and of the grid's history.
/// </summary>
public sealed class IncidentAnalysis(IncidentBoard board)
{
    private readonly ConcurrentDictionary<(long Id, int Events, int Outcomes), RankingOutcome> _rankings = new();
    private readonly ConcurrentDictionary<(string Grid, int Outcomes), RankingPriors> _priors = new();

    private readonly ConcurrentDictionary<(long Id, int Events, int Outcomes), PlanOutcome> _plans = new();

    /// <summary>The switching order for the ranking's most likely section, from the incident's start state.</summary>
    public PlanOutcome Plan(LoadedGrid grid, IncidentState state)
    {
        var ranking = Rank(grid, state);
        if (ranking.Result is not { } result)
        {
            return new PlanOutcome(null, ranking.Problem);
        }

        return _plans.GetOrAdd((state.Id.Value, state.EventCount, board.Outcomes(grid.Name).Count), _ =>
            FeederLocate.Core.Switching.SwitchingPlanner.TryPlan(grid.Graph, state.Incident, result, out var plan, out var problem)
                ? new PlanOutcome(plan, null)
                : new PlanOutcome(null, problem));
    }

    public RankingOutcome Rank(LoadedGrid grid, IncidentState state)
    {
        ArgumentNullException.ThrowIfNull(grid);
        ArgumentNullException.ThrowIfNull(state);
        var outcomes = board.Outcomes(grid.Name).Where(o => o.Id != state.Id && grid.Grid.HasSegment(o.ConfirmedSegment)).ToList();
        var priors = _priors.GetOrAdd((grid.Name, outcomes.Count), _ =>
            LearnedRankingPriors.From(grid.Graph, [.. outcomes.Select(o => new ConfirmedIncident(o.Incident, o.ConfirmedSegment))]));
        return _rankings.GetOrAdd((state.Id.Value, state.EventCount, outcomes.Count), _ =>
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
