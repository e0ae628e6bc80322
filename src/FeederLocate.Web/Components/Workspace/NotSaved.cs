using FeederLocate.Storage.Errors;
using Microsoft.Data.Sqlite;

namespace FeederLocate.Web.Components.Workspace;

/// <summary>What the operator is told when a change could not be saved: why, in the control room's words.</summary>
public static class NotSaved
{
    private const int SqliteFull = 13; // SQLITE_FULL, sqlite.org/rescode.html

    /// <summary>Whether <paramref name="e"/> is a failed or refused write the page reports (anything else is a defect and propagates).</summary>
    public static bool Reports(Exception e) => e is IncidentStoreException or DatabaseFileGoneException or SqliteException or IOException;

    public static string Describe(Exception e) => e switch
    {
        EvidenceNotRadialException notRadial => notRadial.Message,
        IncidentStoreException refused => refused.Message,
        DatabaseFileGoneException gone => gone.Message,
        SqliteException { SqliteErrorCode: SqliteFull } => "the disk holding the incident log is full",
        _ => $"the incident log could not be written ({e.Message})",
    };
}
