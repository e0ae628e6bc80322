using System.Runtime.CompilerServices;
using FeederLocate.Core.Model;

namespace FeederLocate.Core.Ranking;

/// <summary>
/// ln of every segment's prior (<see cref="RankingPriors.FaultsPerYear"/>, at least 1e-12), by segment index,
/// worked out once per priors and grid rather than once per ranking (the priors and the grid are immutable).
/// Kept per priors object, for the last grid asked for, and dropped with the priors.
/// </summary>
internal static class PriorLogs
{
    private static readonly ConditionalWeakTable<RankingPriors, Tuple<Grid, double[]>> Cache = [];

    public static double[] Of(RankingPriors priors, Grid grid)
    {
        if (Cache.TryGetValue(priors, out var cached) && ReferenceEquals(cached.Item1, grid))
        {
            return cached.Item2;
        }

        var logs = grid.Segments.Select(s => Math.Log(Math.Max(1e-12, priors.FaultsPerYear(grid, s)))).ToArray();
        Cache.AddOrUpdate(priors, Tuple.Create(grid, logs));
        return logs;
    }
}
