namespace FeederLocate.Cli.Tests.Commands;

public sealed class SwitchesCommandTests : IDisposable
{
    private readonly TempDatabase _database = new();

    private string Db => _database.Path;

    private static string Incident(string name) => SampleGrids.IncidentPath(name);

    [Fact]
    public void Switches_shows_a_logged_incidents_tripped_device_open_and_every_other_device_normal()
    {
        var id = CliRun.Of("record", SampleGrids.Path("solid"), Incident("solid-lg-trip-a1"), "--segment", "S109", "--db", Db, "--json")
            .Json().GetProperty("incidentId").GetInt64();

        var run = CliRun.Of("switches", SampleGrids.Path("solid"), "--db", Db, "--incident", id.ToString(System.Globalization.CultureInfo.InvariantCulture), "--json");

        Assert.Equal(0, run.ExitCode);
        var deviations = run.Json().GetProperty("deviations").EnumerateObject().Select(p => (p.Name, p.Value.GetString())).ToList();
        Assert.Equal([("CB-A1", "open")], deviations);
        Assert.Equal("open", run.Json().GetProperty("positions").GetProperty("CB-A1").GetString());
    }

    [Fact]
    public void Switches_refuses_an_unknown_incident_and_one_of_another_grid()
    {
        CliRun.Of("record", SampleGrids.Path("solid"), Incident("solid-lg-trip-a1"), "--segment", "S109", "--db", Db);

        var unknown = CliRun.Of("switches", SampleGrids.Path("solid"), "--db", Db, "--incident", "42");
        var otherGrid = CliRun.Of("switches", SampleGrids.Path("isolated"), "--db", Db, "--incident", "1");

        Assert.Equal(2, unknown.ExitCode);
        Assert.Contains("--incident 42 is not an incident", unknown.Error, StringComparison.Ordinal);
        Assert.Equal(2, otherGrid.ExitCode);
        Assert.Contains("is on grid", otherGrid.Error, StringComparison.Ordinal);
    }

    public void Dispose() => _database.Dispose();
}
