using System.Collections.Immutable;
using FeederLocate.Core.Model;

namespace FeederLocate.Core.Learning;

/// <summary>
/// What the ranking takes from history: each segment's fault rate and each indicator's reliability,
/// learned for one grid. With no history both equal their priors from the grid and the default rates.
/// </summary>
public sealed record LearnedPriors(FaultRateEstimate FaultRates, IndicatorReliabilityEstimate Indicators)
{
    /// <summary>Outcomes left out because the grid cannot explain them, each with its reason.</summary>
    public ImmutableArray<SkippedOutcome> Skipped { get; init; } = [];

    /// <summary>Recorded against predicted substation values at the confirmed faults, per quantity (empty without records).</summary>
    public ImmutableArray<RecordRatio> RecordRatios { get; init; } = [];

    /// <summary>The segment's learned fault rate; throws <see cref="KeyNotFoundException"/> for a segment not in the grid.</summary>
    public FaultRatePosterior FaultRateOf(SegmentId segment) => FaultRates.Of(segment);

    /// <summary>The indicator's learned reliability; throws <see cref="KeyNotFoundException"/> for one not in the grid.</summary>
    public IndicatorReliability ReliabilityOf(IndicatorId indicator) => Indicators.Of(indicator);
}
