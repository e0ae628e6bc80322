using FeederLocate.Core.Evidence;

namespace FeederLocate.Core.Ranking;

/// <summary>The hypothesis on one segment that explains the evidence best (maximum likelihood).</summary>
internal readonly record struct BestHypothesis(FaultType Type, double FaultResistanceOhm, double Position, double LogLikelihood);

/// <summary>A segment's log prior, its likelihood marginalised over type, resistance and position, and its best hypothesis.</summary>
internal sealed record SegmentScore(int Segment, double LogPrior, double LogMarginal, BestHypothesis Best, Dictionary<FaultType, double> LogByType)
{
    public double LogPosterior => LogPrior + LogMarginal;
}
