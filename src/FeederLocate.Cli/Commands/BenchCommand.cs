using System.CommandLine;
using System.Diagnostics;
using System.Globalization;
using FeederLocate.Cli.Input;
using FeederLocate.Cli.Output;
using FeederLocate.Core.Electrical;
using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;
using FeederLocate.Core.Synthetic;
using FeederLocate.Core.Topology;

namespace FeederLocate.Cli.Commands;

/// <summary>
/// <c>bench</c>: measures the engine on a generated grid — every indicator's response to a fault at
/// every segment, as the ranking needs it. A benchmark, not a test: it reports, it asserts nothing.
/// </summary>
internal static class BenchCommand
{
    public static Command Create(CliConsole console)
    {
        var segments = new Option<int>("--segments") { Description = "Segments of the generated grid", DefaultValueFactory = _ => 10_000 };
        var seed = new Option<int>("--seed") { Description = "Seed of the generated grid", DefaultValueFactory = _ => 1 };
        var share = new Option<double>("--indicators-per-segment") { Description = "Share of segments with an indicator", DefaultValueFactory = _ => 0.1 };
        var positions = new Option<int>("--positions") { Description = "Fault positions per segment", DefaultValueFactory = _ => 3 };
        var rounds = new Option<int>("--rounds") { Description = "Measured rounds (after one warm-up round); the fastest is reported", DefaultValueFactory = _ => 3 };
        var ranking = new Option<bool>("--ranking") { Description = "Measure the ranking of simulated incidents instead of the engine sweep" };
        var plan = new Option<bool>("--plan") { Description = "Measure the switching plan of simulated incidents instead of the engine sweep" };
        var scheme = new Option<string>("--scheme") { Description = "With --ranking: grounding of the generated grid (isolated, resonant, solid, impedance)", DefaultValueFactory = _ => "resonant" };
        var protection = new Option<bool>("--protection") { Description = "With --ranking: incidents carry the protection context, and a third of the earth faults on solid and impedance grids go through a high resistance" };
        var crewBases = new Option<int>("--crew-bases") { Description = "With --plan: crew bases of the generated grid, one at each substation's bus in turn (0: no crews, a crew of its own for every manual device)", DefaultValueFactory = _ => 2 };
        var crewsPerBase = new Option<int>("--crews-per-base") { Description = "With --plan: crews at each base", DefaultValueFactory = _ => 2 };
        var json = CliOptions.Json();
        var command = new Command("bench", "Benchmark the fault engine (every indicator's response for a fault on every segment of a generated grid) or, with --ranking, the ranking")
        {
            segments, seed, share, positions, rounds, ranking, plan, scheme, protection, crewBases, crewsPerBase, json,
        };
        command.SetAction(parse => parse.GetValue(plan)
            ? BenchPlan.Run(console, parse.GetValue(segments), parse.GetValue(seed), parse.GetValue(share), parse.GetValue(rounds), parse.GetValue(json),
                parse.GetValue(crewBases), parse.GetValue(crewsPerBase))
            : parse.GetValue(ranking)
            ? BenchRanking.Run(console, parse.GetValue(segments), parse.GetValue(seed), parse.GetValue(share), parse.GetValue(rounds), parse.GetValue(json),
                BenchRanking.Scheme(parse.GetValue(scheme)!), parse.GetValue(protection))
            : Run(console, parse.GetValue(segments), parse.GetValue(seed), parse.GetValue(share),
                parse.GetValue(positions), parse.GetValue(rounds), parse.GetValue(json)));
        return command;
    }

