using System.CommandLine;
using FeederLocate.Application.Lifecycle;
using FeederLocate.Application.Times;
using FeederLocate.Cli.Input;
using FeederLocate.Storage.Incidents;

namespace FeederLocate.Cli.Commands;

/// <summary>
/// <c>incident stage|normal|close|reopen|times GRID --db FILE --incident ID ...</c>: a logged incident's lifecycle
/// and times with the page's rules (<see cref="IncidentLifecycle"/>, <see cref="IncidentTimesEntry"/>).
/// </summary>
internal static class LifecycleCommand
{
    public static Command Create(CliConsole console)
    {
        var command = new Command("incident", "Work a logged incident through its stages: move it on, return switches to normal, close, reopen, enter its times");
        command.Subcommands.Add(Stage(console));
        command.Subcommands.Add(Normal(console));
        command.Subcommands.Add(Close(console));
        command.Subcommands.Add(Reopen(console));
        command.Subcommands.Add(Times(console));
        return command;
    }

    private static Command Stage(CliConsole console)
    {
        var command = new Command("stage", "Move the incident on to located, isolated, restored or repaired");
        var common = SwitchingCommand.Shared(command);
        var stage = new Option<string>("--to") { Description = "located, isolated, restored or repaired", Required = true };
        command.Options.Add(stage);
        command.SetAction(parse => SwitchingCommand.RunOn(console, parse, common, "moving an incident on", engineerOnly: false,
            (log, _, id, actor) => IncidentStages.TryParse(parse.GetValue(stage), out var to)
                ? new IncidentLifecycle(log).MoveTo(id, to, actor)
                : throw new BadInputException($"error: --to must be located, isolated, restored or repaired, got \"{parse.GetValue(stage)}\""),
            $"moved on to {parse.GetValue(stage)}"));
        return command;
    }

    private static Command Normal(CliConsole console)
    {
        var command = new Command("normal", "Put a switch back in its normal position (after the repair; never paralleling two substations)");
        var common = SwitchingCommand.Shared(command);
        var device = new Option<string>("--switch") { Description = "The switching device", Required = true };
        command.Options.Add(device);
        command.SetAction(parse => SwitchingCommand.RunOn(console, parse, common, "returning a switch to normal", engineerOnly: false,
            (log, graph, id, actor) => new IncidentLifecycle(log).ReturnToNormal(graph, id, SwitchingCommand.SwitchOf(graph, parse.GetValue(device)!), actor),
            $"{parse.GetValue(device)} back to normal"));
        return command;
    }

    private static Command Close(CliConsole console)
    {
        var command = new Command("close", "Close the incident: its outcome logged and every switch back to normal");
        var common = SwitchingCommand.Shared(command);
        var note = new Option<string?>("--note") { Description = "A closing note" };
        command.Options.Add(note);
        command.SetAction(parse => SwitchingCommand.RunOn(console, parse, common, "closing an incident", engineerOnly: false,
            (log, graph, id, actor) => new IncidentLifecycle(log).Close(graph.Grid, id, parse.GetValue(note), actor), "closed"));
        return command;
    }

    private static Command Reopen(CliConsole console)
    {
        var command = new Command("reopen", "Open a closed incident again (engineers), with the reason");
        var common = SwitchingCommand.Shared(command);
        var reason = SwitchingCommand.Reason("Why the incident is opened again");
        command.Options.Add(reason);
        command.SetAction(parse => SwitchingCommand.RunOn(console, parse, common, "reopening an incident", engineerOnly: true,
            (log, _, id, actor) => new IncidentLifecycle(log).Reopen(id, parse.GetValue(reason)!, actor), "reopened"));
        return command;
    }

    private static Command Times(CliConsole console)
    {
        var command = new Command("times", "Enter when the fault began (faultAt), when the protection tripped and when it reclosed (ISO 8601)");
        var common = SwitchingCommand.Shared(command);
        var fault = new Option<DateTimeOffset?>("--fault-at") { Description = "When the fault began" };
        var tripped = new Option<DateTimeOffset?>("--tripped-at") { Description = "When the protection tripped" };
        var reclosed = new Option<DateTimeOffset?>("--reclosed-at") { Description = "When it reclosed" };
        command.Options.Add(fault);
        command.Options.Add(tripped);
        command.Options.Add(reclosed);
        command.SetAction(parse => SwitchingCommand.RunOn(console, parse, common, "entering times", engineerOnly: false,
            (log, _, id, actor) => new IncidentTimesEntry(log, TimeProvider.System).Enter(id, parse.GetValue(fault), parse.GetValue(tripped), parse.GetValue(reclosed), actor),
            "times entered"));
        return command;
    }
}
