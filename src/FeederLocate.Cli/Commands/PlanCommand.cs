using System.CommandLine;
using System.Globalization;
using FeederLocate.Cli.Input;
using FeederLocate.Cli.Output;
using FeederLocate.Core.Formats.Documents;
using FeederLocate.Application.Analysis;
using FeederLocate.Core.Ranking;
using FeederLocate.Core.Switching;
using FeederLocate.Core.Topology;

namespace FeederLocate.Cli.Commands;

/// <summary><c>plan GRID INCIDENT</c>: the switching order for the most likely section, with the cautions.</summary>
internal static class PlanCommand
{
    public static Command Create(CliConsole console)
    {
        var grid = CliOptions.Grid();
        var incident = new Argument<string>("INCIDENT") { Description = "Incident file (feederlocate-incident/1)" };
        var coldLoad = new Option<double>("--cold-load-factor")
        {
            Description = "Multiplier on the load of every node that was without supply (1 to 10)",
            DefaultValueFactory = _ => SwitchingOptions.Default.ColdLoadFactor,
        };
        var voltage = new Option<double>("--voltage-limit")
        {
            Description = "Lowest voltage allowed at any live node in the final state, pu (0.5 to 1)",
            DefaultValueFactory = _ => SwitchingOptions.Default.VoltageLimitPu,
        };
        var db = CliOptions.Database(required: false);
        var json = CliOptions.Json();
        var command = new Command("plan", "Propose the switching order: isolate the most likely section, restore, and test; advice only")
        {
            grid, incident, coldLoad, voltage, db, json,
        };
        command.SetAction(parse => Run(console, parse.GetValue(grid)!, parse.GetValue(incident)!, parse.GetValue(coldLoad), parse.GetValue(voltage),
            parse.GetValue(db), parse.GetValue(json)));
        return command;
    }

    private static int Run(CliConsole console, string gridPath, string incidentPath, double coldLoadFactor, double voltageLimitPu, string? dbPath, bool json)
    {
        var errors = new List<string>();
        if (!(coldLoadFactor is >= 1 and <= 10))
        {
            errors.Add($"error: --cold-load-factor must be between 1 and 10, got {coldLoadFactor.ToString(CultureInfo.InvariantCulture)}");
        }

        if (!(voltageLimitPu is >= 0.5 and <= 1))
        {
            errors.Add($"error: --voltage-limit must be between 0.5 and 1 pu, got {voltageLimitPu.ToString(CultureInfo.InvariantCulture)}");
        }

        if (errors.Count > 0)
        {
            throw new BadInputException(errors);
        }

        var grid = InputFiles.LoadGrid(gridPath, console.Error);
        var incident = InputFiles.LoadIncident(incidentPath, grid, console.Error);
        var graph = new NetworkGraph(grid);
        var ranked = EvidenceAnalysis.Rank(graph, incident, HistoryDatabase.PriorsFor(dbPath, graph, console.Error));
        if (ranked.Result is not { } ranking)
        {
            throw new BadInputException($"error: {ranked.Problem}");
        }

        var options = SwitchingOptions.Default with { ColdLoadFactor = coldLoadFactor, VoltageLimitPu = voltageLimitPu };
        var planned = EvidenceAnalysis.Plan(graph, incident, ranking, options);
        if (planned.Plan is not { } plan)
        {
            throw new BadInputException($"error: {planned.Problem}");
        }

        var document = PlanDocument.From(plan, ranking);
        if (json)
        {
            JsonOutput.Write(console.Out, document);
            return CliApp.Success;
        }

        Write(console.Out, document);
        return CliApp.Success;
    }

    private static void Write(TextWriter output, PlanDocument d)
    {
        WriteCautions(output, d);
        output.WriteLine();
        output.WriteLine($"Isolate {string.Join(", ", d.IsolatedSections)} (most likely section, {Percent(d.Ranking.TopProbability)}{(d.Ranking.Consistent ? string.Empty : "; the evidence is not consistent: check it")}).");
        foreach (var s in d.Sections)
        {
            output.WriteLine($"  {s.Id}: segments {string.Join(" ", s.Segments)}");
        }

        var steps = TableOutput.Table("order", "at min", "action", "device", "reason");
        foreach (var s in d.Steps)
        {
            var where = s.Device ?? (s.Segments is { } segs ? string.Join(" ", segs) : string.Empty);
            steps.AddRow(s.Order.ToString(CultureInfo.InvariantCulture), s.AtMinutes.ToString("0", CultureInfo.InvariantCulture), s.Action, where, s.Reason);
        }

        TableOutput.Write(output, steps);
        var summary = TableOutput.Table("estimate", "value");
        summary.AddRow("restored customers", d.RestoredCustomers.ToString(CultureInfo.InvariantCulture));
        summary.AddRow("unserved customers", d.UnservedCustomers.ToString(CultureInfo.InvariantCulture));
        summary.AddRow("customer minutes interrupted (IEEE 1366 CMI)", d.CustomerMinutesInterrupted.ToString("0", CultureInfo.InvariantCulture));
        summary.AddRow("lowest voltage, final state", $"{d.FinalState.MinimumVoltagePu:F3} pu at {d.FinalState.MinimumVoltageNode} (limit {d.VoltageLimitPu:F2} pu)");
        summary.AddRow("highest loading, final state", $"{d.FinalState.MaximumLoadingPercent:F0} % on {d.FinalState.MaximumLoadingSegment}");
        summary.AddRow("cold-load factor", d.ColdLoadFactor.ToString(CultureInfo.InvariantCulture));
        if (d.ExpectedReenergisationsOntoFault is { } e)
        {
            summary.AddRow("expected re-energisations onto the fault (test order)", e.ToString("0.00", CultureInfo.InvariantCulture));
        }

        TableOutput.Write(output, summary);
        if (d.TestOrder.Count > 0)
        {
            output.WriteLine("Test order (before the steps above; follow the branch after each result):");
            var tests = TableOutput.Table("order", "first", "action", "device", "sections", "p", "branches");
            foreach (var t in d.TestOrder)
            {
                var branches = new[] { t.IfHolds, t.IfTrips, t.IfU0Stays, t.IfU0Collapses, t.IfU0Returns, t.IfU0StaysAbsent }
                    .OfType<PlanDocument.BranchEntry>()
                    .Select(b => $"{b.Result}: {b.Then}");
                tests.AddRow(
                    t.Order.ToString(CultureInfo.InvariantCulture),
                    string.Join("; ", t.Before),
                    t.Action,
                    t.Device,
                    string.Join(" ", t.Energises ?? t.CutsOff ?? []),
                    Percent(t.FaultProbability),
                    string.Join(Environment.NewLine, branches));
            }

            TableOutput.Write(output, tests);
        }

        output.WriteLine("Approximations:");
        foreach (var a in d.Approximations)
        {
            output.WriteLine($"  - {a}");
        }

        output.WriteLine();
        WriteCautions(output, d);
    }

    private static void WriteCautions(TextWriter output, PlanDocument d)
    {
        foreach (var c in d.Cautions)
        {
            output.WriteLine($"CAUTION: {c}");
        }
    }

    private static string Percent(double p) => (p * 100).ToString("F1", CultureInfo.InvariantCulture) + " %";
}
