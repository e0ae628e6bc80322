using FeederLocate.Storage.Events;
using FeederLocate.Storage.Tests.Support;
using Microsoft.Data.Sqlite;

namespace FeederLocate.Storage.Tests.Maintenance;

public class AppendOnlyTests
{
    [Theory]
    [InlineData("UPDATE events SET actor = 'someone else'", "events are append-only")]
    [InlineData("DELETE FROM events", "events are append-only")]
    [InlineData("UPDATE incidents SET grid_name = 'other'", "incidents are append-only")]
    [InlineData("DELETE FROM incidents", "incidents are append-only")]
    public void Changing_or_removing_logged_rows_fails(string sql, string message)
    {
        using var db = new TempDatabase();
        using (var store = IncidentStore.Open(db.Path))
        {
            store.OpenIncident(TestGrids.BrackenfoldName, TestIncidents.EarthFault(), new Actor("cli"));
        }

        using var raw = RawDatabase.Open(db.Path);
        var error = Assert.Throws<SqliteException>(() => RawDatabase.Execute(raw, sql));

        Assert.Contains(message, error.Message, StringComparison.Ordinal);
        Assert.Equal(1, RawDatabase.Long(raw, "SELECT COUNT(*) FROM events WHERE actor = 'cli'"));
        Assert.Equal(1, RawDatabase.Long(raw, "SELECT COUNT(*) FROM incidents WHERE grid_name = $grid", ("$grid", TestGrids.BrackenfoldName)));
    }
}
