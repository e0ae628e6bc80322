using System.CommandLine;
using FeederLocate.Application.Switching;
using FeederLocate.Cli.Input;
using FeederLocate.Cli.Output;
using FeederLocate.Core.Formats;
using FeederLocate.Storage.Errors;
using FeederLocate.Storage.Incidents;

namespace FeederLocate.Cli.Commands;

/// <summary><c>switches GRID --db FILE --incident ID</c>: every device's position now in a logged incident.</summary>
internal static class SwitchesCommand
{
    public static Command Create(CliConsole console)
    {
        var grid = CliOptions.Grid();
        var db = CliOptions.Database(required: true);
        var incident = new Option<long>("--incident") { Description = "The logged incident's id", Required = true };
        var json = CliOptions.Json();
        var command = new Command("switches", "Every switching device's position now in a logged incident: normal, recorded, tripped, and the steps ticked as done")
        {
            grid, db, incident, json,
        };
        command.SetAction(parse => Run(console, parse.GetValue(grid)!, parse.GetValue(db)!, parse.GetValue(incident), parse.GetValue(json)));
        return command;
    }

    private static int Run(CliConsole console, string gridPath, string dbPath, long incidentId, bool json)
    {
        var grid = InputFiles.LoadGrid(gridPath, console.Error);
        using var log = HistoryDatabase.OpenLog(dbPath);
        IncidentState state;
        try
        {
            state = log.State(new IncidentId(incidentId));
        }
        catch (UnknownIncidentException)
        {
            throw new BadInputException($"error: --incident {incidentId} is not an incident of {dbPath}");
        }

        if (state.GridName != grid.Name)
        {
            throw new BadInputException($"error: incident {incidentId} is on grid \"{state.GridName}\", not on {grid.Name}");
        }

        var states = IncidentSwitching.Current(grid, state);
        var changed = states.Deviations();
        if (json)
        {
            JsonOutput.Write(console.Out, new
            {
                incidentId,
                grid = grid.Name,
                positions = grid.Switches.ToDictionary(s => s.Id.Value, s => IncidentFormat.Name(states.PositionOf(s.Id))),
                deviations = changed.ToDictionary(d => d.Key.Value, d => IncidentFormat.Name(d.Value)),
            });
            return CliApp.Success;
        }

        var table = TableOutput.Table("device", "kind", "now", "normal");
        foreach (var device in grid.Switches)
        {
            table.AddRow(device.Id.Value, GridFormat.Name(device.Kind), IncidentFormat.Name(states.PositionOf(device.Id)),
                changed.ContainsKey(device.Id) ? (device.NormallyOpen ? "open" : "closed") : "same");
        }

        TableOutput.Write(console.Out, table);
        return CliApp.Success;
    }
}
