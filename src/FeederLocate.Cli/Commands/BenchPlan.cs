using System.Diagnostics;
using System.Globalization;
using System.Security.Cryptography;
using System.Text.Json;
using FeederLocate.Cli.Input;
using FeederLocate.Cli.Output;
using FeederLocate.Core.Evaluation;
using FeederLocate.Core.Formats.Documents;
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

    public static int Run(CliConsole console, int segments, int seed, double share, int rounds, bool json, int crewBases, int crewsPerBase)
    {
        if (segments < 1 || rounds < 1 || crewBases < 0 || crewsPerBase is < 1 or > 1000 || !(share is >= 0 and <= 1))
        {
            throw new BadInputException("error: --segments and --rounds must be >= 1, --crew-bases >= 0, --crews-per-base within 1..1000 and --indicators-per-segment within 0..1");
        }

        var options = new SyntheticGridOptions(segments, seed, GroundingScheme.Solid, share) { CrewBases = crewBases, CrewsPerBase = crewsPerBase };
        var grid = Scaled(SyntheticGrid.Generate(options), LoadScale);
        var graph = new NetworkGraph(grid);
        var simulator = new IncidentSimulator(graph, new SimulationSettings());
        var random = new Random(seed);
        var incidents = Enumerable.Range(0, rounds + 1).Select(n => simulator.Next(random, n)).ToList();
        var rankings = incidents.Select(i => FaultRanking.Rank(graph, i.Incident)).ToList();
        var times = new List<double>();
        var cpuTimes = new List<double>();
        long steps = 0, restored = 0, tests = 0;
        var repeated = true;
        using var digest = IncrementalHash.CreateHash(HashAlgorithmName.SHA256);
        var clock = new Stopwatch();
        var process = Process.GetCurrentProcess();
        ProgressDisplay.Run(console, "bench plan", progress =>
        {
            for (var n = 0; n < incidents.Count; n++)
            {
                process.Refresh();
                var cpuBefore = process.TotalProcessorTime;
                clock.Restart();
                var plan = SwitchingPlanner.Plan(graph, incidents[n].Incident, rankings[n]);
                var ms = clock.Elapsed.TotalMilliseconds;
                process.Refresh();
                var cpuMs = (process.TotalProcessorTime - cpuBefore).TotalMilliseconds;

                // No clock or thread enters the planner: planning again gives the same plan.
                repeated &= Same(plan, SwitchingPlanner.Plan(graph, incidents[n].Incident, rankings[n]));

                // The plan document as the command line and the API give it: equal digests on two machines mean equal plans.
                digest.AppendData(JsonSerializer.SerializeToUtf8Bytes(PlanDocument.From(plan, rankings[n]), JsonOutput.Options));
                if (n > 0)
                {
                    times.Add(ms);
                    cpuTimes.Add(cpuMs);
                    steps += plan.Steps.Length;
                    restored += plan.RestoredCustomers;
                    tests += plan.TestOrder.Length;
                }

                progress.Report((n + 1) / (double)incidents.Count);
            }

            return 0;
        });

        times.Sort();
        cpuTimes.Sort();
        var document = new Document(grid.Segments.Length, grid.Switches.Length, times.Count, times[0], times[times.Count / 2], times[^1],
            cpuTimes[cpuTimes.Count / 2], cpuTimes[^1], repeated,
            steps / (double)times.Count, restored / (double)times.Count, tests / (double)times.Count,
            grid.CrewBases.Length, grid.CrewBases.Sum(b => b.Count), Convert.ToHexStringLower(digest.GetHashAndReset()));
        if (json)
        {
            JsonOutput.Write(console.Out, document);
            return CliApp.Success;
        }

        var table = TableOutput.Table("measure", "value");
        table.AddRow("grid", $"{document.Segments} segments, {document.Switches} switches (generated, solid, seed {seed}, loads scaled to {LoadScale * 100:F0} %)");
        table.AddRow("crews", document.CrewBases == 0
            ? "none in the grid: a crew of its own for every manual device"
            : $"{document.Crews} at {document.CrewBases} bases (generated travel times)");
        table.AddRow("incidents planned (after one warm-up)", document.Incidents.ToString(CultureInfo.InvariantCulture));
        table.AddRow("plan time, fastest", $"{document.FastestMs:F1} ms");
        table.AddRow("plan time, median", $"{document.MedianMs:F1} ms");
        table.AddRow("plan time, slowest", $"{document.SlowestMs:F1} ms");
        table.AddRow("processor time, median", $"{document.MedianCpuMs:F1} ms (all threads of the process, garbage collection included)");
        table.AddRow("processor time, slowest", $"{document.SlowestCpuMs:F1} ms");
        table.AddRow("same plan when planned again", document.Repeatable ? "yes, every incident" : "NO");
        table.AddRow("plans digest (SHA-256 of every plan document)", document.PlansSha256);
        table.AddRow("machine load (1-minute average)", LoadAverage());
        table.AddRow("steps per plan (mean)", document.MeanSteps.ToString("F1", CultureInfo.InvariantCulture));
        table.AddRow("customers restored per plan (mean)", document.MeanRestoredCustomers.ToString("F0", CultureInfo.InvariantCulture));
        table.AddRow("test-order entries per plan (mean)", document.MeanTestEntries.ToString("F1", CultureInfo.InvariantCulture));
        TableOutput.Write(console.Out, table);
        return CliApp.Success;
    }

    private static bool Same(SwitchingPlan a, SwitchingPlan b) =>
        a.RestoredCustomers == b.RestoredCustomers && a.UnservedCustomers == b.UnservedCustomers && a.CustomerMinutesInterrupted.Equals(b.CustomerMinutesInterrupted)
        && a.Steps.Select(s => (s.Order, s.Action, s.Device, s.At, s.Reason, s.Crew)).SequenceEqual(b.Steps.Select(s => (s.Order, s.Action, s.Device, s.At, s.Reason, s.Crew)));

    /// <summary>The 1-minute load average where the system gives it (Linux), so that figures taken on a busy machine say so.</summary>
    private static string LoadAverage()
    {
        try
        {
            return File.Exists("/proc/loadavg") ? File.ReadAllText("/proc/loadavg").Split(' ')[0] + $" on {Environment.ProcessorCount} processors" : "not known";
        }
        catch (IOException)
        {
            return "not known";
        }
    }

    private static Grid Scaled(Grid grid, double factor) => Grid.Create(
        grid.Name, grid.FrequencyHz, grid.LineTypes, grid.Substations,
        grid.Nodes.Select(n => n with { LoadKw = n.LoadKw * factor, LoadKvar = n.LoadKvar * factor }),
        grid.Segments, grid.Switches, grid.Indicators).WithCrewBases(grid.CrewBases);

    internal sealed record Document(int Segments, int Switches, int Incidents, double FastestMs, double MedianMs, double SlowestMs,
        double MedianCpuMs, double SlowestCpuMs, bool Repeatable, double MeanSteps, double MeanRestoredCustomers, double MeanTestEntries,
        int CrewBases, int Crews, string PlansSha256);
}
