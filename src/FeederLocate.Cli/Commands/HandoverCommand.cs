using System.CommandLine;
using System.Globalization;
using FeederLocate.Application.Lifecycle;
using FeederLocate.Cli.Input;
using FeederLocate.Cli.Output;
using FeederLocate.Core.Topology;

namespace FeederLocate.Cli.Commands;

/// <summary>
/// <c>handover GRID... --db FILE [--json]</c>: the shift handover (<see cref="ShiftHandover"/>): every open incident
/// with its stage, what is still off, the next step and the open questions; incidents on grids not given are named.
/// </summary>
internal static class HandoverCommand
{
    public static Command Create(CliConsole console)
    {
        var grids = new Argument<string[]>("GRID") { Description = "Grid files (feederlocate-grid/1) of the incidents to hand over", Arity = ArgumentArity.OneOrMore };
        var db = CliOptions.Database(required: true);
        var json = CliOptions.Json();
        var command = new Command("handover", "The shift handover: each open incident's stage, what is still off, the next step and the open questions") { grids, db, json };
        command.SetAction(parse => Run(console, parse.GetValue(grids)!, parse.GetValue(db)!, parse.GetValue(json)));
        return command;
    }

    private static int Run(CliConsole console, string[] gridPaths, string dbPath, bool json)
    {
        var graphs = gridPaths.Select(p => new NetworkGraph(InputFiles.LoadGrid(p, console.Error))).ToDictionary(g => g.Grid.Name, StringComparer.Ordinal);
        using var log = HistoryDatabase.OpenExistingLog(dbPath);
        var handover = new ShiftHandover(log, LifecycleCommand.Analysis(log), TimeProvider.System);
        NetworkGraph? GraphOf(string name) => graphs.GetValueOrDefault(name);
        var entries = handover.EntriesAsync(GraphOf).GetAwaiter().GetResult();
        var document = HandoverDocument.From(DateTimeOffset.UtcNow, entries, handover.IncidentsWithoutGrid(GraphOf));
        if (json)
        {
            JsonOutput.Write(console.Out, document);
            return CliApp.Success;
        }

        var output = console.Out;
        output.WriteLine($"Shift handover at {document.At:yyyy-MM-dd HH:mm} UTC: {document.Incidents.Count} open incident{(document.Incidents.Count == 1 ? string.Empty : "s")}");
        foreach (var i in document.Incidents)
        {
            output.WriteLine();
            output.WriteLine($"Incident {i.Id} on {i.Grid}: {i.Stage}, {Age(i.AgeMinutes)} since the fault");
            output.WriteLine($"  still off: {(i.CustomersOff is { } off ? off.ToString("#,0", CultureInfo.InvariantCulture) : "not known (not radial)")} customers"
                + (i.SectionsOff.Count == 0 ? string.Empty : " in " + string.Join("; ", i.SectionsOff.Select(s => s.Name))));
            output.WriteLine($"  next step: {i.NextStepInWords ?? i.NextStep ?? "none"}");
            output.WriteLine($"  customer minutes interrupted: {i.CustomerMinutesInterrupted.ToString("#,0", CultureInfo.InvariantCulture)} ({i.CustomerMinutesBasis})");
            output.WriteLine($"  unread indicators: {List(i.UnreadIndicators)}");
            output.WriteLine($"  distrusted readings: {List(i.DistrustedIndicators)}");
            if (i.ExpiredIndicators.Count > 0)
            {
                output.WriteLine($"  readings reset before they were read: {List(i.ExpiredIndicators)}");
            }

            foreach (var s in i.SwitchSuspects)
            {
                output.WriteLine($"  switch position in doubt: {s.Device} probably {s.State} ({(s.Probability * 100).ToString("0", CultureInfo.InvariantCulture)} %), not as recorded");
            }

            if (i.AnalysisProblem is { } problem)
            {
                output.WriteLine($"  no ranking: {problem}");
            }
        }

        if (document.IncidentsOnGridsNotLoaded.Count > 0)
        {
            output.WriteLine();
            output.WriteLine("Open on grids not given: incident " + string.Join(", ", document.IncidentsOnGridsNotLoaded));
        }

        output.WriteLine();
        output.WriteLine("Advice only: verify every step on site; local switching rules and licensed practice prevail.");
        return CliApp.Success;
    }

    private static string List(IReadOnlyList<string> items) => items.Count == 0 ? "none"
        : items.Count <= 12 ? string.Join(", ", items)
        : $"{string.Join(", ", items.Take(12))} and {items.Count - 12} more";

    private static string Age(double minutes) => minutes >= 60
        ? $"{(int)(minutes / 60)} h {(int)(minutes % 60):00} min"
        : $"{(int)minutes} min";
}
