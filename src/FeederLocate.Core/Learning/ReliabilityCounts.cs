using FeederLocate.Core.Evidence;

namespace FeederLocate.Core.Learning;

/// <summary>
/// Counted evidence about an indicator (or a pool of them). Counts are weighted: an observation whose
/// expected state is uncertain (it depends on the unknown fault resistance) counts for each expected state
/// with that state's probability, so counts may be fractional.
/// <list type="bullet">
/// <item>A miss trial is an observation where a pickup (fault, forward or reverse) was expected; it is a miss
/// when the indicator showed none.</item>
/// <item>A false-report trial is an observation where none was expected; a pickup is a false report.</item>
/// <item>A direction trial is one where a direction was expected and the indicator showed one; the opposite
/// direction is a wrong direction.</item>
/// </list>
/// Unknown states (expected or observed) and suspect readings are no trial of any kind.
/// </summary>
public sealed record ReliabilityCounts(
    double MissTrials,
    double Misses,
    double FalseReportTrials,
    double FalseReports,
    double DirectionTrials = 0,
    double WrongDirections = 0)
{
    public static ReliabilityCounts Zero { get; } = new(0, 0, 0, 0);

    public ReliabilityCounts Add(ReliabilityCounts other)
    {
        ArgumentNullException.ThrowIfNull(other);
        return new ReliabilityCounts(
            MissTrials + other.MissTrials,
            Misses + other.Misses,
            FalseReportTrials + other.FalseReportTrials,
            FalseReports + other.FalseReports,
            DirectionTrials + other.DirectionTrials,
            WrongDirections + other.WrongDirections);
    }

    /// <summary>Every count times <paramref name="weight"/> (≥ 0).</summary>
    public ReliabilityCounts Times(double weight)
    {
        if (!double.IsFinite(weight) || weight < 0)
        {
            throw new ArgumentOutOfRangeException(nameof(weight), weight, "weight must be finite and ≥ 0");
        }

        return new ReliabilityCounts(
            MissTrials * weight, Misses * weight, FalseReportTrials * weight, FalseReports * weight, DirectionTrials * weight, WrongDirections * weight);
    }

    /// <summary>What one observation adds, by the rules above, times its weight.</summary>
    public static ReliabilityCounts Of(IndicatorObservation observation)
    {
        ArgumentNullException.ThrowIfNull(observation);
        if (observation.Distrusted || observation.Expected == IndicatorState.Unknown || observation.Observed == IndicatorState.Unknown)
        {
            return Zero;
        }

        var observedPickup = IsPickup(observation.Observed);
        ReliabilityCounts counts;
        if (!IsPickup(observation.Expected))
        {
            counts = new ReliabilityCounts(0, 0, 1, observedPickup ? 1 : 0);
        }
        else if (!observedPickup)
        {
            counts = new ReliabilityCounts(1, 1, 0, 0);
        }
        else if (IsDirection(observation.Expected) && IsDirection(observation.Observed))
        {
            counts = new ReliabilityCounts(1, 0, 0, 0, 1, observation.Observed != observation.Expected ? 1 : 0);
        }
        else
        {
            counts = new ReliabilityCounts(1, 0, 0, 0);
        }

        return observation.Weight == 1 ? counts : counts.Times(observation.Weight);
    }

    private static bool IsPickup(IndicatorState state) =>
        state is IndicatorState.Fault or IndicatorState.Forward or IndicatorState.Reverse;

    private static bool IsDirection(IndicatorState state) =>
        state is IndicatorState.Forward or IndicatorState.Reverse;
}
