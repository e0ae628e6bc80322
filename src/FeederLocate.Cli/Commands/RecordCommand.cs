using System.CommandLine;
using FeederLocate.Cli.Input;
using FeederLocate.Cli.Output;
using FeederLocate.Core.Model;
using FeederLocate.Storage.Accounts;
using FeederLocate.Storage.Events;

namespace FeederLocate.Cli.Commands;

/// <summary><c>record GRID INCIDENT --segment ID --db FILE</c>: logs an incident with its confirmed fault location.</summary>
internal static class RecordCommand
{
    /// <summary>The environment variable holding an API token of the account named with --by.</summary>
    public const string TokenVariable = ProvenAccount.TokenVariable;

    public static Command Create(CliConsole console)
    {
        var grid = CliOptions.Grid();
        var incident = CliOptions.Incident();
        var segment = new Option<string>("--segment") { Description = "The segment where the fault was confirmed", Required = true };
        var cause = new Option<string?>("--cause") { Description = "What caused the fault (free text)" };
        var db = CliOptions.Database(required: true);
        var by = new Option<string?>("--by")
        {
            Description = "The account logging it (an enabled operator or engineer of the database), proven by one of its API tokens in the "
                + $"environment variable {TokenVariable}; default: the machine's user, as cli:NAME",
        };
        var json = CliOptions.Json();
        var command = new Command("record", "Log an incident and where its fault was confirmed, so the next ranking learns") { grid, incident, segment, cause, db, by, json };
        command.SetAction(parse => Run(console, parse.GetValue(grid)!, parse.GetValue(incident)!, parse.GetValue(segment)!, parse.GetValue(cause), parse.GetValue(db)!, parse.GetValue(by), parse.GetValue(json)));
        return command;
    }

    private static int Run(CliConsole console, string gridPath, string incidentPath, string segmentId, string? cause, string dbPath, string? by, bool json)
    {
        var grid = InputFiles.LoadGrid(gridPath, console.Error);
        var incident = InputFiles.LoadIncident(incidentPath, grid, console.Error);
        var segment = new SegmentId(segmentId);
        if (!grid.HasSegment(segment))
        {
            throw new BadInputException($"error: --segment \"{segmentId}\" is not a segment of grid {grid.Name}");
        }

        var actor = CliActor.Of(dbPath, by, "logging outcomes");
        using var log = HistoryDatabase.OpenLog(dbPath);
        var id = log.Append(grid, incident, new OutcomeLogged(segment, incident.FaultType, cause), actor);
        if (json)
        {
            JsonOutput.Write(console.Out, new { incidentId = id.Value });
        }
        else
        {
            console.Out.WriteLine($"recorded incident {id}: fault on {segment} ({grid.Name}) in {dbPath}");
        }

        return CliApp.Success;
    }
}
