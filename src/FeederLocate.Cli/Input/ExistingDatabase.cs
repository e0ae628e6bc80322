using FeederLocate.Storage;
using FeederLocate.Storage.Errors;
using Microsoft.Data.Sqlite;

namespace FeederLocate.Cli.Input;

/// <summary>
/// Opens the history database for a command that reads or checks it: a path with no file is bad input
/// (exit 2) and nothing is created.
/// </summary>
public static class ExistingDatabase
{
    public static IncidentStore Open(string path)
    {
        try
        {
            return IncidentStore.OpenExisting(path);
        }
        catch (DatabaseMissingException e)
        {
            throw new BadInputException($"error: {e.Message}");
        }
        catch (Exception e) when (e is SqliteException or IOException or UnauthorizedAccessException or IncidentStoreException)
        {
            throw new BadInputException($"error: cannot open history database '{path}': {e.Message}");
        }
    }
}
