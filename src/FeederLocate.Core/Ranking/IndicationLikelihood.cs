using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;

namespace FeederLocate.Core.Ranking;

/// <summary>
/// P(recorded state | expected state) for one indicator: it misses with probability m, reports
/// falsely with probability f (a directional one shows each direction with f/2 where none was expected, and
/// the opposite direction with w, learned or f/2, where one was), and a field reading
/// is written down as another of its states with probability r.
/// </summary>
public static class IndicationLikelihood
{
    /// <summary>Probability of recording <paramref name="observed"/> when the indicator should show <paramref name="expected"/>.</summary>
    public static double Probability(Indicator indicator, IndicatorErrorRates rates, IndicatorState expected, IndicatorState observed)
    {
        ArgumentNullException.ThrowIfNull(indicator);
        ArgumentNullException.ThrowIfNull(rates);
        var states = indicator.Directional ? 3 : 2;
        var shown = Shown(indicator.Directional, rates, expected, observed);
        return ((1 - rates.MisreadProbability) * shown) + (rates.MisreadProbability / (states - 1) * (1 - shown));
    }

    /// <summary>The probability that the indicator itself shows <paramref name="observed"/>.</summary>
    private static double Shown(bool directional, IndicatorErrorRates rates, IndicatorState expected, IndicatorState observed)
    {
        var m = rates.MissProbability;
        var f = rates.FalseReportProbability;
        if (!directional)
        {
            return (expected, observed) switch
            {
                (IndicatorState.Fault, IndicatorState.Fault) => 1 - m,
                (IndicatorState.Fault, _) => m,
                (_, IndicatorState.Fault) => f,
                _ => 1 - f,
            };
        }

        return (expected, observed) switch
        {
            (IndicatorState.None, IndicatorState.None) => 1 - f,
            (IndicatorState.None, _) => f / 2,
            (_, IndicatorState.None) => m,
            _ when expected == observed => 1 - m - rates.WrongDirection,
            _ => rates.WrongDirection,
        };
    }

    /// <summary>Whether a recorded state disagrees with the expected one, in words for the operator.</summary>
    public static string Describe(IndicatorState expected, IndicatorState observed) => (expected, observed) switch
    {
        _ when expected == observed => "agrees",
        (IndicatorState.None, _) => "reported without cause (false report)",
        (_, IndicatorState.None) => "did not report (miss)",
        _ => "reported the wrong direction",
    };
}
