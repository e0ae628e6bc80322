namespace FeederLocate.Cli.Tests.Commands;

public sealed class HistoryCommandTests : IDisposable
{
    private readonly TempDatabase _db = new();

    private string Db => _db.Path;

    private static string Incident(string name) => RepositoryFiles.Path("sample-grid", "incidents", name);

    [Fact]
    public void Record_creates_the_database_and_history_lists_the_outcome()
    {
        var record = CliRun.Of("record", SampleGrids.Path("solid"), Incident("solid-lg-trip-a1.incident.json"), "--segment", "S109", "--db", Db, "--json");
        var history = CliRun.Of("history", "--db", Db, "--json");

        Assert.Equal(0, record.ExitCode);
        Assert.True(record.Json().GetProperty("incidentId").GetInt64() > 0);
        Assert.Equal(0, history.ExitCode);
        var first = history.Json().EnumerateArray().Single();
        Assert.Equal("S109", first.GetProperty("confirmedSegment").GetString());
    }

    [Fact]
    public void Record_names_the_account_given_with_by_and_refuses_one_that_may_not_log()
    {
        using (var accounts = Storage.Accounts.AccountStore.Open(Db))
        {
            accounts.Create("ana", "Ana Field", Storage.Accounts.AccountRole.Operator, "unused-hash", false, null, "admin");
            accounts.Create("vera", "Vera", Storage.Accounts.AccountRole.Viewer, "unused-hash", false, null, "admin");
        }

        var byOperator = CliRun.Of("record", SampleGrids.Path("solid"), Incident("solid-lg-trip-a1.incident.json"), "--segment", "S109", "--db", Db, "--by", "ana", "--json");
        var byViewer = CliRun.Of("record", SampleGrids.Path("solid"), Incident("solid-lg-trip-a1.incident.json"), "--segment", "S109", "--db", Db, "--by", "vera");
        var byNobody = CliRun.Of("record", SampleGrids.Path("solid"), Incident("solid-lg-trip-a1.incident.json"), "--segment", "S109", "--db", Db, "--by", "nobody");
        var byDefault = CliRun.Of("record", SampleGrids.Path("solid"), Incident("solid-lg-trip-a1.incident.json"), "--segment", "S109", "--db", Db, "--json");

        Assert.Equal((0, 2, 2, 0), (byOperator.ExitCode, byViewer.ExitCode, byNobody.ExitCode, byDefault.ExitCode));
        Assert.Contains("--by \"vera\" is a viewer", byViewer.Error, StringComparison.Ordinal);
        Assert.Contains("--by \"nobody\" is not an account", byNobody.Error, StringComparison.Ordinal);
        using var store = Storage.IncidentStore.Open(Db);
        var incidents = store.Incidents();
        Assert.Equal(2, incidents.Count);
        Assert.All(store.Events(incidents[0].Id), e => Assert.Equal(new Storage.Events.Actor("ana", "operator"), e.Actor));
        Assert.All(store.Events(incidents[1].Id), e => Assert.Equal(new Storage.Events.Actor($"cli:{Environment.UserName}", "system"), e.Actor));
    }

    [Fact]
    public void Rank_with_the_database_uses_recorded_outcomes()
    {
        // Ten outcomes on S109 make its learned fault rate, and so its prior, higher than without history.
        for (var i = 0; i < 10; i++)
        {
            Assert.Equal(0, CliRun.Of("record", SampleGrids.Path("solid"), Incident("solid-lg-trip-a1.incident.json"), "--segment", "S109", "--db", Db).ExitCode);
        }

        var without = CliRun.Of("rank", SampleGrids.Path("solid"), Incident("solid-lg-trip-a1.incident.json"), "--json");
        var with = CliRun.Of("rank", SampleGrids.Path("solid"), Incident("solid-lg-trip-a1.incident.json"), "--db", Db, "--json");
        var stats = CliRun.Of("stats", SampleGrids.Path("solid"), "--db", Db, "--json");

        Assert.Equal(0, with.ExitCode);
        double P(CliRun run) => run.Json().GetProperty("segments").EnumerateArray().Single(s => s.GetProperty("id").GetString() == "S109").GetProperty("probability").GetDouble();
        Assert.True(P(with) > P(without), $"S109: {P(with)} with history, {P(without)} without");
        Assert.Equal(10, stats.Json().GetProperty("outcomes").GetInt32());
        var s109 = stats.Json().GetProperty("segments").EnumerateArray().First();
        Assert.Equal("S109", s109.GetProperty("id").GetString());
        Assert.Equal(10, s109.GetProperty("faults").GetInt32());
    }

