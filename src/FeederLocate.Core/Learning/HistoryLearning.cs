using FeederLocate.Core.Model;

namespace FeederLocate.Core.Learning;

/// <summary>
/// Learns priors for the ranking from logged outcomes: fault rates by Gamma-Poisson updating
/// (<see cref="FaultRateLearning"/>), indicator reliabilities by Beta-binomial updating
/// (<see cref="IndicatorReliabilityLearning"/>). Pure: the caller reads the history and computes each
/// indicator's expected state for the confirmed fault.
/// </summary>
public static class HistoryLearning
{
    public static LearnedPriors Learn(
        Grid grid,
        IEnumerable<OutcomeSite> faults,
        IEnumerable<IndicatorObservation> observations,
        LearningOptions? options = null)
    {
        options ??= LearningOptions.Default;
        return new LearnedPriors(
            FaultRateLearning.Learn(grid, faults, options.FaultRates),
            IndicatorReliabilityLearning.Learn(grid, observations, options.Indicators));
    }

    /// <summary>The priors alone, for a grid with no history.</summary>
    public static LearnedPriors PriorsOnly(Grid grid, LearningOptions? options = null) => Learn(grid, [], [], options);
}
