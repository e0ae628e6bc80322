using FeederLocate.Core.Evidence;
using FeederLocate.Core.Learning;
using FeederLocate.Core.Learning.PriorChoice;
using FeederLocate.Core.Model;
using FeederLocate.Core.Synthetic;

namespace FeederLocate.Core.Tests.Learning;

/// <summary>
/// Setting apart the members a group's prior cannot explain, on small records worked out by hand. Rates and
/// counts are invented for the test; π = 0.05, so a member is set apart where its record is more than
/// (1 − π)/π = 19 times as probable under the weak prior as under the group's.
/// </summary>
/// <remarks>
/// The hand arithmetic uses the closed forms of the marginal likelihoods for whole counts:
/// NB(k | α, β, E) = [α(α + 1)…(α + k − 1)/k!]·(β/(β + E))^α·(E/(β + E))^k, which tends to Poisson(k | μE) as β → ∞
/// with α = μβ; and BB(x | n, a, b) = C(n, x)·[a(a + 1)…(a + x − 1)]·[b(b + 1)…(b + n − x − 1)]/[(a + b)(a + b + 1)…(a + b + n − 1)],
/// which tends to the binomial as a + b → ∞. The upper bounds of the strength are set at 10⁷ so the pooled
/// choices are Poisson and binomial to about one part in a million.
/// </remarks>
public class DistinctMembersTests
{
    private const double Share = 0.05;

    [Fact]
    public void A_segment_its_types_prior_cannot_explain_is_set_apart_and_the_rest_choose_the_type_rate()
    {
        // Stated 0.08 per km·year held with E0 = 50 km·years; four segments of 10 km·years with 1, 1, 1 and 12 faults;
        // strength between 5 and 10⁷ km·years.
        SegmentRecord[] segments = [new(1, 10), new(1, 10), new(1, 10), new(12, 10)];

        var choice = FaultRatePriorChoice.ChooseSettingApart(0.08, 50, segments, 5, 1e7, Share);

        // Round 1, all four alike (S = 10⁷, Poisson): μ0 = (1 + 1 + 1 + 12 + 0.08·50)/(4·10 + 50) = 19/90 = 0.21111.
        //   12 faults: Poisson(12 | 2.1111) = 2.1111¹²·e^−2.1111/12! = 1.98e-6; weak prior Gamma(μ0·5, 5), α = 1.0556:
        //   NB = [α(α + 1)…(α + 11)/12!]·(5/15)^α·(10/15)¹² = 2.87e-3; factor 1446 > 19: set apart.
        //   1 fault: Poisson(1 | 2.1111) = 0.2557; NB = α·(1/3)^α·(2/3) = 0.2207; factor 0.86: ordinary.
        // Round 2, from the three 1-fault segments (equal counts show no spread, S runs to 10⁷):
        //   μ = (3 + 0.08·50)/(30 + 50) = 7/80 = 0.0875.
        //   12 faults: Poisson(12 | 0.875) = 1.75e-10; NB with α = 0.4375: 0.12081·0.61839·0.0077073 = 5.76e-4;
        //   factor 3.3e6: set apart. 1 fault: Poisson(1 | 0.875) = 0.875·e^−0.875 = 0.3648;
        //   NB = 0.4375·(1/3)^0.4375·(2/3) = 0.1804; factor 0.49: ordinary. The set is unchanged: done.
        Assert.Equal(3, Assert.Single(choice.SetApart));
        Assert.Equal(7.0 / 80, choice.MeanPerKmYear, 1e-5);
        Assert.Equal(1e7, choice.StrengthKmYears, 1e-3);
        Assert.Equal(5, choice.StrengthOf(3));
        Assert.Equal(1e7, choice.StrengthOf(0), 1e-3);

        // The outlier's posterior: Gamma(0.0875·5 + 12, 5 + 10) = Gamma(12.4375, 15), mean 0.829167 per km·year,
        // between the type's 0.0875 and its own 12/10; each ordinary segment keeps the type's 0.0875.
        var outlier = new GammaParameters(choice.MeanPerKmYear * choice.StrengthOf(3), choice.StrengthOf(3)).Update(12, 10);
        Assert.Equal(12.4375 / 15, outlier.Mean, 1e-5);
        var ordinary = new GammaParameters(choice.MeanPerKmYear * choice.StrengthOf(0), choice.StrengthOf(0)).Update(1, 10);
        Assert.Equal(0.0875, ordinary.Mean, 1e-5);

        // Without setting apart, the one outlier is fitted by a wide spread: a lower strength for all four.
        var plain = FaultRatePriorChoice.Choose(0.08, 50, segments, 5, 1e7);
        Assert.True(plain.StrengthKmYears < 1e3, $"plain strength {plain.StrengthKmYears}");
    }