    private static int Run(CliConsole console, int segments, int seed, double share, int positions, int rounds, bool json)
    {
        if (segments < 1 || positions < 1 || rounds < 1 || !(share is >= 0 and <= 1))
        {
            throw new BadInputException("error: --segments, --positions and --rounds must be >= 1 and --indicators-per-segment within 0..1");
        }

        var clock = Stopwatch.StartNew();
        var grid = SyntheticGrid.Generate(new SyntheticGridOptions(segments, seed, Core.Model.GroundingScheme.Resonant, share));
        var generateMs = clock.Elapsed.TotalMilliseconds;
        clock.Restart();
        var graph = new NetworkGraph(grid);
        var graphMs = clock.Elapsed.TotalMilliseconds;
        clock.Restart();
        var network = graph.Energise(SwitchStates.Normal(grid));
        var energiseMs = clock.Elapsed.TotalMilliseconds;
        clock.Restart();
        var model = FaultCurrents.Model(network);
        var compileMs = clock.Elapsed.TotalMilliseconds;

        var best = double.MaxValue;
        long picked = 0;
        ProgressDisplay.Run(console, "bench", progress =>
        {
            for (var round = 0; round <= rounds; round++)
            {
                clock.Restart();
                picked = Sweep(model, grid, positions);
                var ms = clock.Elapsed.TotalMilliseconds;
                if (round > 0)
                {
                    best = Math.Min(best, ms);
                }

                progress.Report((round + 1) / (double)(rounds + 1));
            }

            return 0;
        });

        var faults = (long)grid.Segments.Length * positions;
        var readings = faults * grid.Indicators.Length;
        var document = new BenchDocument(grid.Segments.Length, grid.Indicators.Length, positions, faults, readings, generateMs, graphMs, energiseMs, compileMs, best,
            best * 1e6 / Math.Max(1, readings), faults / (best / 1000), picked, Environment.ProcessorCount);
        if (json)
        {
            JsonOutput.Write(console.Out, document);
            return CliApp.Success;
        }

        var table = TableOutput.Table("measure", "value");
        table.AddRow("grid", $"{document.Segments} segments, {document.Indicators} indicators (generated, seed {seed})");
        table.AddRow("faults (LG, Rf 0)", $"{document.Faults} ({positions} positions per segment)");
        table.AddRow("indicator readings per sweep", document.Readings.ToString(CultureInfo.InvariantCulture));
        table.AddRow("grid generation (includes JIT warm-up)", $"{generateMs:F1} ms");
        table.AddRow("graph and sections build", $"{graphMs:F1} ms");
        table.AddRow("energise (radial tree, impedances)", $"{energiseMs:F1} ms");
        table.AddRow("model compile", $"{compileMs:F1} ms");
        table.AddRow("sweep (fastest of rounds)", $"{best:F1} ms");
        table.AddRow("per indicator reading", $"{document.NanosecondsPerReading:F1} ns");
        table.AddRow("faults per second", $"{document.FaultsPerSecond:F0}");
        table.AddRow("indicators picking up (check sum)", picked.ToString(CultureInfo.InvariantCulture));
        TableOutput.Write(console.Out, table);
        return CliApp.Success;
    }

    /// <summary>Every indicator's reading for an earth fault at each position of every segment.</summary>
    private static long Sweep(FaultResponseModel model, Grid grid, int positions)
    {
        long picked = 0;
        for (var s = 0; s < grid.Segments.Length; s++)
        {
            for (var p = 0; p < positions; p++)
            {
                var fault = model.Solve(s, (p + 0.5) / positions, FaultType.LG, 0);
                for (var i = 0; i < grid.Indicators.Length; i++)
                {
                    if (model.Read(fault, i).Expected != IndicatorState.None)
                    {
                        picked++;
                    }
                }
            }
        }

        return picked;
    }

    internal sealed record BenchDocument(
        int Segments,
        int Indicators,
        int PositionsPerSegment,
        long Faults,
        long Readings,
        double GenerateMs,
        double GraphBuildMs,
        double EnergiseMs,
        double ModelCompileMs,
        double SweepMs,
        double NanosecondsPerReading,
        double FaultsPerSecond,
        long PickedUpReadings,
        int ProcessorCount);
}
