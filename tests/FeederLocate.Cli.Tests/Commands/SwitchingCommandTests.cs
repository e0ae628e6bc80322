using System.Globalization;
using FeederLocate.Core.Formats;
using FeederLocate.Storage.Events;

namespace FeederLocate.Cli.Tests.Commands;

[Collection(TokenEnvironment.Name)]
public sealed class SwitchingCommandTests : IDisposable
{
    private readonly TempDatabase _database = new();

    private string Db => _database.Path;

    /// <summary>Opens the resonant demo incident in the database (left open), as the page or the HTTP interface would.</summary>
    private string OpenResonant()
    {
        var grid = SampleGrids.Grid("resonant");
        var incident = IncidentReader.Parse(File.ReadAllText(SampleGrids.IncidentPath("resonant-standing-earth-fault-b1")), grid).ValueOrThrow();
        using var log = new Application.Incidents.IncidentLog(Storage.IncidentStore.Open(Db));
        return log.Open(grid, incident, new Actor("ana", "operator")).Value.ToString(CultureInfo.InvariantCulture);
    }

    private CliRun Switching(string verb, string id, params string[] rest) =>
        CliRun.Of(["switching", verb, SampleGrids.Path("resonant"), "--db", Db, "--incident", id, .. rest]);

    [Fact]
    public void Tick_takes_the_steps_in_order_refuses_one_out_of_order_with_the_reason_and_correct_withdraws_one()
    {
        var id = OpenResonant();
        var ticks = Enumerable.Range(1, 4).Select(n => Switching("tick", id, "--step", n.ToString(CultureInfo.InvariantCulture))).ToList();

        var early = Switching("tick", id, "--step", "6");
        var corrected = Switching("correct", id, "--step", "4", "--reason", "crew had not reported yet", "--json");
        var notTicked = Switching("correct", id, "--step", "9", "--reason", "wrong");
        var switches = CliRun.Of("switches", SampleGrids.Path("resonant"), "--db", Db, "--incident", id, "--json");

        Assert.All(ticks, t => Assert.Equal(0, t.ExitCode));
        Assert.Contains("step 1 ticked", ticks[0].Out, StringComparison.Ordinal);
        Assert.Equal(2, early.ExitCode);
        Assert.Equal("error: refused: step 5 (open FU-B1-2) is not done yet: the steps are carried out in order", early.Error.Trim());
        Assert.Equal(0, corrected.ExitCode);
        Assert.True(corrected.Json().GetProperty("logged").GetBoolean());
        Assert.Equal(2, notTicked.ExitCode);
        Assert.Contains("step 9 is not ticked", notTicked.Error, StringComparison.Ordinal);
        // Step 4 opened RC-B1-1 (after the search-first note and two crews sent); withdrawn, the recloser is back to its normal position.
        Assert.Equal("closed", switches.Json().GetProperty("positions").GetProperty("RC-B1-1").GetString());
    }

    [Fact]
    public void Deviate_needs_an_engineer_and_logs_the_position_found_moves_a_switch_and_bad_names_are_refused()
    {
        var id = OpenResonant();
        string anaToken, eliToken;
        using (var accounts = Storage.Accounts.AccountStore.Open(Db))
        {
            accounts.Create("ana", "Ana Field", Storage.Accounts.AccountRole.Operator, "unused-hash", false, null, "admin");
            accounts.Create("eli", "Eli Grade", Storage.Accounts.AccountRole.Engineer, "unused-hash", false, null, "admin");
            anaToken = accounts.IssueToken("ana", "laptop", "admin").Secret;
            eliToken = accounts.IssueToken("eli", "desk", "admin").Secret;
        }

        var noAccount = Switching("deviate", id, "--switch", "NO-A1-B1", "--position", "closed", "--reason", "feed the tail");
        var byOperator = TokenEnvironment.Run(anaToken, () => Switching("deviate", id, "--switch", "NO-A1-B1", "--position", "closed", "--reason", "feed the tail", "--by", "ana"));
        var withoutToken = Switching("deviate", id, "--switch", "NO-A1-B1", "--position", "closed", "--reason", "feed the tail", "--by", "eli");
        var byEngineer = TokenEnvironment.Run(eliToken, () => Switching("deviate", id, "--switch", "NO-A1-B1", "--position", "closed", "--reason", "feed the tail", "--by", "eli"));
        var found = TokenEnvironment.Run(anaToken, () => Switching("found", id, "--switch", "LB-B1-3", "--position", "open", "--by", "ana"));
        var unknown = Switching("found", id, "--switch", "LB-ZZ", "--position", "open");
        var badPosition = Switching("found", id, "--switch", "LB-B1-3", "--position", "ajar");
        var switches = CliRun.Of("switches", SampleGrids.Path("resonant"), "--db", Db, "--incident", id, "--json").Json().GetProperty("positions");

        Assert.Equal((2, 2, 0, 0, 2, 2), (noAccount.ExitCode, byOperator.ExitCode, byEngineer.ExitCode, found.ExitCode, unknown.ExitCode, badPosition.ExitCode));
        Assert.Contains("needs --by naming an engineer's account", noAccount.Error, StringComparison.Ordinal);
        Assert.Contains("--by \"ana\" is an operator", byOperator.Error, StringComparison.Ordinal);
        Assert.Equal(2, withoutToken.ExitCode);
        Assert.Contains("needs one of that account's API tokens", withoutToken.Error, StringComparison.Ordinal);
        Assert.Contains("--switch \"LB-ZZ\" is not a switching device", unknown.Error, StringComparison.Ordinal);
        Assert.Contains("--position must be open or closed, got \"ajar\"", badPosition.Error, StringComparison.Ordinal);
        Assert.Equal("closed", switches.GetProperty("NO-A1-B1").GetString());
        Assert.Equal("open", switches.GetProperty("LB-B1-3").GetString());
    }

    public void Dispose() => _database.Dispose();
}
