namespace FeederLocate.Core.Learning;

/// <summary>Options of both halves of learning from history.</summary>
public sealed record LearningOptions(FaultRateOptions FaultRates, IndicatorReliabilityOptions Indicators)
{
    public static LearningOptions Default { get; } = new(FaultRateOptions.Default, IndicatorReliabilityOptions.Default);
}
