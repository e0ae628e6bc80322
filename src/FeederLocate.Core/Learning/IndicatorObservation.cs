using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;

namespace FeederLocate.Core.Learning;

/// <summary>
/// What one indicator showed in a past incident (<paramref name="Observed"/>) against what the fault
/// model says it should have shown for the confirmed fault (<paramref name="Expected"/>).
/// </summary>
/// <param name="Distrusted">The operator distrusted the reading; it then counts for nothing.</param>
public sealed record IndicatorObservation(
    IndicatorId Indicator,
    IndicatorState Expected,
    IndicatorState Observed,
    bool Distrusted = false)
{
    /// <summary>
    /// Pairs the expected states with what <paramref name="incident"/> reports: an indicator the incident does
    /// not list was <see cref="IndicatorState.Unknown"/>, and so counts for nothing.
    /// </summary>
    public static IReadOnlyList<IndicatorObservation> ForIncident(
        Incident incident, IReadOnlyDictionary<IndicatorId, IndicatorState> expected)
    {
        ArgumentNullException.ThrowIfNull(incident);
        ArgumentNullException.ThrowIfNull(expected);
        return expected
            .Select(pair => incident.IndicationOf(pair.Key) is { } indication
                ? new IndicatorObservation(pair.Key, pair.Value, indication.State, indication.Distrusted)
                : new IndicatorObservation(pair.Key, pair.Value, IndicatorState.Unknown))
            .ToList();
    }
}
