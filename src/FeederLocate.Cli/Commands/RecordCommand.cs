using System.CommandLine;
using FeederLocate.Cli.Input;
using FeederLocate.Cli.Output;
using FeederLocate.Core.Model;
using FeederLocate.Storage.Accounts;
using FeederLocate.Storage.Events;

namespace FeederLocate.Cli.Commands;

/// <summary><c>record GRID INCIDENT --segment ID|--no-fault-found|--transient --db FILE</c>: logs an incident with its outcome: the confirmed fault location, or none found.</summary>
internal static class RecordCommand
{
    /// <summary>The environment variable holding an API token of the account named with --by.</summary>
    public const string TokenVariable = ProvenAccount.TokenVariable;

    public static Command Create(CliConsole console)
    {
        var grid = CliOptions.Grid();
        var incident = CliOptions.Incident();
        var segment = new Option<string?>("--segment") { Description = "The segment where the fault was confirmed (or give --no-fault-found or --transient)" };
        var noFault = new Option<bool>("--no-fault-found") { Description = "The patrol found no fault: no segment is confirmed, and the learning counts no fault on any segment" };
        var transient = new Option<bool>("--transient") { Description = "No fault found because it cleared by itself (a reclosure held); counted as --no-fault-found" };
        var cause = new Option<string?>("--cause") { Description = "What caused the fault (free text)" };
        var db = CliOptions.Database(required: true);
        var by = new Option<string?>("--by")
        {
            Description = "The account logging it (an enabled operator or engineer of the database), proven by one of its API tokens in the "
                + $"environment variable {TokenVariable}; default: the machine's user, as cli:NAME",
        };
        var json = CliOptions.Json();
        var command = new Command("record", "Log an incident and where its fault was confirmed, so the next ranking learns") { grid, incident, segment, noFault, transient, cause, db, by, json };
        command.SetAction(parse => Run(console, parse.GetValue(grid)!, parse.GetValue(incident)!, parse.GetValue(segment), parse.GetValue(noFault), parse.GetValue(transient),
            parse.GetValue(cause), parse.GetValue(db)!, parse.GetValue(by), parse.GetValue(json)));
        return command;
    }

    private static int Run(CliConsole console, string gridPath, string incidentPath, string? segmentId, bool noFault, bool transient, string? cause, string dbPath, string? by, bool json)
    {
        if ((segmentId is null) == !(noFault || transient))
        {
            throw new BadInputException(segmentId is null
                ? "error: give --segment ID where the fault was confirmed, or --no-fault-found or --transient"
                : "error: --segment confirms a fault; --no-fault-found and --transient say none was found: give one of them");
        }

        var grid = InputFiles.LoadGrid(gridPath, console.Error);
        var incident = InputFiles.LoadIncident(incidentPath, grid, console.Error);
        SegmentId? segment = segmentId is null ? null : new SegmentId(segmentId);
        if (segment is { } confirmed && !grid.HasSegment(confirmed))
        {
            throw new BadInputException($"error: --segment \"{segmentId}\" is not a segment of grid {grid.Name}");
        }

        var actor = CliActor.Of(dbPath, by, "logging outcomes");
        using var log = HistoryDatabase.OpenLog(dbPath);
        var id = segment is { } found
            ? log.Append(grid, incident, new OutcomeLogged(found, incident.FaultType, cause), actor)
            : log.Append(grid, incident, new NoFaultFoundLogged(transient, incident.FaultType, cause), actor);
        var finding = segment is { } at ? $"fault on {at}" : transient ? "no fault found (transient)" : "no fault found";
        if (json)
        {
            JsonOutput.Write(console.Out, new { incidentId = id.Value, confirmedSegment = segment?.Value, noFaultFound = segment is null, transient });
        }
        else
        {
            console.Out.WriteLine($"recorded incident {id}: {finding} ({grid.Name}) in {dbPath}");
        }

        return CliApp.Success;
    }
}
