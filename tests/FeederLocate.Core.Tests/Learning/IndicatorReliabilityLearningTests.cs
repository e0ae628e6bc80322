using CsCheck;
using FeederLocate.Core.Evidence;
using FeederLocate.Core.Learning;
using FeederLocate.Core.Model;

namespace FeederLocate.Core.Tests.Learning;

/// <summary>
/// Indicator reliabilities on the test grid: FI1 and FI4 non-directional remote, FI2 directional remote,
/// FI3 non-directional field-read. Defaults: n0 = 20, s = 10; remote miss 5 %, false 2 %; field 8 %, 4 %.
/// </summary>
public class IndicatorReliabilityLearningTests
{
    private const double Tolerance = 1e-12;

    private static readonly IndicatorId Fi1 = new("FI1");
    private static readonly IndicatorId Fi2 = new("FI2");
    private static readonly IndicatorId Fi3 = new("FI3");
    private static readonly IndicatorId Fi4 = new("FI4");

    public static TheoryData<IndicatorState, IndicatorState, bool, ReliabilityCounts> CountingRules => new()
    {
        // expected, observed, suspect → (miss trials, misses, false-report trials, false reports)
        { IndicatorState.Fault, IndicatorState.None, false, new(1, 1, 0, 0) },
        { IndicatorState.Fault, IndicatorState.Fault, false, new(1, 0, 0, 0) },
        { IndicatorState.None, IndicatorState.Fault, false, new(0, 0, 1, 1) },
        { IndicatorState.None, IndicatorState.None, false, new(0, 0, 1, 0) },
        { IndicatorState.Forward, IndicatorState.None, false, new(1, 1, 0, 0) },
        { IndicatorState.Forward, IndicatorState.Forward, false, new(1, 0, 1, 0) },
        { IndicatorState.Forward, IndicatorState.Reverse, false, new(1, 0, 1, 1) },
        { IndicatorState.Reverse, IndicatorState.Forward, false, new(1, 0, 1, 1) },
        { IndicatorState.None, IndicatorState.Reverse, false, new(0, 0, 1, 1) },
        { IndicatorState.Fault, IndicatorState.Unknown, false, ReliabilityCounts.Zero },
        { IndicatorState.Unknown, IndicatorState.Fault, false, ReliabilityCounts.Zero },
        { IndicatorState.Fault, IndicatorState.None, true, ReliabilityCounts.Zero },
        { IndicatorState.None, IndicatorState.Fault, true, ReliabilityCounts.Zero },
    };

    [Theory]
    [MemberData(nameof(CountingRules))]
    public void Each_observation_counts_by_the_rules(IndicatorState expected, IndicatorState observed, bool suspect, ReliabilityCounts counts) =>
        Assert.Equal(counts, ReliabilityCounts.Of(new IndicatorObservation(Fi2, expected, observed, suspect)));

    [Fact]
    public void Kind_and_indicator_posteriors_match_the_hand_computed_Beta_updates()
    {
        var observations = Observations(Fi1, misses: 3, hits: 7);

        var learned = IndicatorReliabilityLearning.Learn(TestGrids.Brackenfold(), observations);

        // Kind (non-directional, remote): prior Beta(0.05·20, 0.95·20) = Beta(1, 19); + 3 misses in 10 → Beta(4, 26), mean 4/30 = 0.1333.
        var kind = learned.Of(new IndicatorKind(Directional: false, Remote: true));
        Assert.Equal(new BetaParameters(1, 19), kind.MissPrior);
        AssertBeta(4, 26, kind.Miss);
        Assert.Equal(4.0 / 30, kind.MissProbability, Tolerance);
        Assert.Equal(2, kind.Indicators);
        // FI1: Beta(m·s + 3, (1 − m)·s + 7) with m = 4/30, s = 10: Beta(1.3333 + 3, 8.6667 + 7) = Beta(4.3333, 15.6667),
        // mean 4.3333/20 = 0.216667.
        var fi1 = learned.Of(Fi1);
        AssertBeta((4.0 / 30 * 10) + 3, (26.0 / 30 * 10) + 7, fi1.Miss);
        Assert.Equal(0.21666666666667, fi1.MissProbability, 1e-12);
        Assert.Equal(new ReliabilityCounts(10, 3, 0, 0), fi1.Counts);
        // No false-report trial: false report stays at the prior 0.02·20 = Beta(0.4, 19.6) → FI1 Beta(0.2, 9.8), mean 0.02.
        AssertBeta(0.2, 9.8, fi1.FalseReport);
    }