    [Fact]
    public void Backup_and_integrity_check_and_csv_export_work_on_a_recorded_database()
    {
        CliRun.Of("record", SampleGrids.Path("isolated"), Incident("isolated-standing-earth-fault-a2.incident.json"), "--segment", "S207", "--cause", "tree, after storm", "--db", Db);
        var copy = _db.Sibling("copy.db");

        var backup = CliRun.Of("backup", "--db", Db, "--output", copy);
        var integrity = CliRun.Of("integrity", "--db", copy, "--json");
        var csv = CliRun.Of("export", "--db", copy, "--what", "incidents");

        Assert.Equal(0, backup.ExitCode);
        Assert.Equal(0, integrity.ExitCode);
        Assert.Equal(0, integrity.Json().GetProperty("problems").GetArrayLength());
        Assert.Contains("S207", csv.Out, StringComparison.Ordinal);
        Assert.Contains("\"tree, after storm\"", csv.Out, StringComparison.Ordinal);
    }

    [Fact]
    public void Record_on_an_unknown_segment_is_bad_input_and_writes_nothing()
    {
        var run = CliRun.Of("record", SampleGrids.Path("solid"), Incident("solid-lg-trip-a1.incident.json"), "--segment", "S999", "--db", Db);

        Assert.Equal(2, run.ExitCode);
        Assert.Contains("--segment \"S999\" is not a segment", run.Error, StringComparison.Ordinal);
        Assert.False(File.Exists(Db));
    }

    [Fact]
    public void Learning_curve_reports_each_point_and_the_truth()
    {
        var run = CliRun.Of("evaluate", SampleGrids.Path("solid"), "--learning", "--incidents", "20", "--test-incidents", "20", "--seed", "2", "--json");

        Assert.Equal(0, run.ExitCode);
        var json = run.Json();
        var curve = json.GetProperty("curve").EnumerateArray().Select(p => p.GetProperty("outcomes").GetInt32()).ToList();
        Assert.Equal([0, 10, 20], curve);
        Assert.InRange(json.GetProperty("truthSectionTop1").GetDouble(), 0, 1);
    }

    public void Dispose() => _db.Dispose();
}

public sealed class PlanWithHistoryTests : IDisposable
{
    private readonly TempDatabase _db = new();

    [Fact]
    public void Plan_with_the_database_isolates_the_section_the_learned_ranking_puts_first()
    {
        var db = _db.Path;
        var grid = SampleGrids.Path("solid");
        var incident = RepositoryFiles.Path("sample-grid", "incidents", "solid-lg-trip-a1.incident.json");
        for (var i = 0; i < 3; i++)
        {
            Assert.Equal(0, CliRun.Of("record", grid, incident, "--segment", "S109", "--db", db).ExitCode);
        }

        var rank = CliRun.Of("rank", grid, incident, "--db", db, "--json");
        var plan = CliRun.Of("plan", grid, incident, "--db", db, "--json");

        Assert.Equal(0, plan.ExitCode);
        var top = rank.Json().GetProperty("sections")[0].GetProperty("id").GetString();
        Assert.Equal(top, plan.Json().GetProperty("isolatedSections")[0].GetString());
    }

    public void Dispose() => _db.Dispose();
}
