using System.CommandLine;
using System.Globalization;
using FeederLocate.Cli.Input;
using FeederLocate.Cli.Output;
using FeederLocate.Core.Formats.Documents;
using FeederLocate.Application.Analysis;

namespace FeederLocate.Cli.Commands;

/// <summary><c>rank GRID INCIDENT</c>: suspect segments and sections with their probabilities and reasons.</summary>
internal static class RankCommand
{
    public static Command Create(CliConsole console)
    {
        var grid = CliOptions.Grid();
        var incident = CliOptions.Incident();
        var db = CliOptions.Database(required: false);
        var json = CliOptions.Json();
        var command = new Command("rank", "Rank the suspect segments and sections of an incident; with --db, using what the recorded outcomes taught")
        {
            grid, incident, db, json,
        };
        command.SetAction(parse => Run(console, parse.GetValue(grid)!, parse.GetValue(incident)!, parse.GetValue(db), parse.GetValue(json)));
        return command;
    }

    private static int Run(CliConsole console, string gridPath, string incidentPath, string? dbPath, bool json)
    {
        var grid = InputFiles.LoadGrid(gridPath, console.Error);
        var incident = InputFiles.LoadIncident(incidentPath, grid, console.Error);
        InputFiles.CheckGridReference(incident, incidentPath, gridPath);
        var graph = new Core.Topology.NetworkGraph(grid);
        var ranking = EvidenceAnalysis.Rank(graph, incident, HistoryDatabase.PriorsFor(dbPath, graph, console.Error));
        if (ranking.Result is not { } result)
        {
            throw new BadInputException($"error: {ranking.Problem}");
        }

        var document = RankingDocument.From(result);
        if (json)
        {
            JsonOutput.Write(console.Out, document);
            return CliApp.Success;
        }

        Write(console.Out, document, Application.Naming.GridNames.Sections(graph));
        return CliApp.Success;
    }

    private static void Write(TextWriter output, RankingDocument d, Core.Topology.SectionNames names)
    {
        if (d.Transient)
        {
            output.WriteLine("TRANSIENT: a reclosure held. The ranking shows where the fault probably was, for the patrol; nothing needs isolating.");
        }

        foreach (var s in d.SwitchSuspects)
        {
            output.WriteLine($"SWITCH POSITION: {s.Device} is probably {s.State} ({Percent(s.Probability)}), not as recorded; were it so, the fault most probably lies in {names[new Core.Model.SectionId(s.Section)]} [{s.Section}] ({Percent(s.SectionProbability)}). The ranking below assumes the recorded positions: confirm {s.Device}'s real position to rank again.");
        }

        if (d.CrossCountry is { } cross)
        {
            output.WriteLine($"CROSS-COUNTRY: no single fault explains the evidence; two earth faults on different phases do ({Percent(cross.Probability)} in all). Most probable pairs:");
            foreach (var pair in cross.Pairs.Take(5))
            {
                output.WriteLine($"  {pair.Segments[0]} ({pair.Sections[0]}) + {pair.Segments[1]} ({pair.Sections[1]}): {Percent(pair.Probability)}");
            }

            output.WriteLine("The single-fault explanations below do not fit.");
        }
        else if (!d.Consistent)
        {
            if (d.Disagreeing.Count > 0)
            {
                output.WriteLine("WARNING: no single explanation fits the evidence. Check these indications and the switch states:");
                foreach (var c in d.Disagreeing)
                {
                    output.WriteLine($"  {c.Indicator}: recorded {c.Observed}, expected {c.Expected} ({c.Verdict})");
                }
            }
            else
            {
                output.WriteLine("WARNING: no single explanation fits the evidence. The indications fit; check the substation records (the measurements below), the tripped device and the switch states.");
            }
        }

        if (d.Expired.Count > 0)
        {
            output.WriteLine($"without weight (read more than the reset time after the fault): {string.Join(", ", d.Expired)}");
        }

        var sections = TableOutput.Table("rank", "section", "id", "probability", "segments");
        foreach (var (s, i) in d.Sections.Take(8).Select((s, i) => (s, i)))
        {
            sections.AddRow((i + 1).ToString(CultureInfo.InvariantCulture), names[new Core.Model.SectionId(s.Id)], s.Id, Percent(s.Probability), string.Join(" ", s.Segments));
        }

        TableOutput.Write(output, sections);
        foreach (var suspect in d.Suspects)
        {
            output.WriteLine($"segment {suspect.Segment}: {Percent(suspect.Probability)}, best fit {suspect.FaultType} with Rf {Application.Naming.Figures.Resistance(suspect.FaultResistanceOhm)}"
                + (suspect.DistanceWindowKm is { } w ? $", {w.FromKm:F1}–{w.ToKm:F1} km from the substation" : string.Empty));
            foreach (var c in suspect.Agreeing)
            {
                output.WriteLine($"  + {c.Indicator} {c.Observed}{(c.Stale ? " (stale)" : string.Empty)}");
            }

            foreach (var c in suspect.Disagreeing)
            {
                output.WriteLine($"  - {c.Indicator} {c.Observed}, expected {c.Expected}: {c.Verdict}, probability {Percent(c.Probability)}{(c.Stale ? " (stale)" : string.Empty)}");
            }

            foreach (var m in suspect.Measurements)
            {
                output.WriteLine($"  = {m.Device} {m.Quantity}: {m.Measured:F1} recorded, {m.Predicted:F1} predicted ({DeviationText.Sigma(m.DeviationSigma)} σ)");
            }
        }

        foreach (var leftOut in d.LeftOut)
        {
            output.WriteLine($"left out (marked suspect): {leftOut}");
        }
    }

    private static string Percent(double p) => (p * 100).ToString("F1", CultureInfo.InvariantCulture) + " %";
}
