using System.Diagnostics;
using System.Globalization;
using FeederLocate.Cli.Output;
using FeederLocate.Core.Evaluation;
using FeederLocate.Core.Model;
using FeederLocate.Core.Ranking;
using FeederLocate.Core.Switching;
using FeederLocate.Core.Synthetic;
using FeederLocate.Core.Topology;

namespace FeederLocate.Cli.Commands;

/// <summary>
/// <c>bench --plan</c>: plans simulated incidents on a generated grid (solidly grounded, so every fault
/// trips and restoration through ties is exercised) and reports the planning time after load and ranking
/// (graph built once), single-threaded. A benchmark: it reports, it asserts nothing.
/// </summary>
internal static class BenchPlan
{
    /// <summary>
    /// The generator's loads sum to far more than its two 40 MVA transformers carry, so nothing could be
    /// restored and the candidate search would end at once; scaled to 5 % they fit, and restoration is measured.
    /// </summary>
    private const double LoadScale = 0.05;

    public static int Run(CliConsole console, int segments, int seed, double share, int rounds, bool json)
    {
        var grid = Scaled(SyntheticGrid.Generate(new SyntheticGridOptions(segments, seed, GroundingScheme.Solid, share)), LoadScale);
        var graph = new NetworkGraph(grid);
        var simulator = new IncidentSimulator(graph, new SimulationSettings());
        var random = new Random(seed);
        var incidents = Enumerable.Range(0, rounds + 1).Select(n => simulator.Next(random, n)).ToList();
        var rankings = incidents.Select(i => FaultRanking.Rank(graph, i.Incident)).ToList();
        var times = new List<double>();
        long steps = 0, restored = 0, tests = 0;
        var clock = new Stopwatch();
        ProgressDisplay.Run(console, "bench plan", progress =>
        {
            for (var n = 0; n < incidents.Count; n++)
            {
                clock.Restart();
                var plan = SwitchingPlanner.Plan(graph, incidents[n].Incident, rankings[n]);
                var ms = clock.Elapsed.TotalMilliseconds;
                if (n > 0)
                {
                    times.Add(ms);
                    steps += plan.Steps.Length;
                    restored += plan.RestoredCustomers;
                    tests += plan.TestOrder.Length;
                }

                progress.Report((n + 1) / (double)incidents.Count);
            }

            return 0;
        });

        times.Sort();
        var document = new Document(grid.Segments.Length, grid.Switches.Length, times.Count, times[0], times[times.Count / 2], times[^1],
            steps / (double)times.Count, restored / (double)times.Count, tests / (double)times.Count);
        if (json)
        {
            JsonOutput.Write(console.Out, document);
            return CliApp.Success;
        }

        var table = TableOutput.Table("measure", "value");
        table.AddRow("grid", $"{document.Segments} segments, {document.Switches} switches (generated, solid, seed {seed}, loads scaled to {LoadScale * 100:F0} %)");
        table.AddRow("incidents planned (after one warm-up)", document.Incidents.ToString(CultureInfo.InvariantCulture));
        table.AddRow("plan time, fastest", $"{document.FastestMs:F1} ms");
        table.AddRow("plan time, median", $"{document.MedianMs:F1} ms");
        table.AddRow("plan time, slowest", $"{document.SlowestMs:F1} ms");
        table.AddRow("steps per plan (mean)", document.MeanSteps.ToString("F1", CultureInfo.InvariantCulture));
        table.AddRow("customers restored per plan (mean)", document.MeanRestoredCustomers.ToString("F0", CultureInfo.InvariantCulture));
        table.AddRow("test-order entries per plan (mean)", document.MeanTestEntries.ToString("F1", CultureInfo.InvariantCulture));
        TableOutput.Write(console.Out, table);
        return CliApp.Success;
    }

    private static Grid Scaled(Grid grid, double factor) => Grid.Create(
        grid.Name, grid.FrequencyHz, grid.LineTypes, grid.Substations,
        grid.Nodes.Select(n => n with { LoadKw = n.LoadKw * factor, LoadKvar = n.LoadKvar * factor }),
        grid.Segments, grid.Switches, grid.Indicators);

    internal sealed record Document(int Segments, int Switches, int Incidents, double FastestMs, double MedianMs, double SlowestMs,
        double MeanSteps, double MeanRestoredCustomers, double MeanTestEntries);
}
