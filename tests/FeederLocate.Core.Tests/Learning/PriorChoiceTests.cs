using FeederLocate.Core.Learning;
using FeederLocate.Core.Learning.PriorChoice;
using FeederLocate.Core.Model;
using FeederLocate.Core.Synthetic;
using MathNet.Numerics;

namespace FeederLocate.Core.Tests.Learning;

/// <summary>
/// The empirical-Bayes choice of prior strengths on small histories, against posteriors and first-order
/// conditions worked out by hand. Rates are invented for the test.
/// </summary>
public class PriorChoiceTests
{
    [Fact]
    public void Alike_segments_pool_fully_and_the_type_rate_is_the_pooled_posterior()
    {
        // Stated 0.08 per km·year held with E0 = 50; two segments with 1 fault in 10 km·years each.
        // Equal counts show no spread between segments, so S runs to its upper bound; there the counts are
        // Poisson and the objective 2·(ln μ·1 − 10·μ) + 50·(0.08·ln μ − μ) peaks at μ = (2 + 4)/(20 + 50) = 0.0857143.
        var choice = FaultRatePriorChoice.Choose(0.08, 50, [new(1, 10), new(1, 10)], 5, 1e7);

        Assert.True(choice.ChosenByData);
        Assert.True(choice.AtBound);
        Assert.Equal(1e7, choice.StrengthKmYears, 1e-3);
        Assert.Equal(6.0 / 70, choice.MeanPerKmYear, 1e-4);
        // Each segment's posterior Gamma(μS + 1, S + 10) then has the type's rate.
        var posterior = new GammaParameters(choice.MeanPerKmYear * choice.StrengthKmYears, choice.StrengthKmYears).Update(1, 10);
        Assert.Equal(6.0 / 70, posterior.Mean, 1e-4);
    }

    [Fact]
    public void One_segment_failing_often_lowers_the_strength_and_the_choice_meets_the_first_order_conditions()
    {
        // Four segments of 10 km·years: 12 faults on one, none on the others. Stated 0.08 per km·year, E0 = 50.
        SegmentRecord[] segments = [new(12, 10), new(0, 10), new(0, 10), new(0, 10)];
        var choice = FaultRatePriorChoice.Choose(0.08, 50, segments, 0.01, 1e5);
        Assert.False(choice.AtBound);
        var (mu, s) = (choice.MeanPerKmYear, choice.StrengthKmYears);

        // d/dμ of Σ log NB(k | μS, S, E) + E0·(r·ln μ − μ) = Σ S·[ψ(μS + k) − ψ(μS) + ln(S/(S + E))] + E0·(r/μ − 1);
        // d/dS = Σ μ·[ψ(μS + k) − ψ(μS) + ln(S/(S + E))] + μ·E/(S + E) − k/(S + E). Both vanish at an interior maximum
        // (checked on the log scale the search works on: μ·d/dμ and S·d/dS).
        var dMu = segments.Sum(g => s * (SpecialFunctions.DiGamma((mu * s) + g.Faults) - SpecialFunctions.DiGamma(mu * s) + Math.Log(s / (s + g.ExposureKmYears))))
            + (50 * ((0.08 / mu) - 1));
        var dS = segments.Sum(g => (mu * (SpecialFunctions.DiGamma((mu * s) + g.Faults) - SpecialFunctions.DiGamma(mu * s) + Math.Log(s / (s + g.ExposureKmYears))))
            + (mu * g.ExposureKmYears / (s + g.ExposureKmYears)) - (g.Faults / (s + g.ExposureKmYears)));
        Assert.Equal(0, mu * dMu, 3);
        Assert.Equal(0, s * dS, 3);

        // The often-failing segment's posterior Gamma(μS + 12, S + 10) lies above what a strength of 100 km·years
        // (the fixed strength used before) would give, toward its own 12/10.
        var own = ((mu * s) + 12) / (s + 10);
        Assert.True(own > ((mu * 100) + 12) / 110, $"{own} with S = {s}");
        Assert.InRange(own, mu, 1.2);
    }

    [Fact]
    public void Alike_indicators_pool_fully_and_the_kind_rate_is_the_pooled_posterior()
    {
        // Default 0.05 held with n0 = 20; two indicators with 1 error in 10 trials each: m = (2 + 1)/(20 + 20) = 0.075.
        var choice = ReliabilityPriorChoice.Choose(0.05, 20, [new(1, 10), new(1, 10)], 2, 1e7);

        Assert.True(choice.AtBound);
        Assert.Equal(0.075, choice.Mean, 1e-4);
    }

