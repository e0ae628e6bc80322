using System.CommandLine;
using FeederLocate.Application.Analysis;
using FeederLocate.Application.History;
using FeederLocate.Application.Incidents;
using FeederLocate.Application.Lifecycle;
using FeederLocate.Application.Switching;
using FeederLocate.Application.Times;
using FeederLocate.Cli.Input;
using FeederLocate.Storage.Incidents;

namespace FeederLocate.Cli.Commands;

/// <summary>
/// <c>incident stage|return|close|reopen|times GRID --db FILE --incident ID ...</c>: a logged incident's lifecycle
/// and times with the page's rules (<see cref="IncidentLifecycle"/>, <see cref="IncidentTimesEntry"/>).
/// </summary>
internal static class LifecycleCommand
{
    public static Command Create(CliConsole console)
    {
        var command = new Command("incident", "Work a logged incident through its stages: move it on, tick the return to normal, close, reopen, enter its times");
        command.Subcommands.Add(Stage(console));
        command.Subcommands.Add(Return(console));
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
                ? new IncidentLifecycle(log, Analysis(log)).MoveTo(id, to, actor)
                : throw new BadInputException($"error: --to must be located, isolated, restored or repaired, got \"{parse.GetValue(stage)}\""),
            $"moved on to {parse.GetValue(stage)}"));
        return command;
    }

    private static Command Return(CliConsole console)
    {
        var command = new Command("return", "Tick a step of the incident's return to normal (after the outcome and the repair): in order, checked by the device rules");
        var common = SwitchingCommand.Shared(command);
        var step = new Option<int>("--step") { Description = "The step's number in the return order", Required = true };
        var at = new Option<DateTimeOffset?>("--at") { Description = "When it was actually carried out (ISO 8601); default: now" };
        command.Options.Add(step);
        command.Options.Add(at);
        command.SetAction(parse => SwitchingCommand.RunOn(console, parse, common, "ticking a return step", engineerOnly: false,
            (log, graph, id, actor) => new ReturnSwitching(log, Analysis(log)).TickAsync(graph, id, parse.GetValue(step), actor, parse.GetValue(at)).GetAwaiter().GetResult(),
            $"return step {parse.GetValue(step)} ticked"));
        return command;
    }

    internal static IncidentAnalysis Analysis(IncidentLog log) => new(new GridLearning(log), new CoreFaultRanker());

    private static Command Close(CliConsole console)
    {
        var command = new Command("close", "Close the incident: its outcome logged and the return to normal carried out");
        var common = SwitchingCommand.Shared(command);
        var note = new Option<string?>("--note") { Description = "A closing note" };
        command.Options.Add(note);
        command.SetAction(parse => SwitchingCommand.RunOn(console, parse, common, "closing an incident", engineerOnly: false,
            (log, graph, id, actor) => new IncidentLifecycle(log, Analysis(log)).CloseAsync(graph, id, parse.GetValue(note), actor).GetAwaiter().GetResult(), "closed"));
        return command;
    }

    private static Command Reopen(CliConsole console)
    {
        var command = new Command("reopen", "Open a closed incident again (engineers), with the reason");
        var common = SwitchingCommand.Shared(command);
        var reason = SwitchingCommand.Reason("Why the incident is opened again");
        command.Options.Add(reason);
        command.SetAction(parse => SwitchingCommand.RunOn(console, parse, common, "reopening an incident", engineerOnly: true,
            (log, _, id, actor) => new IncidentLifecycle(log, Analysis(log)).Reopen(id, parse.GetValue(reason)!, actor), "reopened"));
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
