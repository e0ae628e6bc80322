using FeederLocate.Core.Model;
using FeederLocate.Core.Ranking;
using FeederLocate.Core.Topology;
using FeederLocate.Storage;
using FeederLocate.Storage.Errors;
using Microsoft.Data.Sqlite;

namespace FeederLocate.Cli.Input;

/// <summary>Opens the history database for a command, turning its failures into bad-input messages.</summary>
public static class HistoryDatabase
{
    public static IncidentStore Open(string path)
    {
        try
        {
            return IncidentStore.Open(path);
        }
        catch (Exception e) when (e is SqliteException or IOException or UnauthorizedAccessException or IncidentStoreException)
        {
            throw new BadInputException($"error: cannot open history database '{path}': {e.Message}");
        }
    }

    /// <summary>The ranking's priors learned from every outcome recorded for a grid of the same name.</summary>
    public static RankingPriors PriorsFor(string? path, NetworkGraph graph)
    {
        if (path is null)
        {
            return RankingPriors.None;
        }

        using var store = Open(path);
        var grid = graph.Grid;
        // Outcomes the grid cannot explain (a segment since removed, ...) are skipped by the learning itself.
        var outcomes = store.Outcomes(grid.Name)
            .Select(o => new ConfirmedIncident(o.Incident, o.ConfirmedSegment))
            .ToList();
        return LearnedRankingPriors.From(graph, outcomes);
    }

    /// <summary>Every outcome recorded for a grid of the same name; the learning skips and reports those the grid cannot explain.</summary>
    public static IReadOnlyList<ConfirmedIncident> OutcomesFor(IncidentStore store, Grid grid) =>
        [.. store.Outcomes(grid.Name).Select(o => new ConfirmedIncident(o.Incident, o.ConfirmedSegment))];
}
