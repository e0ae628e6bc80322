using FeederLocate.Core.Evaluation;
using FeederLocate.Core.Model;
using FeederLocate.Core.Tests.Support;

namespace FeederLocate.Core.Tests.Learning;

/// <summary>
/// The learning curve computed as <c>evaluate --learning</c> computes it, asserted only as moving toward the
/// truth: after a long history the learned defects are nearer their true values, and the ranking is nearer the
/// ranking told the truth than with no history. Where the truth itself gains little (the isolated sample grid:
/// there the indications and records decide, and the ranking told the truth gains about a point and a half),
/// the difference is within the noise of the test incidents, so there the ranking is only required not to lose
/// more than that noise (3 points). Speed is not asserted. Defects are invented for the test.
/// </summary>
public class LearningCurveTests
{
    [Theory]
    [InlineData("solid", 0)]
    [InlineData("isolated", 0.03)]
    public void The_curve_moves_toward_the_truth_on_the_sample_grids(string scheme, double noiseAllowance)
    {
        var grid = Grids.Sample(scheme);
        var hot = grid.Segments.OrderByDescending(s => grid.LineTypeOf(s).Construction == Construction.Overhead).ThenByDescending(s => s.LengthKm).First().Id;
        var noisy = grid.Indicators.First(i => i.Remote && !i.Directional).Id;

        var report = LearningEvaluation.Run(grid, [0, 150], 150, seed: 3, hot, noisy, 5, 0.8);

        AssertMovesTowardTheTruth(report, noiseAllowance);
    }

    [Fact]
    public void The_curve_moves_toward_the_truth_on_a_generated_resonant_grid()
    {
        var grid = Core.Synthetic.SyntheticGrid.Generate(new Core.Synthetic.SyntheticGridOptions(50, Seed: 8, GroundingScheme.Resonant, IndicatorsPerSegment: 0.2, Substations: 1));
        var hot = grid.Segments.OrderByDescending(s => s.LengthKm).First().Id;
        var noisy = grid.Indicators.First(i => i.Remote).Id;

        var report = LearningEvaluation.Run(grid, [0, 150], 150, seed: 5, hot, noisy, 5, 0.8);

        AssertMovesTowardTheTruth(report, 0);
    }

    private static void AssertMovesTowardTheTruth(LearningReport report, double noiseAllowance)
    {
        var (start, end) = (report.Curve[0], report.Curve[^1]);
        Assert.True(Math.Abs(report.TruthSectionTop1 - end.SectionTop1) <= Math.Abs(report.TruthSectionTop1 - start.SectionTop1) + noiseAllowance,
            $"section top-1 {start.SectionTop1:P1} with no history, {end.SectionTop1:P1} after {end.Outcomes}; told the truth {report.TruthSectionTop1:P1}");
        Assert.True(Math.Abs(end.HotSegmentFaultsPer100KmYear - report.HotSegmentTrueFaultsPer100KmYear) < Math.Abs(start.HotSegmentFaultsPer100KmYear - report.HotSegmentTrueFaultsPer100KmYear));
        Assert.True(Math.Abs(end.NoisyFalseReportProbability - report.NoisyFalseProbability) < Math.Abs(start.NoisyFalseReportProbability - report.NoisyFalseProbability));
    }
}