    [Fact]
    public void An_indicator_its_kinds_prior_cannot_explain_is_set_apart_and_the_rest_choose_the_kind_rate()
    {
        // Default false-report rate 0.05 held with n0 = 20 trials; three indicators with 1 false report in 10 trials,
        // 1 in 10 and 16 in 20; strength between 2 and 10⁷ trials.
        TrialRecord[] indicators = [new(1, 10), new(1, 10), new(16, 20)];

        var choice = ReliabilityPriorChoice.ChooseSettingApart(0.05, 20, indicators, 2, 1e7, Share);

        // Round 1, all three alike (binomial): m0 = (1 + 1 + 16 + 0.05·20)/(10 + 10 + 20 + 20) = 19/60 = 0.31667.
        //   16 in 20: Binomial = C(20, 16)·m0¹⁶·(1 − m0)⁴ = 1.08e-5; weak prior Beta(2·m0, 2·(1 − m0)) = Beta(0.6333, 1.3667):
        //   BB = 4845·[0.6333·1.6333…15.6333]·[1.3667·2.3667·3.3667·4.3667]/[2·3…21] = 0.0239; factor 2214 > 19: set apart.
        //   1 in 10: Binomial = 10·m0·(1 − m0)⁹ = 0.1029; BB = 10·0.6333·[1.3667…9.3667]/[2·3…11] = 0.1488; factor 1.45: ordinary.
        // Round 2, from the two 1-in-10 indicators (alike, s runs to 10⁷): m = (2 + 0.05·20)/(20 + 20) = 3/40 = 0.075.
        //   16 in 20: Binomial = 3.6e-15; BB with Beta(0.15, 1.85) = 2.96e-3: set apart.
        //   1 in 10: Binomial = 10·0.075·0.925⁹ = 0.3718; BB = 10·0.15·[1.85·2.85…9.85]/[2·3…11] = 0.1014; factor 0.27: ordinary.
        Assert.Equal(2, Assert.Single(choice.SetApart));
        // The search on m stops about 10⁻⁵ from the optimum here (1.4e-4 relative), hence the looser tolerance.
        Assert.Equal(0.075, choice.Mean, 1e-4);
        Assert.Equal(1e7, choice.StrengthTrials, 1e-3);
        Assert.Equal(2, choice.StrengthOf(2));

        // The outlier's posterior Beta(0.15 + 16, 1.85 + 4) = Beta(16.15, 5.85), mean 16.15/22 = 0.734091.
        var outlier = BetaParameters.FromMean(choice.Mean, choice.StrengthOf(2)).Update(16, 20);
        Assert.Equal(16.15 / 22, outlier.Mean, 1e-4);
    }

    [Fact]
    public void Without_an_outlier_nothing_is_set_apart_and_the_choice_is_the_plain_one()
    {
        // Segments with 1, 1, 1 and 2 faults in 10 km·years each: μ0 = (5 + 4)/(40 + 50) = 0.1. The 2-fault segment:
        // Poisson(2 | 1) = e^−1/2 = 0.1839; NB with α = 0.5: (0.5·1.5/2)·(1/3)^0.5·(2/3)² = 0.0962; factor 0.52.
        // A 1-fault segment: Poisson(1 | 1) = 0.3679; NB = 0.5·(1/3)^0.5·(2/3) = 0.1925; factor 0.52. None above 19.
        SegmentRecord[] segments = [new(1, 10), new(1, 10), new(1, 10), new(2, 10)];
        var settingApart = FaultRatePriorChoice.ChooseSettingApart(0.08, 50, segments, 5, 1e7, Share);
        var plain = FaultRatePriorChoice.Choose(0.08, 50, segments, 5, 1e7);
        Assert.Empty(settingApart.SetApart);
        Assert.Equal(plain with { SetApart = [] }, settingApart with { SetApart = [] });
        Assert.Equal(plain.StrengthKmYears, settingApart.StrengthOf(3));

        // Indicators 1 in 10, 1 in 10, 2 in 20: m0 = (4 + 1)/(40 + 20) = 1/12. 2 in 20: Binomial 0.2755, BB 0.0570,
        // factor 0.21; 1 in 10: Binomial 0.3808, BB 0.1090, factor 0.29. None above 19.
        TrialRecord[] indicators = [new(1, 10), new(1, 10), new(2, 20)];
        var indicatorsApart = ReliabilityPriorChoice.ChooseSettingApart(0.05, 20, indicators, 2, 1e7, Share);
        Assert.Empty(indicatorsApart.SetApart);
        Assert.Equal(ReliabilityPriorChoice.Choose(0.05, 20, indicators, 2, 1e7).Mean, indicatorsApart.Mean);
    }

