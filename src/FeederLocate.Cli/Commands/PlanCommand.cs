using System.CommandLine;
using System.Globalization;
using FeederLocate.Cli.Input;
using FeederLocate.Cli.Output;
using FeederLocate.Core.Formats.Documents;
using FeederLocate.Application.Analysis;
using FeederLocate.Application.Naming;
using FeederLocate.Core.Model;
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
        var coldLoad = new Option<double?>("--cold-load-factor")
        {
            Description = "A fixed multiplier on the load of every node that was without supply (1 to 10); without it, read from the cold-load curve at the outage's duration",
        };
        var voltage = new Option<double>("--voltage-limit")
        {
            Description = "Lowest voltage allowed at any live node in the final state, pu (0.5 to 1)",
            DefaultValueFactory = _ => SwitchingOptions.Default.VoltageLimitPu,
        };
        var back = new Option<bool>("--return")
        {
            Description = "Print instead the return to normal after the repair: clearance, then every device back to its normal position without paralleling feeders",
        };
        var section = new Option<string?>("--section")
        {
            Description = "Plan for this section instead of the most likely one (the section an earth-fault search or a test order located)",
        };
        var db = CliOptions.Database(required: false);
        var json = CliOptions.Json();
        var command = new Command("plan", "Propose the switching order: isolate the most likely section, restore, and test; advice only")
        {
            grid, incident, coldLoad, voltage, back, section, db, json,
        };
        command.SetAction(parse => Run(console, parse.GetValue(grid)!, parse.GetValue(incident)!, parse.GetValue(coldLoad), parse.GetValue(voltage),
            parse.GetValue(back), parse.GetValue(section), parse.GetValue(db), parse.GetValue(json)));
        return command;
    }

    private static int Run(CliConsole console, string gridPath, string incidentPath, double? coldLoadFactor, double voltageLimitPu, bool returnToNormal, string? section, string? dbPath, bool json)
    {
        var errors = new List<string>();
        if (coldLoadFactor is { } factor && !(factor is >= 1 and <= 10))
        {
            errors.Add($"error: --cold-load-factor must be between 1 and 10, got {factor.ToString(CultureInfo.InvariantCulture)}");
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
        InputFiles.CheckGridReference(incident, incidentPath, gridPath);
        var graph = new NetworkGraph(grid);
        var ranked = EvidenceAnalysis.Rank(graph, incident, HistoryDatabase.PriorsFor(dbPath, graph, console.Error));
        if (ranked.Result is not { } ranking)
        {
            throw new BadInputException($"error: {ranked.Problem}");
        }

        var options = SwitchingOptions.Default with { ColdLoadFactor = coldLoadFactor, VoltageLimitPu = voltageLimitPu };
        if (section is not null && !graph.Sections.Contains(new SectionId(section)))
        {
            throw new BadInputException($"error: --section {section} is not a section of grid '{grid.Name}'");
        }

        var planned = section is null
            ? EvidenceAnalysis.Plan(graph, incident, ranking, options)
            : EvidenceAnalysis.PlanFor(graph, incident, ranking, new SectionId(section), options);
        if (planned.Plan is not { } plan)
        {
            throw new BadInputException($"error: {planned.Problem}");
        }

        var names = GridNames.Sections(graph);
        if (returnToNormal)
        {
            var attempt = EvidenceAnalysis.Return(graph, incident, plan, options);
            if (attempt.Plan is not { } back)
            {
                throw new BadInputException($"error: {attempt.Problem}");
            }

            var returnDocument = ReturnPlanDocument.From(back);
            if (json)
            {
                JsonOutput.Write(console.Out, returnDocument);
            }
            else
            {
                WriteReturn(console.Out, returnDocument, plan, names);
            }

            return CliApp.Success;
        }

        var document = PlanDocument.From(plan, ranking);
        if (json)
        {
            JsonOutput.Write(console.Out, document);
            return CliApp.Success;
        }

        Write(console.Out, document, names);
        return CliApp.Success;
    }

    private static void Write(TextWriter output, PlanDocument d, SectionNames names)
    {
        WriteCautions(output, d);
        output.WriteLine();
        var consistency = d.Ranking.Consistent ? string.Empty : "; the evidence is not consistent: check it";
        var isolated = string.Join("; ", d.IsolatedSections.Select(id => Named(id, names)));
        output.WriteLine(d.IsolatedSections.Count == 0
            ? $"Transient fault (a reclosure held): nothing is switched or isolated; patrol the suspects, most likely first (top {Named(d.Ranking.TopSection, names)}, {Percent(d.Ranking.TopProbability)}{consistency})."
            : d.IsolatedSections[0] == d.Ranking.TopSection
                ? $"Isolate {isolated} (most likely section, {Percent(d.Ranking.TopProbability)}{consistency})."
                : $"Isolate {isolated} (the section asked for; the most likely is {Named(d.Ranking.TopSection, names)}, {Percent(d.Ranking.TopProbability)}{consistency}).");
        foreach (var s in d.Sections)
        {
            output.WriteLine($"  {Named(s.Id, names)}: segments {string.Join(" ", s.Segments)}");
        }

        var steps = StepTable(d.Steps, s => s.Device ?? (s.Segments is { } segs ? string.Join(" ", segs) : string.Empty), names);
        TableOutput.Write(output, steps);
        var summary = TableOutput.Table("estimate", "value");
        summary.AddRow("restored customers", Figures.Count(d.RestoredCustomers));
        summary.AddRow("unserved customers", Figures.Count(d.UnservedCustomers));
        summary.AddRow("customer minutes interrupted (IEEE 1366 CMI)", $"about {Figures.Count(d.CustomerMinutesInterrupted)}");
        summary.AddRow("lowest voltage, final state", $"{d.FinalState.MinimumVoltagePu:F3} pu at {d.FinalState.MinimumVoltageNode} (limit {d.VoltageLimitPu:F2} pu)");
        summary.AddRow("highest loading, final state", $"{d.FinalState.MaximumLoadingPercent:F0} % on {d.FinalState.MaximumLoadingSegment}");
        summary.AddRow("cold-load factor", d.ColdLoadBasis ?? d.ColdLoadFactor.ToString(CultureInfo.InvariantCulture));
        if (d.ExpectedCustomerInterruptions is { } ci)
        {
            summary.AddRow("expected customer interruptions (earth-fault search)", ci.ToString("0.0", CultureInfo.InvariantCulture));
        }

        if (d.ExpectedReenergisationsOntoFault is { } e)
        {
            summary.AddRow("expected re-energisations onto the fault (test order)", e.ToString("0.00", CultureInfo.InvariantCulture));
        }

        TableOutput.Write(output, summary);
        if (d.TestOrder.Count > 0 && d.SearchFirst)
        {
            output.WriteLine("Earth-fault search FIRST (the ranking is split and the network may run with the earth fault): carry it out before the steps above,");
            output.WriteLine("which apply only if it ends at their section. Start from the incident's start state; after each entry follow the branch of its result:");
        }
        else if (d.TestOrder.Count > 0)
        {
            output.WriteLine("Test order: the alternative to the steps above, for testing before isolating. Start from the incident's start state;");
            output.WriteLine("after each entry follow the branch of its result (each entry's steps follow those of the entry that led to it):");
        }

        if (d.TestOrder.Count > 0)
        {
            var tests = TableOutput.Table("entry", "steps", "watch", "p", "branches");
            foreach (var t in d.TestOrder)
            {
                var entrySteps = t.Steps.Select(s => $"{s.Order}. {Words(s.Action)} {s.Device} (about {s.AtMinutes.ToString("0", CultureInfo.InvariantCulture)} min): {NamesInText.With(s.Reason, names, null)}");
                var branches = t.Branches.Select(b => $"{b.Result}: {NamesInText.With(b.Then, names, null)}");
                tests.AddRow(
                    t.Entry.ToString(CultureInfo.InvariantCulture),
                    string.Join(Environment.NewLine, entrySteps),
                    t.Observe == "trip" ? "breaker holds or trips" : "U0",
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

    /// <summary>The steps as a table; the crew column only where the grid names its crews (a grid without them prints as it always has).</summary>
    private static Spectre.Console.Table StepTable(IReadOnlyList<PlanDocument.StepEntry> entries, Func<PlanDocument.StepEntry, string> where, SectionNames names)
    {
        var crews = entries.Any(s => s.Crew is not null);
        var steps = crews
            ? TableOutput.Table("order", "at min", "crew", "action", "device", "reason")
            : TableOutput.Table("order", "at min", "action", "device", "reason");
        foreach (var s in entries)
        {
            var order = s.Order.ToString(CultureInfo.InvariantCulture);
            var at = s.AtMinutes.ToString("0", CultureInfo.InvariantCulture);
            var action = Words(s.Action);
            var reason = NamesInText.With(s.Reason, names, null);
            steps.AddRow(crews ? [order, at, s.Crew ?? "control room", action, where(s), reason] : [order, at, action, where(s), reason]);
        }

        return steps;
    }

    /// <summary>A section by the operators' name, its id after it: "A1: LB-A1-3 → LB-A1-4 (SEC-S108)".</summary>
    private static string Named(string? id, SectionNames names) =>
        id is null ? "none" : names.All.TryGetValue(new SectionId(id), out var name) ? $"{name} ({id})" : id;

    /// <summary>The step's action in plain words ("prove dead"); the JSON keeps the format's action names.</summary>
    private static string Words(string action) =>
        Enum.TryParse<StepAction>(action, ignoreCase: true, out var known) ? StepWords.Action(known) : action;

    private static void WriteReturn(TextWriter output, ReturnPlanDocument d, SwitchingPlan plan, SectionNames names)
    {
        WriteCautions(output, d.Cautions);
        output.WriteLine();
        output.WriteLine(plan.IsolatedSections.IsEmpty
            ? "Return to normal: the plan isolated nothing."
            : $"Return to normal after the repair of {string.Join("; ", plan.IsolatedSections.Select(id => Named(id.Value, names)))} (minutes count from the moment the repair is reported complete):");
        var steps = StepTable(d.Steps, s => s.Device ?? string.Empty, names);

        TableOutput.Write(output, steps);
        var summary = TableOutput.Table("estimate", "value");
        summary.AddRow("most customers without supply at once", Figures.Count(d.MostCustomersInterrupted));
        summary.AddRow("customer minutes interrupted (IEEE 1366 CMI)", $"about {Figures.Count(d.CustomerMinutesInterrupted)}");
        TableOutput.Write(output, summary);
        output.WriteLine("Approximations:");
        foreach (var a in d.Approximations)
        {
            output.WriteLine($"  - {a}");
        }

        output.WriteLine();
        WriteCautions(output, d.Cautions);
    }

    private static void WriteCautions(TextWriter output, PlanDocument d) => WriteCautions(output, d.Cautions);

    private static void WriteCautions(TextWriter output, IReadOnlyList<string> cautions)
    {
        foreach (var c in cautions)
        {
            output.WriteLine($"CAUTION: {c}");
        }
    }

    private static string Percent(double p) => (p * 100).ToString("F1", CultureInfo.InvariantCulture) + " %";
}