    [Fact]
    public void An_indicator_without_history_has_its_kinds_rate()
    {
        var learned = IndicatorReliabilityLearning.Learn(TestGrids.Brackenfold(), Observations(Fi1, misses: 3, hits: 7));

        // FI4 shares FI1's kind: Beta(m·s, (1 − m)·s) = Beta(1.3333, 8.6667), mean m = 4/30.
        var fi4 = learned.Of(Fi4);
        AssertBeta(4.0 / 30 * 10, 26.0 / 30 * 10, fi4.Miss);
        Assert.Equal(learned.Of(new IndicatorKind(false, true)).MissProbability, fi4.MissProbability, Tolerance);
        Assert.Equal(ReliabilityCounts.Zero, fi4.Counts);
    }

    [Fact]
    public void An_indicator_with_many_misses_moves_toward_its_own_frequency()
    {
        var observations = Observations(Fi1, misses: 40, hits: 10).Concat(Observations(Fi4, misses: 0, hits: 200));

        var learned = IndicatorReliabilityLearning.Learn(TestGrids.Brackenfold(), observations);

        // Kind: Beta(1 + 40, 19 + 10 + 200) = Beta(41, 229), m = 41/270 = 0.151852.
        var kindMean = learned.Of(new IndicatorKind(false, true)).MissProbability;
        Assert.Equal(41.0 / 270, kindMean, Tolerance);
        // FI1: Beta(1.51852 + 40, 8.48148 + 10), mean (1.51852 + 40)/60 = 0.691975: most of the way from 0.15 to its own 40/50 = 0.8.
        var fi1 = learned.Of(Fi1).MissProbability;
        Assert.Equal(((41.0 / 270 * 10) + 40) / 60, fi1, Tolerance);
        Assert.InRange(fi1, 0.69, 0.70);
        // FI4, clean in 200 trials: (1.51852 + 0)/210 = 0.0072310, below its kind.
        Assert.Equal(41.0 / 270 * 10 / 210, learned.Of(Fi4).MissProbability, Tolerance);
    }

    [Fact]
    public void Kinds_start_from_their_own_default_rates()
    {
        var learned = IndicatorReliabilityLearning.Learn(TestGrids.Brackenfold(), []);

        Assert.Equal(0.05, learned.Of(Fi2).MissProbability, Tolerance);
        Assert.Equal(0.02, learned.Of(Fi2).FalseReportProbability, Tolerance);
        Assert.Equal(0.08, learned.Of(Fi3).MissProbability, Tolerance);
        Assert.Equal(0.04, learned.Of(Fi3).FalseReportProbability, Tolerance);
        Assert.Equal(new IndicatorKind(Directional: true, Remote: true), learned.Of(Fi2).Kind);
        Assert.Equal(new IndicatorKind(Directional: false, Remote: false), learned.Of(Fi3).Kind);
        Assert.Equal(4, learned.Indicators.Length);
        Assert.Equal(4, learned.Kinds.Length);
    }