    [Fact]
    public void At_most_a_minority_is_set_apart()
    {
        // Two segments, 0 and 12 faults in 10 km·years: alike, μ0 = (12 + 4)/(20 + 50) = 0.22857; the 12-fault segment's
        // factor is NB(12 | α = 1.1429)/Poisson(12 | 2.2857) = 3.37e-3/4.32e-6 = 781 > 19, but at most (2 − 1)/2 = 0
        // of two members are set apart: which of the two would be "the group" is not decided by the data.
        SegmentRecord[] segments = [new(0, 10), new(12, 10)];
        var choice = FaultRatePriorChoice.ChooseSettingApart(0.08, 50, segments, 5, 1e7, Share);
        Assert.Empty(choice.SetApart);
        Assert.Equal(FaultRatePriorChoice.Choose(0.08, 50, segments, 5, 1e7).StrengthKmYears, choice.StrengthKmYears);
    }

    [Fact]
    public void Shares_out_of_range_are_refused()
    {
        Assert.Throws<ArgumentOutOfRangeException>(() => new FaultRateOptions { DistinctSegmentShare = 0 });
        Assert.Throws<ArgumentOutOfRangeException>(() => new FaultRateOptions { DistinctSegmentShare = 0.5 });
        Assert.Throws<ArgumentOutOfRangeException>(() => new IndicatorReliabilityOptions { DistinctIndicatorShare = -0.1 });
        Assert.Throws<ArgumentOutOfRangeException>(() => FaultRatePriorChoice.ChooseSettingApart(0.08, 50, [new(1, 10)], 5, 1e7, 0.6));
    }

    [Fact]
    public void The_learning_gives_the_weak_prior_to_the_segment_set_apart_and_the_types_to_the_others()
    {
        // A generated grid, 10 years of history: 40 faults on one segment of the most common line type, one fault
        // on every other segment of that type. Only the wiring is checked here: the segment set apart is the hot one,
        // its prior has the lower bound's strength, every other segment of the type the chosen strength.
        var grid = SyntheticGrid.Generate(new SyntheticGridOptions(40, Seed: 7, GroundingScheme.Resonant));
        var type = grid.Segments.GroupBy(s => s.LineType).MaxBy(g => g.Count())!;
        var ofType = type.ToList();
        var hot = ofType[ofType.Count / 2];
        var day = new DateTimeOffset(2020, 1, 1, 0, 0, 0, TimeSpan.Zero);
        var faults = ofType.SelectMany(s => Enumerable.Repeat(new OutcomeSite(s.Id, day), s.Id == hot.Id ? 40 : 1)).ToList();
        var options = FaultRateOptions.Default with { ObservationYears = 10, ChooseStrengthsByData = true, SetApartDistinctSegments = true };

        var rates = FaultRateLearning.Learn(grid, faults, options);

        var choice = rates.LineTypes.Single(t => t.LineType == type.Key).Choice!;
        Assert.Equal(ofType.IndexOf(hot), Assert.Single(choice.SetApart));
        Assert.Equal(options.MinimumStrengthKmYears, rates.Of(hot.Id).Prior.Rate);
        Assert.All(ofType.Where(s => s.Id != hot.Id), s => Assert.Equal(choice.StrengthKmYears, rates.Of(s.Id).Prior.Rate));
        Assert.True(choice.StrengthKmYears > options.MinimumStrengthKmYears);
    }

    [Fact]
    public void The_learning_gives_the_weak_prior_to_the_indicator_set_apart_and_the_kinds_to_the_others()
    {
        // Every indicator of a generated grid 20 times where nothing was expected; one of the most common kind
        // reports falsely 16 times, the others once.
        var grid = SyntheticGrid.Generate(new SyntheticGridOptions(60, Seed: 11, GroundingScheme.Isolated, IndicatorsPerSegment: 0.4));
        var kind = grid.Indicators.GroupBy(IndicatorKind.Of).MaxBy(g => g.Count())!;
        var ofKind = kind.ToList();
        Assert.True(ofKind.Count >= 3, $"{ofKind.Count} indicators of the most common kind");
        var noisy = ofKind[^1];
        var observations = grid.Indicators.SelectMany(i => Enumerable.Range(0, 20).Select(n =>
            new IndicatorObservation(i.Id, IndicatorState.None, n < (i.Id == noisy.Id ? 16 : 1) ? Pickup(i) : IndicatorState.None))).ToList();
        var options = IndicatorReliabilityOptions.Default with { ChooseStrengthsByData = true, SetApartDistinctIndicators = true };

        var reliability = IndicatorReliabilityLearning.Learn(grid, observations, options);

        var choice = reliability.Of(kind.Key).FalseReportChoice!;
        Assert.Equal(ofKind.IndexOf(noisy), Assert.Single(choice.SetApart));
        Assert.Equal(options.MinimumStrengthTrials, reliability.Of(noisy.Id).FalseReport.Strength - 20, 1e-9);
        Assert.All(ofKind.Where(i => i.Id != noisy.Id), i =>
            Assert.Equal(choice.StrengthTrials, reliability.Of(i.Id).FalseReport.Strength - 20, 1e-6));
    }

    private static IndicatorState Pickup(Indicator indicator) => indicator.Directional ? IndicatorState.Forward : IndicatorState.Fault;
}
