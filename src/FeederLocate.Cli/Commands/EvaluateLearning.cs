using System.Globalization;
using FeederLocate.Cli.Input;
using FeederLocate.Cli.Output;
using FeederLocate.Core.Evaluation;
using FeederLocate.Core.Model;
using FeederLocate.Core.Ranking;

namespace FeederLocate.Cli.Commands;

/// <summary>The two defects injected into the simulated history of <c>evaluate --learning</c>; null ids pick defaults.</summary>
internal sealed record LearningDefects(string? HotSegment, string? NoisyIndicator, double HotFactor, double NoisyFalseProbability);

/// <summary>
/// <c>evaluate GRID --learning</c>: the learning curve on a simulated history with one segment failing
/// --hot-factor times as often as nominal and one indicator reporting falsely with probability --noisy-false.
/// </summary>
internal static class EvaluateLearning
{
    public static int Run(CliConsole console, Grid grid, int historyLength, int testIncidents, int seed, LearningDefects defects, bool fixedStrengths, bool json)
    {
        var hot = defects.HotSegment is null ? DefaultHotSegment(grid) : new SegmentId(defects.HotSegment);
        var noisy = defects.NoisyIndicator is null ? DefaultNoisyIndicator(grid) : new IndicatorId(defects.NoisyIndicator);
        if (!grid.HasSegment(hot))
        {
            throw new BadInputException($"error: --hot-segment \"{hot}\" is not a segment of grid {grid.Name}");
        }

        if (!grid.HasIndicator(noisy))
        {
            throw new BadInputException($"error: --noisy-indicator \"{noisy}\" is not an indicator of grid {grid.Name}");
        }

        if (!(defects.HotFactor is > 0 and <= 1000))
        {
            throw new BadInputException($"error: --hot-factor must be above 0 and at most 1000, got {defects.HotFactor.ToString(CultureInfo.InvariantCulture)}");
        }

        if (!(defects.NoisyFalseProbability is >= 0 and <= 1))
        {
            throw new BadInputException($"error: --noisy-false is a probability: 0 to 1, got {defects.NoisyFalseProbability.ToString(CultureInfo.InvariantCulture)}");
        }

        int[] checkpoints = [.. new[] { 0, 10, 25, 40, 50, 100, 200, 400 }.Where(k => k < historyLength).Append(historyLength).Distinct()];
        var chosen = LearnedRankingPriors.Options;
        var learning = fixedStrengths
            ? chosen with
            {
                FaultRates = chosen.FaultRates with { ChooseStrengthsByData = false },
                Indicators = chosen.Indicators with { ChooseStrengthsByData = false },
            }
            : chosen;
        var report = ProgressDisplay.Run(console, "learning curve", progress =>
            LearningEvaluation.Run(grid, checkpoints, testIncidents, seed, hot, noisy, defects.HotFactor, defects.NoisyFalseProbability, progress, learning));
        if (json)
        {
            JsonOutput.Write(console.Out, new
            {
                grid = grid.Name,
                scheme = grid.Substations.Select(s => s.Grounding.Scheme.ToString()).Distinct(),
                hotSegment = report.HotSegment.Value,
                hotSegmentRateFactor = report.HotSegmentRateFactor,
                hotSegmentTrueFaultsPer100KmYear = report.HotSegmentTrueFaultsPer100KmYear,
                noisyIndicator = report.NoisyIndicator.Value,
                noisyFalseProbability = report.NoisyFalseProbability,
                testIncidents = report.TestIncidents,
                seed,
                priorStrengths = fixedStrengths ? "fixed" : "chosen by the data",
                curve = report.Curve.Select(p => new
                {
                    outcomes = p.Outcomes,
                    sectionTop1 = p.SectionTop1,
                    gapRecovered = Finite(report.GapRecovered(p)),
                    hotSegmentFaultsPer100KmYear = p.HotSegmentFaultsPer100KmYear,
                    hotSegmentOutcomes = p.HotSegmentOutcomes,
                    observationYears = p.ObservationYears,
                    hotSegmentObservedFaultsPer100KmYear = Finite(p.HotSegmentObservedFaultsPer100KmYear),
                    noisyFalseReportProbability = p.NoisyFalseReportProbability,
                    skipped = p.Skipped,
                }),
                truthSectionTop1 = report.TruthSectionTop1,
            });
            return CliApp.Success;
        }

        var invariant = CultureInfo.InvariantCulture;
        console.Out.WriteLine($"{grid.Name} (prior strengths {(fixedStrengths ? "fixed" : "chosen by the data")}): segment {hot} fails {report.HotSegmentRateFactor.ToString(invariant)}× as often as nominal ({report.HotSegmentTrueFaultsPer100KmYear.ToString("F1", invariant)} faults/100 km·year); indicator {noisy} reports falsely {report.NoisyFalseProbability.ToString("P0", invariant)} of the time; {testIncidents} test incidents, seed {seed}");
        var table = TableOutput.Table("outcomes recorded", "years", "section top-1", "gap recovered", $"{hot} outcomes", $"{hot} observed faults/100 km·year", $"{hot} learned faults/100 km·year", $"{noisy} learned P(false report)", "skipped");
        foreach (var point in report.Curve)
        {
            var recovered = report.GapRecovered(point);
            table.AddRow(
                point.Outcomes.ToString(invariant),
                point.ObservationYears.ToString("F1", invariant),
                point.SectionTop1.ToString("P1", invariant),
                double.IsFinite(recovered) ? recovered.ToString("P0", invariant) : "–",
                point.HotSegmentOutcomes.ToString(invariant),
                double.IsFinite(point.HotSegmentObservedFaultsPer100KmYear) ? point.HotSegmentObservedFaultsPer100KmYear.ToString("F1", invariant) : "–",
                point.HotSegmentFaultsPer100KmYear.ToString("F1", invariant),
                point.NoisyFalseReportProbability.ToString("P1", invariant),
                point.Skipped.ToString(invariant));
        }

        table.AddRow("told the truth", string.Empty, report.TruthSectionTop1.ToString("P1", invariant), "100%", string.Empty, string.Empty, report.HotSegmentTrueFaultsPer100KmYear.ToString("F1", invariant), report.NoisyFalseProbability.ToString("P1", invariant), string.Empty);
        TableOutput.Write(console.Out, table);
        return CliApp.Success;
    }

    private static double? Finite(double value) => double.IsFinite(value) ? value : null;

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
