using FeederLocate.Core.Evidence;

namespace FeederLocate.Core.Learning;

/// <summary>
/// Counted evidence about an indicator (or a pool of them).
/// A miss trial is an observation where a pickup (fault, forward or reverse) was expected; it is a miss
/// when the indicator showed none. A false-report trial is an observation where none was expected, or
/// where a directional indicator was expected to pick up and did: a pickup where none was expected,
/// or the wrong direction, is a false report. Unknown states (expected or observed) and suspect
/// readings are no trial of either kind.
/// </summary>
public sealed record ReliabilityCounts(int MissTrials, int Misses, int FalseReportTrials, int FalseReports)
{
    public static ReliabilityCounts Zero { get; } = new(0, 0, 0, 0);

    public ReliabilityCounts Add(ReliabilityCounts other)
    {
        ArgumentNullException.ThrowIfNull(other);
        return new ReliabilityCounts(
            MissTrials + other.MissTrials,
            Misses + other.Misses,
            FalseReportTrials + other.FalseReportTrials,
            FalseReports + other.FalseReports);
    }

    /// <summary>What one observation adds, by the rules above.</summary>
    public static ReliabilityCounts Of(IndicatorObservation observation)
    {
        ArgumentNullException.ThrowIfNull(observation);
        if (observation.Distrusted || observation.Expected == IndicatorState.Unknown || observation.Observed == IndicatorState.Unknown)
        {
            return Zero;
        }

        var observedPickup = IsPickup(observation.Observed);
        if (!IsPickup(observation.Expected))
        {
            return new ReliabilityCounts(0, 0, 1, observedPickup ? 1 : 0);
        }

        if (!observedPickup)
        {
            return new ReliabilityCounts(1, 1, 0, 0);
        }

        if (IsDirection(observation.Expected) && IsDirection(observation.Observed))
        {
            var wrong = observation.Observed != observation.Expected ? 1 : 0;
            return new ReliabilityCounts(1, 0, 1, wrong);
        }

        return new ReliabilityCounts(1, 0, 0, 0);
    }

    private static bool IsPickup(IndicatorState state) =>
        state is IndicatorState.Fault or IndicatorState.Forward or IndicatorState.Reverse;

    private static bool IsDirection(IndicatorState state) =>
        state is IndicatorState.Forward or IndicatorState.Reverse;
}