    [Fact]
    public void One_indicator_erring_often_lowers_the_strength_and_the_choice_meets_the_first_order_conditions()
    {
        // Three indicators of 20 trials: none wrong on two, 16 wrong on the third. Default 0.05, n0 = 20.
        TrialRecord[] records = [new(0, 20), new(0, 20), new(16, 20)];
        var choice = ReliabilityPriorChoice.Choose(0.05, 20, records, 0.05, 1e4);
        Assert.False(choice.AtBound);
        var (m, s) = (choice.Mean, choice.StrengthTrials);
        static double Psi(double x) => SpecialFunctions.DiGamma(x);

        // d/dm = s·Σ[ψ(ms + x) − ψ((1−m)s + n − x) − ψ(ms) + ψ((1−m)s)] + n0·(p0/m − (1 − p0)/(1 − m));
        // d/ds = Σ[m·ψ(ms + x) + (1−m)·ψ((1−m)s + n − x) − ψ(s + n) − m·ψ(ms) − (1−m)·ψ((1−m)s) + ψ(s)].
        var dM = (s * records.Sum(r => Psi((m * s) + r.Errors) - Psi(((1 - m) * s) + r.Trials - r.Errors) - Psi(m * s) + Psi((1 - m) * s)))
            + (20 * ((0.05 / m) - (0.95 / (1 - m))));
        var dS = records.Sum(r => (m * Psi((m * s) + r.Errors)) + ((1 - m) * Psi(((1 - m) * s) + r.Trials - r.Errors)) - Psi(s + r.Trials)
            - (m * Psi(m * s)) - ((1 - m) * Psi((1 - m) * s)) + Psi(s));
        Assert.Equal(0, m * (1 - m) * dM, 3);
        Assert.Equal(0, s * dS, 3);

        // The erring indicator's posterior Beta(ms + 16, (1 − m)s + 4) moves most of the way to its own 16/20.
        var own = BetaParameters.FromMean(m, s).Update(16, 20).Mean;
        Assert.InRange(own, 0.5, 0.8);
    }

    [Fact]
    public void Learning_with_chosen_strengths_gives_each_segment_the_chosen_prior_updated_by_its_own_record()
    {
        var grid = SyntheticGrid.Generate(new SyntheticGridOptions(12, Seed: 3, Scheme: GroundingScheme.Solid, Substations: 1));
        var overhead = grid.LineTypes.Single(t => t.Construction == Construction.Overhead);
        var hot = grid.Segments.First(s => s.LineType == overhead.Id);
        var start = new DateTimeOffset(2020, 1, 1, 0, 0, 0, TimeSpan.Zero);
        var faults = Enumerable.Range(0, 6).Select(k => new OutcomeSite(hot.Id, start.AddDays(300 * k))).ToList();
        var options = new FaultRateOptions { ChooseStrengthsByData = true, ObservationYears = 5 };

        var learned = FaultRateLearning.Learn(grid, faults, options);

        var type = learned.LineTypes.Single(t => t.LineType == overhead.Id);
        var choice = type.Choice!;
        Assert.True(choice.ChosenByData);
        Assert.InRange(choice.StrengthKmYears, options.MinimumStrengthKmYears, options.MaximumStrengthKmYears);
        var rate = learned.Of(hot.Id);
        // Posterior Gamma(μS + 6, S + L·5).
        Assert.Equal(((choice.MeanPerKmYear * choice.StrengthKmYears) + 6) / (choice.StrengthKmYears + (hot.LengthKm * 5)), rate.FaultsPerKmYear, 12);
        // The choice is the best of the objective: a strength ten times larger or smaller does no better.
        var records = grid.Segments.Where(s => s.LineType == overhead.Id)
            .Select(s => new SegmentRecord(s.Id == hot.Id ? 6 : 0, s.LengthKm * 5)).ToList();
        double Objective(double mu, double strength) =>
            (options.PriorExposureKmYears * ((overhead.EffectiveFaultsPer100KmYear / 100 * Math.Log(mu)) - mu))
            + records.Sum(r => MarginalLikelihood.GammaPoisson(r.Faults, r.ExposureKmYears, mu * strength, strength));
        var best = Objective(choice.MeanPerKmYear, choice.StrengthKmYears);
        Assert.True(best >= Objective(choice.MeanPerKmYear, Math.Min(options.MaximumStrengthKmYears, choice.StrengthKmYears * 10)) - 1e-9);
        Assert.True(best >= Objective(choice.MeanPerKmYear, Math.Max(options.MinimumStrengthKmYears, choice.StrengthKmYears / 10)) - 1e-9);
        Assert.Equal(best, choice.LogMarginalLikelihood, 9);
    }

    [Fact]
    public void Without_history_nothing_is_chosen_and_the_configured_strength_stands()
    {
        var grid = SyntheticGrid.Generate(new SyntheticGridOptions(8, Seed: 1, Substations: 1));
        var learned = HistoryLearning.Learn(grid, [], [], new LearningOptions(
            new FaultRateOptions { ChooseStrengthsByData = true }, new IndicatorReliabilityOptions { ChooseStrengthsByData = true }));

        Assert.All(learned.FaultRates.LineTypes, t => Assert.False(t.Choice!.ChosenByData));
        Assert.All(learned.FaultRates.LineTypes, t => Assert.Equal(FaultRateOptions.Default.SegmentShrinkKmYears, t.Choice!.StrengthKmYears));
        Assert.All(learned.Indicators.Kinds, k => Assert.False(k.MissChoice!.ChosenByData));
    }
}
