using System.CommandLine;
using FeederLocate.Application.Analysis;
using FeederLocate.Application.History;
using FeederLocate.Application.Incidents;
using FeederLocate.Application.Switching;
using FeederLocate.Cli.Input;
using FeederLocate.Cli.Output;
using FeederLocate.Core.Evidence;
using FeederLocate.Core.Formats;
using FeederLocate.Core.Model;
using FeederLocate.Core.Topology;
using FeederLocate.Storage.Errors;
using FeederLocate.Storage.Events;
using FeederLocate.Storage.Incidents;

namespace FeederLocate.Cli.Commands;

/// <summary>
/// <c>switching tick|correct|deviate|found GRID --db FILE --incident ID ...</c>: carries out a logged incident's
/// switching order with the page's checks (<see cref="CheckedSwitching"/>). A refused step prints the reason on
/// stderr and exits 2 with nothing logged.
/// </summary>
internal static class SwitchingCommand
{
    public static Command Create(CliConsole console)
    {
        var command = new Command("switching", "Carry out a logged incident's switching order: tick a step, withdraw a mistaken tick, log a deviation or a position found on site");
        command.Subcommands.Add(Tick(console));
        command.Subcommands.Add(Correct(console));
        command.Subcommands.Add(Deviate(console));
        command.Subcommands.Add(Found(console));
        return command;
    }

    internal sealed record Common(Argument<string> Grid, Option<string?> Db, Option<long> Incident, Option<string?> By, Option<bool> Json);

    internal static Common Shared(Command command)
    {
        var common = new Common(
            CliOptions.Grid(),
            CliOptions.Database(required: true),
            new Option<long>("--incident") { Description = "The logged incident's id", Required = true },
            new Option<string?>("--by") { Description = "The account doing it (an enabled account of the database); default: the machine's user, as cli:NAME" },
            CliOptions.Json());
        command.Arguments.Add(common.Grid);
        command.Options.Add(common.Db);
        command.Options.Add(common.Incident);
        command.Options.Add(common.By);
        command.Options.Add(common.Json);
        return common;
    }

    internal static Option<string> Reason(string description) => new("--reason") { Description = description, Required = true };

    private static Command Tick(CliConsole console)
    {
        var command = new Command("tick", "Tick a step of the present switching order as done: only in order, and only when the device rules allow it now");
        var common = Shared(command);
        var step = new Option<int>("--step") { Description = "The step's number in the present order", Required = true };
        var at = new Option<DateTimeOffset?>("--at") { Description = "When it was actually carried out (ISO 8601); default: now" };
        command.Options.Add(step);
        command.Options.Add(at);
        command.SetAction(parse => Run(console, parse, common, "ticking a step", engineerOnly: false,
            (switching, graph, id, actor) => switching.TickAsync(graph, id, parse.GetValue(step), actor, parse.GetValue(at)).GetAwaiter().GetResult(),
            $"step {parse.GetValue(step)} ticked"));
        return command;
    }

    private static Command Correct(CliConsole console)
    {
        var command = new Command("correct", "Withdraw a step ticked by mistake, with the reason; the tick stays in the log");
        var common = Shared(command);
        var step = new Option<int>("--step") { Description = "The number of the step ticked by mistake", Required = true };
        var reason = Reason("Why the tick was a mistake");
        command.Options.Add(step);
        command.Options.Add(reason);
        command.SetAction(parse => Run(console, parse, common, "correcting a tick", engineerOnly: false,
            (switching, _, id, actor) => switching.Correct(id, parse.GetValue(step), parse.GetValue(reason)!, actor),
            $"tick of step {parse.GetValue(step)} withdrawn"));
        return command;
    }

    private static Command Deviate(CliConsole console)
    {
        var command = new Command("deviate", "Log a switch operated outside the order (engineers), with the reason; the order is then made again from it");
        var common = Shared(command);
        var (device, position) = DeviceOptions();
        var reason = Reason("Why the order was departed from");
        command.Options.Add(device);
        command.Options.Add(position);
        command.Options.Add(reason);
        command.SetAction(parse => Run(console, parse, common, "logging a deviation", engineerOnly: true,
            (switching, graph, id, actor) => switching.DeviateAsync(graph, id, SwitchOf(graph, parse.GetValue(device)!), PositionOf(parse.GetValue(position)!), parse.GetValue(reason)!, actor)
                .GetAwaiter().GetResult(),
            $"deviation logged: {parse.GetValue(device)} {parse.GetValue(position)}"));
        return command;
    }

