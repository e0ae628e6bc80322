using System.Globalization;
using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;
using FeederLocate.Storage.Events;

namespace FeederLocate.Cli.Tests.Commands;

[Collection(TokenEnvironment.Name)]
public sealed class LifecycleCommandTests : IDisposable
{
    private readonly TempDatabase _database = new();

    private string Db => _database.Path;

    private string OpenTrip()
    {
        var grid = SampleGrids.Grid("solid");
        using var log = new Application.Incidents.IncidentLog(Storage.IncidentStore.Open(Db));
        var id = log.Open(grid, new SwitchId("CB-A1"), FaultType.LG, new DateTimeOffset(2026, 11, 30, 6, 12, 0, TimeSpan.Zero), new Actor("ana", "operator"));
        return id.Value.ToString(CultureInfo.InvariantCulture);
    }

    private CliRun Incident(string verb, string id, params string[] rest) =>
        CliRun.Of(["incident", verb, SampleGrids.Path("solid"), "--db", Db, "--incident", id, .. rest]);

    [Fact]
    public void An_incident_is_worked_from_open_to_closed_and_reopened_by_an_engineer_with_every_refusal_explained()
    {
        var id = OpenTrip();
        string eliToken;
        using (var accounts = Storage.Accounts.AccountStore.Open(Db))
        {
            accounts.Create("eli", "Eli Grade", Storage.Accounts.AccountRole.Engineer, "unused-hash", false, null, "admin");
            eliToken = accounts.IssueToken("eli", "desk", "admin").Secret;
        }

        var times = Incident("times", id, "--fault-at", "2026-11-30T06:11:40Z", "--tripped-at", "2026-11-30T06:11:40.2Z");
        var future = Incident("times", id, "--reclosed-at", "2999-01-01T00:00:00Z");
        var badStage = Incident("stage", id, "--to", "fixed");
        var located = Incident("stage", id, "--to", "located");
        var closeEarly = Incident("close", id);
        using (var log = new Application.Incidents.IncidentLog(Storage.IncidentStore.Open(Db)))
        {
            log.Append(new Storage.Incidents.IncidentId(long.Parse(id, CultureInfo.InvariantCulture)), new OutcomeLogged(new SegmentId("S109"), FaultType.LG), new Actor("ana", "operator"));
        }

        var repaired = Incident("stage", id, "--to", "repaired");
        var outOfOrder = Incident("return", id, "--step", "2");
        var returned = new List<CliRun>();
        for (var step = 1; step <= 10; step++)
        {
            var run = Incident("return", id, "--step", step.ToString(CultureInfo.InvariantCulture));
            returned.Add(run);
            if (run.ExitCode != 0)
            {
                break;
            }
        }

        var closed = Incident("close", id, "--note", "back to normal");
        var reopenedByNobody = Incident("reopen", id, "--reason", "fault again");
        var reopened = TokenEnvironment.Run(eliToken, () => Incident("reopen", id, "--reason", "fault again", "--by", "eli"));

        var history = CliRun.Of("history", "--db", Db, "--json").Json().EnumerateArray().Single();

        Assert.Equal((0, 2, 2, 0, 2), (times.ExitCode, future.ExitCode, badStage.ExitCode, located.ExitCode, closeEarly.ExitCode));
        Assert.Contains("reclosedAt 2999-01-01T00:00:00Z is in the future", future.Error, StringComparison.Ordinal);
        Assert.Contains("--to must be located, isolated, restored or repaired, got \"fixed\"", badStage.Error, StringComparison.Ordinal);
        Assert.Contains($"log the outcome of incident {id} before closing it", closeEarly.Error, StringComparison.Ordinal);
        Assert.Equal(2, outOfOrder.ExitCode);
        Assert.Contains("return step 1 (", outOfOrder.Error, StringComparison.Ordinal);
        // Every step of the return order ticks, then the next number is refused as outside it.
        Assert.True(returned.Count >= 2);
        Assert.All(returned.SkipLast(1), r => Assert.Equal(0, r.ExitCode));
        Assert.Contains($"is not a step of the return order (steps 1 to {returned.Count - 1})", returned[^1].Error, StringComparison.Ordinal);
        Assert.Equal((0, 0, 2, 0), (repaired.ExitCode, closed.ExitCode, reopenedByNobody.ExitCode, reopened.ExitCode));
        Assert.Equal("Open", history.GetProperty("status").GetString());
    }

