using System.Collections.Immutable;
using FeederLocate.Core.Evaluation;
using FeederLocate.Core.Learning;
using FeederLocate.Core.Model;
using FeederLocate.Core.Ranking;
using FeederLocate.Core.Tests.Support;
using FeederLocate.Core.Topology;

namespace FeederLocate.Core.Tests.Learning;

/// <summary>
/// The substation measurements' error learned from the history (recorded against predicted current at the
/// confirmed faults) and the ranking's tolerance widened to it. Ratios and noise levels are invented for the test.
/// </summary>
public class MeasurementErrorLearningTests
{
    [Fact]
    public void The_relative_error_is_the_root_mean_square_of_the_log_ratios_once_there_are_enough()
    {
        // ln 1.1 = 0.09531, ln 0.9 = −0.10536, ln 1.2 = 0.18232, ln 1 = 0, ln 0.8 = −0.22314 (hand-computed);
        // squares sum to 0.103219, / 5 = 0.020644, square root 0.14368.
        var five = RecordRatio.Of(RecordRatio.PhaseCurrent, [1.1, 0.9, 1.2, 1.0, 0.8]);
        var four = RecordRatio.Of(RecordRatio.PhaseCurrent, [1.1, 0.9, 1.2, 1.0]);

        Assert.Equal(0.14368, five.RelativeError, 4);
        Assert.True(double.IsNaN(four.RelativeError), "four measurements are fewer than the minimum");
    }

    [Fact]
    public void The_tolerance_is_widened_to_a_larger_learned_error_and_never_narrowed()
    {
        var options = RankingOptions.Default;
        var priors = RankingPriors.None with { MeasurementErrors = new LearnedMeasurementErrors(0.2, 0.01) };

        var widened = priors.WidenTolerances(options);

        Assert.Equal(0.2, widened.PhaseCurrentTolerance.Relative);
        Assert.Equal(options.PhaseCurrentTolerance.Absolute, widened.PhaseCurrentTolerance.Absolute);
        Assert.Equal(options.ResidualCurrentTolerance, widened.ResidualCurrentTolerance);
        Assert.Same(options, RankingPriors.None.WidenTolerances(options));
    }

    [Fact]
    public void Noisy_breaker_records_are_learned_as_a_larger_error_and_the_ranking_says_it_widened_its_tolerance()
    {
        var grid = Grids.Sample("solid");
        var graph = new NetworkGraph(grid);

        var quiet = LearnedRankingPriors.Learn(graph, History(graph, recordNoise: 0.02));
        var noisy = LearnedRankingPriors.Learn(graph, History(graph, recordNoise: 0.30));
        var noisyPriors = LearnedRankingPriors.ToRankingPriors(noisy, hasHistory: true);

        var quietError = quiet.RecordRatios.Single(r => r.Quantity == RecordRatio.PhaseCurrent).RelativeError;
        var noisyError = noisy.RecordRatios.Single(r => r.Quantity == RecordRatio.PhaseCurrent).RelativeError;
        Assert.True(noisyError > quietError, $"learned {noisyError:P1} with 30 % noise, {quietError:P1} with 2 %");
        Assert.True(noisyError > RankingOptions.Default.PhaseCurrentTolerance.Relative, $"learned {noisyError:P1}");
        Assert.Equal(noisyError, noisyPriors.WidenTolerances(RankingOptions.Default).PhaseCurrentTolerance.Relative, 9);

        var incident = History(graph, recordNoise: 0.30, count: 1, seed: 99)[0].Incident;
        var ranking = FaultRanking.Rank(graph, incident, priors: noisyPriors);
        Assert.Contains(ranking.Assumptions, a => a.Contains("widened", StringComparison.Ordinal));
    }

    private static List<Outcome> History(NetworkGraph graph, double recordNoise, int count = 40, int seed = 6)
    {
        var simulator = new IncidentSimulator(graph, new SimulationSettings(MeasurementNoiseRelative: recordNoise));
        var random = new Random(seed);
        return [.. Enumerable.Range(0, count).Select(n => simulator.Next(random, n)).Select(s => new Outcome(s.Incident, s.Segment))];
    }
}
