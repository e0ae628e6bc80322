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

/// <summary><c>fault GRID --segment ID ...</c>: currents, voltages and expected indications for one fault.</summary>
internal static class FaultCommand
{
    public static Command Create(CliConsole console)
    {
        var grid = CliOptions.Grid();
        var json = CliOptions.Json();
        var segment = new Option<string>("--segment") { Description = "Faulted segment id", Required = true };
        var position = new Option<double>("--position") { Description = "Fraction of the segment's length from its from node, 0..1", DefaultValueFactory = _ => 0.5 };
        var type = new Option<string>("--type") { Description = "Fault type: LG, LL, LLG or LLL", Required = true };
        var rf = new Option<double>("--rf") { Description = "Fault resistance in ohms", DefaultValueFactory = _ => 0 };
        var c = new Option<double>("--voltage-factor") { Description = "Voltage factor c (IEC 60909-0; 1.1 = cmax for MV)", DefaultValueFactory = _ => SourceImpedance.VoltageFactorMaxMediumVoltage };
        var incident = new Option<string?>("--incident") { Description = "Take the switch states at fault time from this incident file" };
        var command = new Command("fault", "Compute one fault with the reference model: fault current, neutral voltage, healthy-phase voltages and every indicator's currents and expected state")
        {
            grid, segment, position, type, rf, c, incident, json,
        };
        command.SetAction(parse => Run(
            console,
            parse.GetValue(grid)!,
            parse.GetValue(segment)!,
            parse.GetValue(position),
            parse.GetValue(type)!,
            parse.GetValue(rf),
            parse.GetValue(c),
            parse.GetValue(incident),
            parse.GetValue(json)));
        return command;
    }

    private static int Run(CliConsole console, string gridPath, string segmentId, double position, string typeText, double rfOhm, double voltageFactor, string? incidentPath, bool json)
    {
        var problems = new List<string>();
        if (!IncidentFormat.FaultTypes.TryGetValue(typeText, out var type) || type is null)
        {
            problems.Add($"error: --type must be LG, LL, LLG or LLL, got \"{typeText}\"");
        }

        if (!(position is >= 0 and <= 1))
        {
            problems.Add($"error: --position must be between 0 and 1 (fraction of the segment from its from node), got {position.ToString(CultureInfo.InvariantCulture)}");
        }

        if (!(rfOhm >= 0) || !double.IsFinite(rfOhm))
        {
            problems.Add($"error: --rf must be >= 0 ohm, got {rfOhm.ToString(CultureInfo.InvariantCulture)}");
        }

        if (!(voltageFactor is >= 0.8 and <= 1.2))
        {
            problems.Add($"error: --voltage-factor must be between 0.8 and 1.2 (IEC 60909-0 gives 1.00 to 1.10 for MV), got {voltageFactor.ToString(CultureInfo.InvariantCulture)}");
        }

        var grid = InputFiles.LoadGrid(gridPath, console.Error);
        if (!grid.HasSegment(new SegmentId(segmentId)))
        {
            problems.Add($"error: --segment \"{segmentId}\" is not a segment of grid {grid.Name}");
        }

        if (problems.Count > 0)
        {
            throw new BadInputException(problems);
        }

        var states = incidentPath is null
            ? SwitchStates.Normal(grid)
            : SwitchStates.AtFaultTime(grid, InputFiles.LoadIncident(incidentPath, grid, console.Error));
        var graph = new NetworkGraph(grid);
        if (!graph.TryEnergise(states, out var network, out var problem))
        {
            throw new BadInputException($"error: {problem}");
        }

        FaultResult result;
        try
        {
            result = FaultCurrents.At(network, new FaultCase(new SegmentId(segmentId), position, type!.Value, rfOhm, voltageFactor));
        }
        catch (FaultCaseException e)
        {
            throw new BadInputException($"error: {e.Message}");
        }

        var document = new FaultDocument(
            segmentId, position, typeText, rfOhm, voltageFactor, result.Substation.Value,
            result.FaultCurrentA, result.FaultedPhaseCurrentA, result.NeutralVoltageV, result.HealthyPhaseVoltagesV,
            [.. result.Indicators.Select(r => new IndicatorDocument(r.Id.Value, r.PhaseCurrentA, r.ResidualCurrentA, IncidentFormat.Name(r.Expected)))]);
        if (json)
        {
            JsonOutput.Write(console.Out, document);
            return CliApp.Success;
        }

        WriteTable(console.Out, grid, document);
        return CliApp.Success;
    }

    private static void WriteTable(TextWriter output, Grid grid, FaultDocument d)
    {
        output.WriteLine($"{d.Type} fault on segment {d.Segment} at {F(d.Position, 2)} of its length from its from node, Rf {F(d.FaultResistanceOhm, 1)} Ω, c = {F(d.VoltageFactor, 2)}, fed from substation {d.Substation}");
        output.WriteLine($"fault current           {F(d.FaultCurrentA, 1)} A{(d.Type is "LG" or "LLG" ? " (to earth)" : string.Empty)}");
        output.WriteLine($"faulted-phase current   {F(d.FaultedPhaseCurrentA, 1)} A");
        output.WriteLine($"neutral voltage |U0|    {F(d.NeutralVoltageV, 0)} V");
        if (d.HealthyPhaseVoltagesV.Count > 0)
        {
            output.WriteLine($"healthy-phase voltages  {string.Join(", ", d.HealthyPhaseVoltagesV.Select(v => F(v, 0) + " V"))}");
        }

        var table = TableOutput.Table("indicator", "segment", "node", "kind", "phase A", "residual A", "expected");
        foreach (var i in d.Indicators)
        {
            var indicator = grid.Indicator(new IndicatorId(i.Id));
            table.AddRow(i.Id, indicator.Segment.Value, indicator.Node.Value, indicator.Directional ? "directional" : "non-directional",
                F(i.PhaseCurrentA, 1), F(i.ResidualCurrentA, 2), i.Expected);
        }

        TableOutput.Write(output, table);
    }

    private static string F(double value, int decimals) => value.ToString("F" + decimals, CultureInfo.InvariantCulture);

    internal sealed record FaultDocument(
        string Segment,
        double Position,
        string Type,
        double FaultResistanceOhm,
        double VoltageFactor,
        string Substation,
        double FaultCurrentA,
        double FaultedPhaseCurrentA,
        double NeutralVoltageV,
        IReadOnlyList<double> HealthyPhaseVoltagesV,
        IReadOnlyList<IndicatorDocument> Indicators);

    internal sealed record IndicatorDocument(string Id, double PhaseCurrentA, double ResidualCurrentA, string Expected);
}
