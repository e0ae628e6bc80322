using System.CommandLine;
using FeederLocate.Cli.Input;
using FeederLocate.Core.Formats;
using FeederLocate.Core.Model;
using FeederLocate.Core.Synthetic;

namespace FeederLocate.Cli.Commands;

/// <summary><c>generate --segments N --seed S</c>: writes a large synthetic radial grid in the grid format.</summary>
internal static class GenerateCommand
{
    public static Command Create(CliConsole console)
    {
        var segments = new Option<int>("--segments") { Description = "Number of segments", Required = true };
        var seed = new Option<int>("--seed") { Description = "Seed: the same seed gives the same grid", DefaultValueFactory = _ => 1 };
        var scheme = new Option<string>("--scheme") { Description = "Grounding: isolated, resonant, solid or impedance", DefaultValueFactory = _ => "resonant" };
        var share = new Option<double>("--indicators-per-segment") { Description = "Share of segments with an indicator, 0..1", DefaultValueFactory = _ => 0.1 };
        var substations = new Option<int>("--substations") { Description = "Number of substations", DefaultValueFactory = _ => 2 };
        var output = new Option<string?>("--output", "-o") { Description = "Grid file to write (default: stdout)" };
        var command = new Command("generate", "Write a synthetic radial grid (for benchmarks); the numbers are invented")
        {
            segments, seed, scheme, share, substations, output,
        };
        command.SetAction(parse => Run(console, parse.GetValue(segments), parse.GetValue(seed), parse.GetValue(scheme)!,
            parse.GetValue(share), parse.GetValue(substations), parse.GetValue(output)));
        return command;
    }

    private static int Run(CliConsole console, int segments, int seed, string schemeText, double share, int substations, string? output)
    {
        var problems = new List<string>();
        if (segments is < 1 or > InputLimits.MaxGeneratedSegments)
        {
            problems.Add($"error: --segments must be between 1 and {InputLimits.MaxGeneratedSegments}, got {segments}");
        }

        if (!GridFormat.Schemes.TryGetValue(schemeText, out var scheme))
        {
            problems.Add($"error: --scheme must be isolated, resonant, solid or impedance, got \"{schemeText}\"");
        }

        if (!(share is >= 0 and <= 1))
        {
            problems.Add($"error: --indicators-per-segment must be between 0 and 1, got {share}");
        }

        if (substations < 1)
        {
            problems.Add($"error: --substations must be >= 1, got {substations}");
        }

        if (problems.Count > 0)
        {
            throw new BadInputException(problems);
        }

        var grid = SyntheticGrid.Generate(new SyntheticGridOptions(segments, seed, scheme, share, Substations: substations));
        var text = GridWriter.Write(grid);
        if (output is null)
        {
            console.Out.Write(text);
            return CliApp.Success;
        }

        OutputFiles.WriteWhole(output, text);
        console.Error.WriteLine($"wrote {output}: {grid.Segments.Length} segments, {grid.Switches.Length} switches, {grid.Indicators.Length} indicators, {grid.Substations.Length} substations ({GridFormat.Name(scheme)})");
        return CliApp.Success;
    }
}
