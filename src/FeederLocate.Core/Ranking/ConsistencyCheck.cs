using FeederLocate.Core.Evidence;
using MathNet.Numerics.Distributions;

namespace FeederLocate.Core.Ranking;

/// <summary>
/// Whether the best explanation accounts for the evidence: its disagreements are no more than the
/// indicators' error rates make plausible (binomial tail at the chosen significance), no record lies
/// further than the set number of σ from its prediction, and the tripped device saw the fault.
/// </summary>
internal static class ConsistencyCheck
{
    public static bool Explains(
        IReadOnlyList<IndicationCheck> checks,
        IReadOnlyList<MeasurementCheck> measurements,
        bool insideTrippedZone,
        RankingOptions options)
    {
        if (!insideTrippedZone || measurements.Any(m => Math.Abs(m.DeviationSigma) > options.InconsistentMeasurementSigma))
        {
            return false;
        }

        var counted = checks.Where(c => c.Observed != IndicatorState.Unknown).ToList();
        var disagreements = counted.Count(c => !c.Agrees);
        if (disagreements == 0)
        {
            return true;
        }

        // Probability of a disagreement per indicator, averaged: 1 − P(record = expected | expected).
        var errorRate = Math.Clamp(counted.Average(c => c.ErrorProbability), 1e-6, 0.5);
        var tail = 1 - Binomial.CDF(errorRate, counted.Count, disagreements - 1);
        return tail >= options.InconsistencySignificance;
    }
}
