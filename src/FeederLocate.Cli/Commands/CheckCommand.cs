using System.CommandLine;
using System.Globalization;
using FeederLocate.Cli.Input;
using FeederLocate.Cli.Output;
using FeederLocate.Core.Electrical;
using FeederLocate.Core.Evidence;
using FeederLocate.Core.Formats;
using FeederLocate.Core.Model;
using FeederLocate.Core.Topology;

namespace FeederLocate.Cli.Commands;

/// <summary><c>check GRID</c>: validates a grid file and summarises it.</summary>
internal static class CheckCommand
{
    public static Command Create(CliConsole console)
    {
        var grid = CliOptions.Grid();
        var json = CliOptions.Json();
        var command = new Command("check", "Validate a grid file: every problem with its element and field; a summary when it is valid") { grid, json };
        command.SetAction(parse => Run(console, parse.GetValue(grid)!, parse.GetValue(json)));
        return command;
    }

    private static int Run(CliConsole console, string path, bool json)
    {
        var result = GridReader.Parse(InputFiles.ReadText(path, "grid"));
        var errors = result.Errors.Select(IssueDocument.From).ToList();
        var warnings = result.Warnings.Select(IssueDocument.From).ToList();
        foreach (var issue in result.Issues)
        {
            console.Error.WriteLine($"{(issue.Severity == Severity.Error ? "error" : "warning")}: {issue}");
        }

        if (result.Value is not { } model)
        {
            if (json)
            {
                JsonOutput.Write(console.Out, new CheckDocument(false, errors, warnings, 0, 0, 0, []));
            }

            return CliApp.BadInput;
        }

        var graph = new NetworkGraph(model);
        var network = graph.Energise(SwitchStates.Normal(model));
        var aggregates = NetworkAggregates.Of(network);
        var substations = model.Substations.Select((s, i) => Summarise(model, network, aggregates, s, i)).ToList();
        var document = new CheckDocument(true, errors, warnings, model.Segments.Length, graph.Sections.All.Length, model.Indicators.Length, substations);
        if (json)
        {
            JsonOutput.Write(console.Out, document);
            return CliApp.Success;
        }

        console.Out.WriteLine($"{model.Name}: valid");
        console.Out.WriteLine($"{model.Segments.Length} segments in {graph.Sections.All.Length} sections, {model.Indicators.Length} indicators, " +
            $"{model.Switches.Length} switches ({model.Switches.Count(s => s.NormallyOpen)} normally open), {model.Nodes.Sum(n => n.Customers)} customers");
        var table = TableOutput.Table("substation", "scheme", "feeders", "cable km", "overhead km", "I_C bolted earth fault A", "I\"k3 at bus kA");
        foreach (var s in substations)
        {
            table.AddRow(s.Id, s.Scheme, s.Feeders.ToString(CultureInfo.InvariantCulture), F(s.CableKm, 1), F(s.OverheadKm, 1),
                F(s.ChargingCurrentA, 1), F(s.ThreePhaseBusFaultKa, 2));
        }

        TableOutput.Write(console.Out, table);
        foreach (var w in warnings)
        {
            console.Out.WriteLine($"warning: {w.Text}");
        }

        return CliApp.Success;
    }

    private static SubstationSummary Summarise(Grid grid, EnergisedNetwork network, NetworkAggregates aggregates, Substation substation, int index)
    {
        var fed = grid.Segments.Where((_, i) => network.IsSegmentEnergised(i) && network.SubstationIndexOf(network.SuppliedEndOf(i)) == index).ToList();
        double Km(Construction c) => fed.Where(s => grid.LineTypeOf(s).Construction == c).Sum(s => s.LengthKm);
        var e = Units.PhaseVoltageV(substation.NominalVoltageKv, SourceImpedance.VoltageFactorMaxMediumVoltage);
        var chargingA = 3 * grid.AngularFrequencyRadPerS * aggregates.TotalCapacitanceF(index) * e;
        var zq = SourceImpedance.AtBusbarOhm(substation, SourceImpedance.VoltageFactorMaxMediumVoltage);
        var ik3 = SequenceFault.Solve(FaultType.LLL, e, zq, System.Numerics.Complex.Zero, System.Numerics.Complex.Zero, 0).PositiveA.Magnitude;
        var feeders = grid.Switches.Count(s => s.Kind == SwitchKind.Breaker && (s.From == substation.BusNode || s.To == substation.BusNode));
        return new SubstationSummary(substation.Id.Value, GridFormat.Name(substation.Grounding.Scheme), feeders, Km(Construction.Cable), Km(Construction.Overhead), chargingA, ik3 / 1000);
    }

    private static string F(double value, int decimals) => value.ToString("F" + decimals, CultureInfo.InvariantCulture);

    internal sealed record CheckDocument(
        bool Valid,
        IReadOnlyList<IssueDocument> Errors,
        IReadOnlyList<IssueDocument> Warnings,
        int Segments,
        int Sections,
        int Indicators,
        IReadOnlyList<SubstationSummary> Substations);

    /// <param name="ChargingCurrentA">3ωC0·E of everything fed from the bus: the bolted earth-fault current if isolated.</param>
    internal sealed record SubstationSummary(string Id, string Scheme, int Feeders, double CableKm, double OverheadKm, double ChargingCurrentA, double ThreePhaseBusFaultKa);
}

/// <summary>A validation issue as printed in JSON.</summary>
internal sealed record IssueDocument(string ElementKind, string ElementId, string Field, string Message, string Text)
{
    public static IssueDocument From(ValidationIssue issue) =>
        new(issue.ElementKind, issue.ElementId, issue.Field, issue.Message, issue.ToString());
}
