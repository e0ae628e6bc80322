namespace FeederLocate.Cli.Tests.Commands;

public sealed class SwitchesCommandTests : IDisposable
{
    private readonly string _folder = Directory.CreateTempSubdirectory("feederlocate-switches-").FullName;

    private string Db => Path.Combine(_folder, "history.db");

    private static string Incident(string name) => CliRun.Repo("sample-grid", "incidents", name);

    [Fact]
    public void Switches_shows_a_logged_incidents_tripped_device_open_and_every_other_device_normal()
    {
        var id = CliRun.Of("record", CliRun.Sample("solid"), Incident("solid-lg-trip-a1.incident.json"), "--segment", "S109", "--db", Db, "--json")
            .Json().GetProperty("incidentId").GetInt64();

        var run = CliRun.Of("switches", CliRun.Sample("solid"), "--db", Db, "--incident", id.ToString(System.Globalization.CultureInfo.InvariantCulture), "--json");

        Assert.Equal(0, run.ExitCode);
        var deviations = run.Json().GetProperty("deviations").EnumerateObject().Select(p => (p.Name, p.Value.GetString())).ToList();
        Assert.Equal([("CB-A1", "open")], deviations);
        Assert.Equal("open", run.Json().GetProperty("positions").GetProperty("CB-A1").GetString());
    }

    [Fact]
    public void Switches_refuses_an_unknown_incident_and_one_of_another_grid()
    {
        CliRun.Of("record", CliRun.Sample("solid"), Incident("solid-lg-trip-a1.incident.json"), "--segment", "S109", "--db", Db);

        var unknown = CliRun.Of("switches", CliRun.Sample("solid"), "--db", Db, "--incident", "42");
        var otherGrid = CliRun.Of("switches", CliRun.Sample("isolated"), "--db", Db, "--incident", "1");

        Assert.Equal(2, unknown.ExitCode);
        Assert.Contains("--incident 42 is not an incident", unknown.Error, StringComparison.Ordinal);
        Assert.Equal(2, otherGrid.ExitCode);
        Assert.Contains("is on grid", otherGrid.Error, StringComparison.Ordinal);
    }

    public void Dispose()
    {
        Microsoft.Data.Sqlite.SqliteConnection.ClearAllPools();
        Directory.Delete(_folder, recursive: true);
    }
}
