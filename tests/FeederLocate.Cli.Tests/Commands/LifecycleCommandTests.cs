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
        var normal = Incident("normal", id, "--switch", "CB-A1");
        var closed = Incident("close", id, "--note", "back to normal");
        var reopenedByNobody = Incident("reopen", id, "--reason", "fault again");
        var reopened = TokenEnvironment.Run(eliToken, () => Incident("reopen", id, "--reason", "fault again", "--by", "eli"));

        var history = CliRun.Of("history", "--db", Db, "--json").Json().EnumerateArray().Single();

        Assert.Equal((0, 2, 2, 0, 2), (times.ExitCode, future.ExitCode, badStage.ExitCode, located.ExitCode, closeEarly.ExitCode));
        Assert.Contains("reclosedAt 2999-01-01T00:00:00Z is in the future", future.Error, StringComparison.Ordinal);
        Assert.Contains("--to must be located, isolated, restored or repaired, got \"fixed\"", badStage.Error, StringComparison.Ordinal);
        Assert.Contains($"log the outcome of incident {id} before closing it", closeEarly.Error, StringComparison.Ordinal);
        Assert.Equal((0, 0, 0, 2, 0), (repaired.ExitCode, normal.ExitCode, closed.ExitCode, reopenedByNobody.ExitCode, reopened.ExitCode));
        Assert.Equal("Open", history.GetProperty("status").GetString());
    }

    public void Dispose() => _database.Dispose();
}
