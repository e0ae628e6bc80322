using System.Globalization;
using FeederLocate.Cli.Input;
using FeederLocate.Cli.Output;
using FeederLocate.Core.Evaluation;
using FeederLocate.Core.Model;

namespace FeederLocate.Cli.Commands;

/// <summary>
/// <c>evaluate GRID --learning</c>: the learning curve on a simulated history with one segment failing
/// five times as often as nominal and one indicator reporting falsely half the time.
/// </summary>
internal static class EvaluateLearning
{
    public static int Run(CliConsole console, Grid grid, int historyLength, int testIncidents, int seed, string? hotSegment, string? noisyIndicator, bool json)
    {
        var hot = hotSegment is null ? DefaultHotSegment(grid) : new SegmentId(hotSegment);
        var noisy = noisyIndicator is null ? DefaultNoisyIndicator(grid) : new IndicatorId(noisyIndicator);
        if (!grid.HasSegment(hot))
        {
            throw new BadInputException($"error: --hot-segment \"{hot}\" is not a segment of grid {grid.Name}");
        }

        if (!grid.HasIndicator(noisy))
        {
            throw new BadInputException($"error: --noisy-indicator \"{noisy}\" is not an indicator of grid {grid.Name}");
        }

        int[] checkpoints = [.. new[] { 0, 10, 25, 50, 100, 200, 400 }.Where(k => k < historyLength).Append(historyLength).Distinct()];
        var report = ProgressDisplay.Run(console, "learning curve", progress =>
            LearningEvaluation.Run(grid, checkpoints, testIncidents, seed, hot, noisy, progress: progress));
        if (json)
        {
            JsonOutput.Write(console.Out, new
            {
                hotSegment = report.HotSegment.Value,
                hotSegmentRateFactor = report.HotSegmentRateFactor,
                noisyIndicator = report.NoisyIndicator.Value,
                noisyFalseProbability = report.NoisyFalseProbability,
                testIncidents = report.TestIncidents,
                curve = report.Curve.Select(p => new { outcomes = p.Outcomes, sectionTop1 = p.SectionTop1 }),
                truthSectionTop1 = report.TruthSectionTop1,
            });
            return CliApp.Success;
        }

        console.Out.WriteLine($"{grid.Name}: segment {hot} fails {report.HotSegmentRateFactor}× as often as nominal; indicator {noisy} reports falsely {report.NoisyFalseProbability:P0} of the time; {testIncidents} test incidents, seed {seed}");
        var table = TableOutput.Table("outcomes recorded", "section top-1");
        foreach (var point in report.Curve)
        {
            table.AddRow(point.Outcomes.ToString(CultureInfo.InvariantCulture), point.SectionTop1.ToString("P1", CultureInfo.InvariantCulture));
        }

        table.AddRow("told the truth", report.TruthSectionTop1.ToString("P1", CultureInfo.InvariantCulture));
        TableOutput.Write(console.Out, table);
        return CliApp.Success;
    }

    /// <summary>The longest overhead segment, else the longest segment: a plausible hot spot.</summary>
    private static SegmentId DefaultHotSegment(Grid grid) =>
        grid.Segments.OrderByDescending(s => grid.LineTypeOf(s).Construction == Construction.Overhead).ThenByDescending(s => s.LengthKm).First().Id;

    /// <summary>
    /// The remote directional indicator looking away from the source with the most of the network on its
    /// path: a false forward there pulls the ranking far off.
    /// </summary>
    private static IndicatorId DefaultNoisyIndicator(Grid grid)
    {
        var network = new Core.Topology.NetworkGraph(grid).Energise(Core.Topology.SwitchStates.Normal(grid));
        int Depth(NodeId node) => network.PathFromSource(node).Count;
        return (grid.Indicators
            .Where(i => i.Directional && i.Remote && network.IsSegmentEnergised(i.Segment) && network.FacesAwayFromSource(i))
            .OrderByDescending(i => Depth(i.Node))
            .FirstOrDefault() ?? grid.Indicators[0]).Id;
    }
}
