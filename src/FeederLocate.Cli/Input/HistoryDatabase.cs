using FeederLocate.Application.History;
using FeederLocate.Application.Incidents;
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

    /// <summary>The incident log of the database (closed with it).</summary>
    public static IncidentLog OpenLog(string path) => new(Open(path));

    /// <summary>The incident log of a database that must exist: a mistyped path is bad input and creates nothing.</summary>
    public static IncidentLog OpenExistingLog(string path) => new(ExistingDatabase.Open(path));

    /// <summary>
    /// The ranking's priors learned from the outcomes of the grid in the database; none without a database. Each
    /// outcome the learning skips is named on <paramref name="warnings"/> (the ranking goes on without it).
    /// </summary>
    public static RankingPriors PriorsFor(string? path, NetworkGraph graph, TextWriter warnings)
    {
        ArgumentNullException.ThrowIfNull(warnings);
        if (path is null)
        {
            return RankingPriors.None;
        }

        using var log = OpenExistingLog(path);
        var learning = new GridLearning(log);
        var priors = learning.Priors(graph);
        foreach (var unusable in learning.Unusable(graph))
        {
            warnings.WriteLine($"warning: {unusable}");
        }

        return priors;
    }
}
