using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;

namespace FeederLocate.Core.Learning;

/// <summary>
/// What one indicator showed in a past incident (<paramref name="Observed"/>) against what the fault
/// model says it should have shown for the confirmed fault (<paramref name="Expected"/>).
/// </summary>
/// <param name="Distrusted">The operator distrusted the reading; it then counts for nothing.</param>
/// <param name="Weight">The probability (0..1) that <paramref name="Expected"/> is what it should have shown, where
/// that depends on the unknown fault resistance; the observation counts this much.</param>
public sealed record IndicatorObservation(
    IndicatorId Indicator,
    IndicatorState Expected,
    IndicatorState Observed,
    bool Distrusted = false,
    double Weight = 1)
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

    /// <summary>
    /// Pairs each indicator's probabilities of the expected states with what <paramref name="incident"/> reports:
    /// one weighted observation per expected state with probability above zero.
    /// </summary>
    public static IReadOnlyList<IndicatorObservation> ForIncident(
        Incident incident, IReadOnlyDictionary<IndicatorId, IReadOnlyDictionary<IndicatorState, double>> expected)
    {
        ArgumentNullException.ThrowIfNull(incident);
        ArgumentNullException.ThrowIfNull(expected);
        var list = new List<IndicatorObservation>();
        foreach (var (indicator, states) in expected)
        {
            var indication = incident.IndicationOf(indicator);
            foreach (var (state, probability) in states.Where(s => s.Value > 0))
            {
                list.Add(indication is { } i
                    ? new IndicatorObservation(indicator, state, i.State, i.Distrusted, probability)
                    : new IndicatorObservation(indicator, state, IndicatorState.Unknown, Weight: probability));
            }
        }

        return list;
    }
}
