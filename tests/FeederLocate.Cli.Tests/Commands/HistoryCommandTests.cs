namespace FeederLocate.Cli.Tests.Commands;

[Collection(TokenEnvironment.Name)]
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
    public void History_names_the_confirmed_segment_by_its_section_when_its_grid_is_given()
    {
        Assert.Equal(0, CliRun.Of("record", SampleGrids.Path("solid"), Incident("solid-lg-trip-a1.incident.json"), "--segment", "S109", "--db", Db).ExitCode);
        var name = FeederLocate.Application.Naming.GridNames.Segments(new FeederLocate.Core.Topology.NetworkGraph(SampleGrids.Grid("solid")))[new FeederLocate.Core.Model.SegmentId("S109")];

        var named = CliRun.Of("history", "--db", Db, "--grid", SampleGrids.Path("solid"));
        var plain = CliRun.Of("history", "--db", Db);
        var json = CliRun.Of("history", "--db", Db, "--grid", SampleGrids.Path("solid"), "--json");

        Assert.Equal(0, named.ExitCode);
        Assert.Contains($"{name} (S109)", named.Out, StringComparison.Ordinal);
        Assert.DoesNotContain(name, plain.Out, StringComparison.Ordinal);
        Assert.Equal("S109", json.Json().EnumerateArray().Single().GetProperty("confirmedSegment").GetString());
    }

    [Fact]
    public void Record_names_the_account_given_with_by_only_with_one_of_its_tokens()
    {
        string anaToken, veraToken;
        using (var accounts = Storage.Accounts.AccountStore.Open(Db))
        {
            accounts.Create("ana", "Ana Field", Storage.Accounts.AccountRole.Operator, "unused-hash", false, null, "admin");
            accounts.Create("vera", "Vera", Storage.Accounts.AccountRole.Viewer, "unused-hash", false, null, "admin");
            anaToken = accounts.IssueToken("ana", "laptop", "admin").Secret;
            veraToken = accounts.IssueToken("vera", "wall", "admin").Secret;
        }

        string[] Record(string by) => ["record", SampleGrids.Path("solid"), Incident("solid-lg-trip-a1.incident.json"), "--segment", "S109", "--db", Db, "--by", by, "--json"];

        var noToken = TokenEnvironment.Run(null, Record("ana"));
        var othersToken = TokenEnvironment.Run(veraToken, Record("ana"));
        var byOperator = TokenEnvironment.Run(anaToken, Record("ana"));
        var byViewer = TokenEnvironment.Run(veraToken, Record("vera"));
        var byNobody = TokenEnvironment.Run(anaToken, Record("nobody"));
        var byDefault = CliRun.Of("record", SampleGrids.Path("solid"), Incident("solid-lg-trip-a1.incident.json"), "--segment", "S109", "--db", Db, "--json");

        Assert.Equal((2, 2, 0, 2, 2, 0), (noToken.ExitCode, othersToken.ExitCode, byOperator.ExitCode, byViewer.ExitCode, byNobody.ExitCode, byDefault.ExitCode));
        Assert.Contains("needs one of that account's API tokens in the environment variable FEEDERLOCATE_TOKEN", noToken.Error, StringComparison.Ordinal);
        Assert.Contains("is not a live API token of account \"ana\"", othersToken.Error, StringComparison.Ordinal);
        Assert.Contains("--by \"vera\" is a viewer", byViewer.Error, StringComparison.Ordinal);
        Assert.Contains("is not a live API token of account \"nobody\"", byNobody.Error, StringComparison.Ordinal);
        using var store = Storage.IncidentStore.Open(Db);
        var incidents = store.Incidents();
        Assert.Equal(2, incidents.Count);
        Assert.All(store.Events(incidents[0].Id), e => Assert.Equal(new Storage.Events.Actor("ana", "operator"), e.Actor));
        Assert.All(store.Events(incidents[1].Id), e => Assert.Equal(new Storage.Events.Actor($"cli:{Environment.UserName}", "system"), e.Actor));
    }

    [Fact]
    public void Retract_withdraws_an_outcome_only_for_an_engineer_proven_by_a_token_and_the_learning_leaves_it_out()
    {
        string engineerToken, operatorToken;
        using (var accounts = Storage.Accounts.AccountStore.Open(Db))
        {
            accounts.Create("eli", "Eli", Storage.Accounts.AccountRole.Engineer, "unused-hash", false, null, "admin");
            accounts.Create("ana", "Ana Field", Storage.Accounts.AccountRole.Operator, "unused-hash", false, null, "admin");
            engineerToken = accounts.IssueToken("eli", "desk", "admin").Secret;
            operatorToken = accounts.IssueToken("ana", "laptop", "admin").Secret;
        }

        Assert.Equal(0, CliRun.Of("record", SampleGrids.Path("solid"), Incident("solid-lg-trip-a1.incident.json"), "--segment", "S109", "--db", Db).ExitCode);
        string[] Retract(string by) => ["retract", "--db", Db, "--incident", "1", "--reason", "crew found the fault on S108", "--by", by, "--json"];

        var noToken = TokenEnvironment.Run(null, Retract("eli"));
        var byOperator = TokenEnvironment.Run(operatorToken, Retract("ana"));
        var byEngineer = TokenEnvironment.Run(engineerToken, Retract("eli"));
        var again = TokenEnvironment.Run(engineerToken, Retract("eli"));
        var stats = CliRun.Of("stats", SampleGrids.Path("solid"), "--db", Db, "--json");
        var missing = TokenEnvironment.Run(engineerToken, ["retract", "--db", Db + ".typo", "--incident", "1", "--reason", "x", "--by", "eli"]);

        Assert.Equal((2, 2, 0, 2, 2), (noToken.ExitCode, byOperator.ExitCode, byEngineer.ExitCode, again.ExitCode, missing.ExitCode));
        Assert.Contains("--by \"ana\" is an operator; retracting an outcome needs an engineer", byOperator.Error, StringComparison.Ordinal);
        Assert.Equal("S109", byEngineer.Json().GetProperty("retractedSegment").GetString());
        Assert.Contains("nothing to retract", again.Error, StringComparison.Ordinal);
        Assert.Equal(0, stats.Json().GetProperty("outcomes").GetInt32());
        Assert.False(File.Exists(Db + ".typo"));
        using var store = Storage.IncidentStore.Open(Db);
        Assert.Equal(["incidentOpened", "outcomeLogged", "incidentClosed", "outcomeRetracted"], store.Events(new Storage.Incidents.IncidentId(1)).Select(e => e.Kind));
        Assert.Equal(new Storage.Events.Actor("eli", "engineer"), store.Events(new Storage.Incidents.IncidentId(1))[^1].Actor);
    }

    [Fact]
    public void An_outcome_logged_on_a_loop_before_loops_were_refused_is_named_and_rank_plan_and_stats_go_on()
    {
        var grid = SampleGrids.Grid("solid");
        var evidence = Core.Formats.IncidentReader.Parse(File.ReadAllText(Incident("solid-lg-trip-a1.incident.json")), grid).ValueOrThrow();
        using (var store = Storage.IncidentStore.Open(Db))
        {
            // Written without the grid, as the log was before such evidence was refused: NO-A1-A2 closes a loop.
            var id = store.OpenIncident(grid.Name, evidence, new Storage.Events.Actor("old", "operator"));
            store.Append(id, new Storage.Events.SwitchStateChanged(new Core.Model.SwitchId("NO-A1-A2"), Core.Evidence.SwitchPosition.Closed), new Storage.Events.Actor("old", "operator"));
            store.Append(id, new Storage.Events.OutcomeLogged(new Core.Model.SegmentId("S109")), new Storage.Events.Actor("old", "operator"));
        }

        Assert.Equal(0, CliRun.Of("record", SampleGrids.Path("solid"), Incident("solid-lg-trip-a1.incident.json"), "--segment", "S108", "--db", Db).ExitCode);
        var rank = CliRun.Of("rank", SampleGrids.Path("solid"), Incident("solid-lg-trip-a1.incident.json"), "--db", Db, "--json");
        var plan = CliRun.Of("plan", SampleGrids.Path("solid"), Incident("solid-lg-trip-a1.incident.json"), "--db", Db, "--json");
        var stats = CliRun.Of("stats", SampleGrids.Path("solid"), "--db", Db, "--json");

        Assert.Equal((0, 0, 0), (rank.ExitCode, plan.ExitCode, stats.ExitCode));
        Assert.Contains("warning: incident 1: outcome on S109 not learned from", rank.Error, StringComparison.Ordinal);
        Assert.Contains("radial", rank.Error, StringComparison.Ordinal);
        Assert.Equal(1, stats.Json().GetProperty("outcomes").GetInt32());
        var skipped = stats.Json().GetProperty("notLearnedFrom").EnumerateArray().Single();
        Assert.Equal((1, "S109"), (skipped.GetProperty("incidentId").GetInt64(), skipped.GetProperty("confirmedSegment").GetString()));
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
        // The chosen prior strengths: per line type with history, chosen by the data within its bounds.
        var type = stats.Json().GetProperty("lineTypes").EnumerateArray().Single(t => t.GetProperty("faults").GetInt32() == 10).GetProperty("prior");
        Assert.True(type.GetProperty("chosenByData").GetBoolean());
        Assert.InRange(type.GetProperty("strengthKmYears").GetDouble(), type.GetProperty("boundsKmYears")[0].GetDouble(), type.GetProperty("boundsKmYears")[1].GetDouble());
        Assert.NotEmpty(stats.Json().GetProperty("indicatorKinds").EnumerateArray());
        // Ten records of the breaker's current at the confirmed fault: enough for a learned relative error.
        var phase = stats.Json().GetProperty("recordRatios").EnumerateArray().Single(r => r.GetProperty("quantity").GetString() == "phase current");
        Assert.Equal(10, phase.GetProperty("records").GetInt32());
        Assert.True(phase.GetProperty("relativeError").GetDouble() >= 0);
        var text = CliRun.Of("stats", SampleGrids.Path("solid"), "--db", Db);
        Assert.Contains("prior strength km·years", text.Out, StringComparison.Ordinal);
        Assert.Contains("learned relative error", text.Out, StringComparison.Ordinal);
        // The text names S109 as operators do, by its section's feeder and bounding devices; the id stays beside it and in the JSON.
        var graph = new FeederLocate.Core.Topology.NetworkGraph(SampleGrids.Grid("solid"));
        var name = FeederLocate.Application.Naming.GridNames.Segments(graph)[new FeederLocate.Core.Model.SegmentId("S109")];
        Assert.NotEqual("S109", name);
        Assert.Contains(name, text.Out, StringComparison.Ordinal);
        Assert.DoesNotContain("E+", text.Out, StringComparison.Ordinal);
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
        var last = json.GetProperty("curve")[2];
        Assert.True(last.GetProperty("observationYears").GetDouble() > 0);
        Assert.InRange(last.GetProperty("hotSegmentOutcomes").GetInt32(), 0, 20);
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