    [Fact]
    public void Record_logs_a_no_fault_found_or_transient_outcome_and_refuses_a_segment_with_it()
    {
        var grid = SampleGrids.Path("solid");
        var incident = SampleGrids.IncidentPath("solid-lg-trip-a1");
        var none = CliRun.Of("record", grid, incident, "--no-fault-found", "--db", Db, "--json");
        var transient = CliRun.Of("record", grid, incident, "--transient", "--cause", "bird contact, cleared", "--db", Db);
        var both = CliRun.Of("record", grid, incident, "--transient", "--segment", "S109", "--db", Db);
        var neither = CliRun.Of("record", grid, incident, "--db", Db);
        var history = CliRun.Of("history", "--db", Db, "--json").Json().EnumerateArray().ToList();

        Assert.Equal((0, 0, 2, 2), (none.ExitCode, transient.ExitCode, both.ExitCode, neither.ExitCode));
        Assert.True(none.Json().GetProperty("noFaultFound").GetBoolean());
        Assert.Contains("no fault found (transient)", transient.Out, StringComparison.Ordinal);
        Assert.Contains("give one of them", both.Error, StringComparison.Ordinal);
        Assert.Contains("--no-fault-found or --transient", neither.Error, StringComparison.Ordinal);
        Assert.Equal(2, history.Count);
        Assert.All(history, h => Assert.True(h.GetProperty("noFaultFound").GetBoolean()));
        Assert.Equal([false, true], history.Select(h => h.GetProperty("transient").GetBoolean()));
        // Counted as a fault on no segment: the learning has no outcome to learn from.
        var stats = CliRun.Of("stats", grid, "--db", Db);
        Assert.Equal(0, stats.ExitCode);
    }

    [Fact]
    public void Handover_lists_each_open_incident_with_what_is_off_and_the_next_step()
    {
        var id = OpenTrip();
        var text = CliRun.Of("handover", SampleGrids.Path("solid"), "--db", Db);
        var json = CliRun.Of("handover", SampleGrids.Path("solid"), "--db", Db, "--json").Json();

        Assert.Equal(0, text.ExitCode);
        Assert.Contains($"Incident {id} on ", text.Out, StringComparison.Ordinal);
        Assert.Contains("next step: 1. ", text.Out, StringComparison.Ordinal);
        Assert.Contains("Advice only", text.Out, StringComparison.Ordinal);
        var entry = json.GetProperty("incidents").EnumerateArray().Single();
        Assert.Equal(long.Parse(id, CultureInfo.InvariantCulture), entry.GetProperty("id").GetInt64());
        Assert.Equal("open", entry.GetProperty("stage").GetString());
        Assert.True(entry.GetProperty("customersOff").GetInt32() > 0);
        Assert.Equal(entry.GetProperty("customersOff").GetInt32(), entry.GetProperty("sectionsOff").EnumerateArray().Sum(s => s.GetProperty("customers").GetInt32()));
        Assert.StartsWith("A1", entry.GetProperty("sectionsOff")[0].GetProperty("name").GetString(), StringComparison.Ordinal);
        Assert.NotEmpty(entry.GetProperty("unreadIndicators").EnumerateArray());
    }

    [Fact]
    public void Handover_names_a_switch_whose_recorded_position_the_evidence_doubts()
    {
        // The back-fed sample incident (sample-grid/README.md) without the tie's closing in the record.
        var grid = SampleGrids.Grid("solid");
        var ana = new Actor("ana", "operator");
        using (var log = new Application.Incidents.IncidentLog(Storage.IncidentStore.Open(Db)))
        {
            var id = log.Open(grid, new SwitchId("RC-B1-1"), FaultType.LL, new DateTimeOffset(2026, 11, 30, 6, 12, 0, TimeSpan.Zero), ana);
            log.Append(id, new SwitchStateChanged(new SwitchId("LB-A1-4"), SwitchPosition.Open), ana);
            foreach (var (indicator, state) in new[] { ("FPI-B1-01", IndicatorState.Forward), ("FPI-B1-04", IndicatorState.Fault), ("FPI-A1-16", IndicatorState.Forward), ("FPI-A1-14", IndicatorState.None), ("FPI-B1-11", IndicatorState.Forward), ("FPI-B1-14", IndicatorState.None) })
            {
                log.Append(id, new IndicationEntered(new Indication(new IndicatorId(indicator), state, IndicationSource.Remote)), ana);
            }
        }

        var text = CliRun.Of("handover", SampleGrids.Path("solid"), "--db", Db);
        var json = CliRun.Of("handover", SampleGrids.Path("solid"), "--db", Db, "--json").Json();

        Assert.Contains("switch position in doubt: NO-A1-B1 probably closed (", text.Out, StringComparison.Ordinal);
        var suspect = json.GetProperty("incidents").EnumerateArray().Single().GetProperty("switchSuspects").EnumerateArray().Single();
        Assert.Equal(("NO-A1-B1", "closed"), (suspect.GetProperty("device").GetString(), suspect.GetProperty("state").GetString()));
    }

    public void Dispose() => _database.Dispose();
}