    [Fact]
    public void A_wrong_direction_raises_the_false_report_rate()
    {
        // FI2 (directional remote): 2 wrong directions and 3 right ones, 5 quiet where nothing was expected.
        var observations = Enumerable.Repeat(new IndicatorObservation(Fi2, IndicatorState.Forward, IndicatorState.Reverse), 2)
            .Concat(Enumerable.Repeat(new IndicatorObservation(Fi2, IndicatorState.Forward, IndicatorState.Forward), 3))
            .Concat(Enumerable.Repeat(new IndicatorObservation(Fi2, IndicatorState.None, IndicatorState.None), 5));

        var learned = IndicatorReliabilityLearning.Learn(TestGrids.Brackenfold(), observations);

        // 10 false-report trials, 2 false: kind Beta(0.4 + 2, 19.6 + 8) = Beta(2.4, 27.6), mean 2.4/30 = 0.08.
        var kind = learned.Of(new IndicatorKind(Directional: true, Remote: true));
        AssertBeta(2.4, 27.6, kind.FalseReport);
        Assert.Equal(new ReliabilityCounts(5, 0, 10, 2), learned.Of(Fi2).Counts);
        // 5 miss trials without a miss: Beta(1, 19 + 5) = Beta(1, 24).
        AssertBeta(1, 24, kind.Miss);
    }

    [Fact]
    public void Observations_of_indicators_not_in_the_grid_are_listed_and_not_counted()
    {
        var learned = IndicatorReliabilityLearning.Learn(TestGrids.Brackenfold(), Observations(new IndicatorId("FI9"), misses: 4, hits: 0));

        Assert.Equal(new IndicatorId("FI9"), Assert.Single(learned.UnknownIndicators));
        Assert.All(learned.Kinds, k => Assert.Equal(ReliabilityCounts.Zero, k.Counts));
    }

    [Fact]
    public void ForIncident_pairs_each_expected_state_with_what_the_incident_shows()
    {
        var incident = TestIncidents.EarthFault() with
        {
            Indications = [new Indication(Fi1, IndicatorState.None, IndicationSource.Remote, Suspect: true), new Indication(Fi2, IndicatorState.Forward, IndicationSource.Remote)],
        };
        var expected = new Dictionary<IndicatorId, IndicatorState>
        {
            [Fi1] = IndicatorState.Fault,
            [Fi2] = IndicatorState.Forward,
            [Fi3] = IndicatorState.Fault,
        };

        var observations = IndicatorObservation.ForIncident(incident, expected);

        Assert.Equal(
        [
            new IndicatorObservation(Fi1, IndicatorState.Fault, IndicatorState.None, Suspect: true),
            new IndicatorObservation(Fi2, IndicatorState.Forward, IndicatorState.Forward),
            new IndicatorObservation(Fi3, IndicatorState.Fault, IndicatorState.Unknown),
        ], observations);
    }

    [Fact]
    public void An_indicators_rate_lies_between_its_kinds_rate_and_its_own_frequency()
    {
        Gen.Select(Gen.Int[0, 60], Gen.Int[0, 60], Gen.Int[0, 60]).Sample((misses, hits, otherHits) =>
        {
            var observations = Observations(Fi1, misses, hits).Concat(Observations(Fi4, 0, otherHits));

            var learned = IndicatorReliabilityLearning.Learn(TestGrids.Brackenfold(), observations);

            var kindMean = learned.Of(new IndicatorKind(false, true)).MissProbability;
            var own = misses + hits == 0 ? kindMean : (double)misses / (misses + hits);
            Assert.InRange(learned.Of(Fi1).MissProbability, Math.Min(kindMean, own) - 1e-12, Math.Max(kindMean, own) + 1e-12);
        });
    }

    private static IEnumerable<IndicatorObservation> Observations(IndicatorId indicator, int misses, int hits) =>
        Enumerable.Repeat(new IndicatorObservation(indicator, IndicatorState.Fault, IndicatorState.None), misses)
            .Concat(Enumerable.Repeat(new IndicatorObservation(indicator, IndicatorState.Fault, IndicatorState.Fault), hits));

    private static void AssertBeta(double a, double b, BetaParameters actual)
    {
        Assert.Equal(a, actual.A, Tolerance);
        Assert.Equal(b, actual.B, Tolerance);
    }
}
