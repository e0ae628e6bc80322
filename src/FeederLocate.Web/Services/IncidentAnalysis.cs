using System.Collections.Concurrent;
using FeederLocate.Core.Ranking;
using FeederLocate.Storage.Incidents;

namespace FeederLocate.Web.Services;

/// <summary>The ranking of an incident's current evidence, computed once per state of its log.</summary>
public sealed class IncidentAnalysis
{
    private readonly ConcurrentDictionary<(long Id, int Events), RankingOutcome> _cache = new();

    public RankingOutcome Rank(LoadedGrid grid, IncidentState state)
    {
        ArgumentNullException.ThrowIfNull(grid);
        ArgumentNullException.ThrowIfNull(state);
        return _cache.GetOrAdd((state.Id.Value, state.EventCount), _ =>
        {
            try
            {
                return new RankingOutcome(FaultRanking.Rank(grid.Graph, state.Incident), null);
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