    private static Command Found(CliConsole console)
    {
        var command = new Command("found", "Log the position a switch was found in on site");
        var common = Shared(command);
        var (device, position) = DeviceOptions();
        command.Options.Add(device);
        command.Options.Add(position);
        command.SetAction(parse => Run(console, parse, common, "logging a switch position", engineerOnly: false,
            (switching, graph, id, actor) => switching.Found(graph, id, SwitchOf(graph, parse.GetValue(device)!), PositionOf(parse.GetValue(position)!), actor),
            $"{parse.GetValue(device)} recorded {parse.GetValue(position)}"));
        return command;
    }

    private static (Option<string> Device, Option<string> Position) DeviceOptions() => (
        new Option<string>("--switch") { Description = "The switching device", Required = true },
        new Option<string>("--position") { Description = "open or closed", Required = true });

    internal static SwitchId SwitchOf(NetworkGraph graph, string id) => graph.Grid.HasSwitch(new SwitchId(id))
        ? new SwitchId(id)
        : throw new BadInputException($"error: --switch \"{id}\" is not a switching device of grid {graph.Grid.Name}");

    private static SwitchPosition PositionOf(string text) => IncidentFormat.Positions.TryGetValue(text, out var position)
        ? position
        : throw new BadInputException($"error: --position must be open or closed, got \"{text}\"");

    private static int Run(CliConsole console, ParseResult parse, Common common, string doing, bool engineerOnly,
        Func<CheckedSwitching, NetworkGraph, IncidentId, Actor, StepDecision> act, string done) =>
        RunOn(console, parse, common, doing, engineerOnly, (log, graph, id, actor) => act(Checked(log), graph, id, actor), done);

    private static CheckedSwitching Checked(IncidentLog log) => new(log, new IncidentAnalysis(new GridLearning(log), new CoreFaultRanker()));

    /// <summary>Loads the grid and the incident, names the actor, runs <paramref name="act"/> on the log, and prints what came of it.</summary>
    internal static int RunOn(CliConsole console, ParseResult parse, Common common, string doing, bool engineerOnly,
        Func<IncidentLog, NetworkGraph, IncidentId, Actor, StepDecision> act, string done)
    {
        var grid = InputFiles.LoadGrid(parse.GetValue(common.Grid)!, console.Error);
        var dbPath = parse.GetValue(common.Db)!;
        var incidentId = parse.GetValue(common.Incident);
        var id = new IncidentId(incidentId);
        var actor = CliActor.Of(dbPath, parse.GetValue(common.By), doing, engineerOnly);
        StepDecision decision;
        using (var log = HistoryDatabase.OpenLog(dbPath))
        {
            IncidentState state;
            try
            {
                state = log.State(id);
            }
            catch (UnknownIncidentException)
            {
                throw new BadInputException($"error: --incident {incidentId} is not an incident of {dbPath}");
            }

            if (state.GridName != grid.Name)
            {
                throw new BadInputException($"error: incident {incidentId} is on grid \"{state.GridName}\", not on {grid.Name}");
            }

            var graph = new NetworkGraph(grid);
            try
            {
                decision = act(log, graph, id, actor);
            }
            catch (IncidentStoreException e)
            {
                throw new BadInputException($"error: incident {incidentId}: {e.Message}");
            }
        }

        if (!decision.IsLogged)
        {
            throw new BadInputException($"error: refused: {decision.Refusal}");
        }

        if (parse.GetValue(common.Json))
        {
            JsonOutput.Write(console.Out, new { incidentId, logged = true, message = done });
        }
        else
        {
            console.Out.WriteLine($"incident {incidentId}: {done}");
        }

        return CliApp.Success;
    }
}
