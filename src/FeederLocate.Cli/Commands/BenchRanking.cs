using System.Diagnostics;
using FeederLocate.Cli.Input;
using FeederLocate.Cli.Output;
using FeederLocate.Core.Evaluation;
using FeederLocate.Core.Model;
using FeederLocate.Core.Ranking;
using FeederLocate.Core.Synthetic;
using FeederLocate.Core.Topology;

namespace FeederLocate.Cli.Commands;

/// <summary>
/// <c>bench --ranking</c>: ranks simulated incidents on a generated grid and reports the compute time
/// after load (graph built once, as the web app holds it), single-threaded.
/// </summary>
internal static class BenchRanking
{
    public static int Run(CliConsole console, int segments, int seed, double share, int rounds, bool json,
        GroundingScheme scheme = GroundingScheme.Resonant, bool protection = false)
    {
        var grid = SyntheticGrid.Generate(new SyntheticGridOptions(segments, seed, scheme, share));
        var graph = new NetworkGraph(grid);
        var simulator = new IncidentSimulator(graph, new SimulationSettings() with { ProtectionContext = protection, HighResistanceShare = protection ? 1.0 / 3 : 0 });
        var random = new Random(seed);
        var incidents = Enumerable.Range(0, rounds + 1).Select(n => simulator.Next(random, n)).ToList();
        var times = new List<double>();
        var cpuTimes = new List<double>();
        var hits = 0;
        var clock = new Stopwatch();
        ProgressDisplay.Run(console, "bench ranking", progress =>
        {
            for (var n = 0; n < incidents.Count; n++)
            {
                var cpuBefore = Environment.CpuUsage.TotalTime;
                clock.Restart();
                var result = FaultRanking.Rank(graph, incidents[n].Incident);
                var ms = clock.Elapsed.TotalMilliseconds;
                var cpuMs = (Environment.CpuUsage.TotalTime - cpuBefore).TotalMilliseconds;
                if (n > 0)
                {
                    times.Add(ms);
                    cpuTimes.Add(cpuMs);
                    hits += graph.Sections.OfSegment(grid.SegmentIndex(incidents[n].Segment)).Id == result.Sections[0].Id ? 1 : 0;
                }

                progress.Report((n + 1) / (double)incidents.Count);
            }

            return 0;
        });

        times.Sort();
        cpuTimes.Sort();
        var document = new Document(grid.Segments.Length, grid.Indicators.Length, times.Count, times[0], times[times.Count / 2], times[^1], hits)
        {
            CpuMedianMs = cpuTimes[cpuTimes.Count / 2],
            CpuSlowestMs = cpuTimes[^1],
        };
        if (json)
        {
            JsonOutput.Write(console.Out, document);
            return CliApp.Success;
        }

        var table = TableOutput.Table("measure", "value");
        table.AddRow("grid", $"{document.Segments} segments, {document.Indicators} indicators (generated, {Core.Formats.GridFormat.Name(scheme)}, seed {seed}{(protection ? ", with protection context and high-resistance earth faults" : string.Empty)})");
        table.AddRow("incidents ranked (after one warm-up)", document.Incidents.ToString(System.Globalization.CultureInfo.InvariantCulture));
        table.AddRow("rank time, fastest", $"{document.FastestMs:F1} ms");
        table.AddRow("rank time, median", $"{document.MedianMs:F1} ms");
        table.AddRow("rank time, slowest", $"{document.SlowestMs:F1} ms");
        table.AddRow("process CPU time per ranking, median / slowest", $"{document.CpuMedianMs:F1} ms / {document.CpuSlowestMs:F1} ms");
        table.AddRow("true section ranked first", $"{document.SectionTop1Hits} of {document.Incidents}");
        TableOutput.Write(console.Out, table);
        return CliApp.Success;
    }

    /// <summary>The grounding scheme named on the command line.</summary>
    public static GroundingScheme Scheme(string name) =>
        Core.Formats.GridFormat.Schemes.TryGetValue(name, out var scheme)
            ? scheme
            : throw new BadInputException($"error: --scheme must be one of {string.Join(", ", Core.Formats.GridFormat.Schemes.Keys)}, got \"{name}\"");

    /// <summary>The bench's figures; the CPU times are the process's (every thread, the collector's too), robust to a loaded machine.</summary>
    internal sealed record Document(int Segments, int Indicators, int Incidents, double FastestMs, double MedianMs, double SlowestMs, int SectionTop1Hits)
    {
        public double CpuMedianMs { get; init; }

        public double CpuSlowestMs { get; init; }
    }
}
