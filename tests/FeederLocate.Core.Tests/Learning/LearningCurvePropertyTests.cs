using CsCheck;
using FeederLocate.Core.Evaluation;
using FeederLocate.Core.Model;
using FeederLocate.Core.Synthetic;
using FeederLocate.Core.Topology;

namespace FeederLocate.Core.Tests.Learning;

/// <summary>
/// The learning curve on generated grids of other shapes and sizes than the sample grids (one or two
/// substations, 30 to 70 segments, switches every 2 to 6 segments, 15 to 35 % of segments with an indicator),
/// on every grounding scheme: with a history where the longest overhead segment fails five times its line
/// type's rate and a remote indicator reports falsely 80 % of the time (defects invented for the test, as the
/// issue's scenario), the learned defects move toward their true values and section top-1 moves toward the
/// ranking told the truth. Asserted only as "moves toward the truth" (or beyond it), never by how much or how fast.
/// </summary>
/// <remarks>
/// Section top-1 is counted on 150 test incidents shared by every point of the curve; where the truth itself
/// gains little on a grid the difference is within the noise of those incidents, so the learned ranking may
/// end up to 3 points further from the truth than it started (about one standard error of a paired
/// difference of a few disagreeing incidents in 150).
/// <para>Where many incidents are near ties between two sections the evidence cannot tell apart, a small change of a
/// learned rate flips them all at once, and the top-1 difference is decided by how those few dozen incidents happened
/// to fall. On a generated grid of 70 segments (seed 4323, isolated) the learned ranking and the truth disagreed on 44
/// of the 150 test incidents, nearly all of one class: the hot segment's section against a section of eleven
/// segments, 0.46 against 0.50 told the truth. The learned hot rate of 51 instead of 40 per 100 km·year (its own
/// record of 41 faults is 1.9 standard deviations high) put the hot section first in all of them, and the test draw
/// went 29 to 13 for the truth's choice: 10.7 points, 2.4 standard deviations of that difference. The allowance is
/// therefore also a sign test on the incidents where the learned and the true rankings put different sections
/// first: if neither is the better, each of those D incidents goes either way with even odds, the difference in hits
/// has a standard deviation of √D, and a learned ranking no more than 3√D/150 worse than the truth passes (one-sided,
/// about 0.13 % of draws where the two are equally good would fail it).</para>
/// <para>Learning may also go beyond the truth: the ranking told the truth gets the simulator's nominal error rates,
/// which are not the best rates for the ranking's own model of the evidence. On a resonant grid (48 segments, seed
/// 447) the learned ranking scored 61 to 63 % on each of 12 independent histories against 54.7 % told the truth,
/// and the truth's priors with the learned indicator rates scored 61.3 %. So only falling below the lower of no
/// history and the truth counts against the learning.</para>
/// </remarks>
public class LearningCurvePropertyTests
{
    private const double NoiseAllowance = 0.03;

    /// <summary>Standard deviations of the sign test on the incidents where the learned and the true rankings disagree (one-sided, about 0.13 %).</summary>
    private const double SignTestDeviations = 3;

    [Theory]
    [InlineData(GroundingScheme.Isolated)]
    [InlineData(GroundingScheme.Resonant)]
    [InlineData(GroundingScheme.Solid)]
    [InlineData(GroundingScheme.Impedance)]
    public void The_curve_moves_toward_the_truth_on_generated_grids(GroundingScheme scheme)
    {
        var shapes = Gen.Select(Gen.Int[30, 70], Gen.Int[0, 10_000], Gen.Int[1, 2], Gen.Int[2, 6], Gen.Double[0.15, 0.35]);
        shapes.Sample((segments, seed, substations, perSwitch, share) =>
        {
            var grid = SyntheticGrid.Generate(new SyntheticGridOptions(segments, seed, scheme, share, SegmentsPerSwitch: perSwitch, Substations: substations));
            var network = new NetworkGraph(grid).Energise(SwitchStates.Normal(grid));
            // A remote indicator with at least ten energised segments not beyond it: faults there are where it can report falsely.
            var energised = grid.Segments.Count(s => network.IsSegmentEnergised(s.Id));
            var remote = grid.Indicators
                .Where(i => i.Remote && network.IsSegmentEnergised(i.Segment) && network.FacesAwayFromSource(i) && network.ForwardRegion(i).Count <= energised - 10)
                .ToList();
            if (remote.Count == 0)
            {
                return;
            }

            var hot = grid.Segments.Where(s => grid.LineTypeOf(s).Construction == Construction.Overhead)
                .OrderByDescending(s => s.LengthKm).FirstOrDefault() ?? grid.Segments.MaxBy(s => s.LengthKm)!;
            var noisy = remote[new Random(seed).Next(remote.Count)];

            var report = LearningEvaluation.Run(grid, [0, 150], 150, seed, hot.Id, noisy.Id, 5, 0.8);

            var (start, end) = (report.Curve[0], report.Curve[^1]);
            var where = $"{grid.Name}, {scheme}, {substations} substation(s), hot {hot.Id}, noisy {noisy.Id}";
            // Toward the truth or beyond it: not below the lower of no history and the truth beyond the noise of a few
            // disagreeing incidents, or not worse than the truth by the sign test on the incidents where they disagree.
            var notBelow = end.SectionTop1 >= Math.Min(start.SectionTop1, report.TruthSectionTop1) - NoiseAllowance;
            var signTest = SignTestDeviations * Math.Sqrt(end.DisagreementsWithTruth) / report.TestIncidents;
            Assert.True(notBelow || report.TruthSectionTop1 - end.SectionTop1 <= signTest,
                $"section top-1 {start.SectionTop1:P1} with no history, {end.SectionTop1:P1} after {end.Outcomes}; told the truth {report.TruthSectionTop1:P1}; "
                + $"learned and truth disagree on {end.DisagreementsWithTruth} of {report.TestIncidents} incidents, sign-test allowance {signTest:P1} ({where})");
            Assert.True(Math.Abs(end.HotSegmentFaultsPer100KmYear - report.HotSegmentTrueFaultsPer100KmYear) < Math.Abs(start.HotSegmentFaultsPer100KmYear - report.HotSegmentTrueFaultsPer100KmYear),
                $"hot segment learned {end.HotSegmentFaultsPer100KmYear:F1} after {end.Outcomes} outcomes ({end.HotSegmentOutcomes} on it), true {report.HotSegmentTrueFaultsPer100KmYear:F1} ({where})");
            Assert.True(Math.Abs(end.NoisyFalseReportProbability - report.NoisyFalseProbability) < Math.Abs(start.NoisyFalseReportProbability - report.NoisyFalseProbability),
                $"noisy indicator learned {end.NoisyFalseReportProbability:P1}, true {report.NoisyFalseProbability:P0} ({where})");
        }, iter: 2, threads: 1);
    }
}
