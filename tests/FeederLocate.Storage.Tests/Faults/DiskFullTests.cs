using FeederLocate.Core.Model;
using FeederLocate.Storage.Events;
using Microsoft.Data.Sqlite;

namespace FeederLocate.Storage.Tests.Faults;

/// <summary>A write that finds the disk full fails loudly, logs nothing, and the store works again once there is room.</summary>
public class DiskFullTests
{
    private const int SqliteFull = 13; // SQLITE_FULL, sqlite.org/rescode.html
    private static readonly Actor Operator = new("duty-operator", "operator");

    [Fact]
    public void A_write_on_a_full_disk_throws_logs_nothing_and_the_store_recovers()
    {
        using var disk = SmallDisk.TryMount();
        using var elsewhere = new TempDatabase();
        var path = disk?.Path("history.db") ?? elsewhere.Path;
        using var store = IncidentStore.Open(path, TestClock.Manual());
        var id = store.OpenIncident(TestGrids.BrackenfoldName, TestIncidents.EarthFault(), Operator);
        string? filler = null;
        if (disk is not null)
        {
            filler = disk.Fill();
        }
        else
        {
            // Where no small disk can be mounted: SQLite's page limit gives the same SQLITE_FULL.
            Pragma(store, $"PRAGMA max_page_count = {Pragma(store, "PRAGMA page_count")}");
        }

        var error = Assert.Throws<SqliteException>(() => store.Append(id, Steps(), Operator));

        Assert.Equal(SqliteFull, error.SqliteErrorCode);
        Assert.Single(store.Events(id));
        if (filler is not null)
        {
            File.Delete(filler);
        }
        else
        {
            Pragma(store, "PRAGMA max_page_count = 1073741823");
        }

        store.Append(id, Steps(), Operator);
        Assert.Equal(Steps().Count + 1, store.Events(id).Count);
    }

    // Enough text to need new pages whatever the log's free space (about 400 kB).
    private static List<IncidentEvent> Steps() =>
        [.. Enumerable.Range(1, 40).Select(i => (IncidentEvent)new PlanStepCompleted(i, "open " + new string('x', 10_000), "SW1"))];

    private static long Pragma(IncidentStore store, string sql)
    {
        using var command = store.Connection.CreateCommand();
        command.CommandText = sql;
        return Convert.ToInt64(command.ExecuteScalar() ?? 0L, System.Globalization.CultureInfo.InvariantCulture);
    }
}
