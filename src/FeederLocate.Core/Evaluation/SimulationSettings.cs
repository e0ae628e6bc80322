using System.Collections.Immutable;
using FeederLocate.Core.Model;

namespace FeederLocate.Core.Evaluation;

/// <summary>
/// How simulated incidents go wrong: each indication is lost (unknown) with <see cref="UnknownProbability"/>;
/// one that should show a pickup shows none with <see cref="MissProbability"/>; one that should show none
/// reports falsely with <see cref="FalseProbability"/> (or its own rate in <see cref="FalseProbabilityByIndicator"/>).
/// Substation measurements carry relative noise.
/// </summary>
public sealed record SimulationSettings(
    double MissProbability = 0.05,
    double FalseProbability = 0.02,
    double UnknownProbability = 0.10,
    double MeasurementNoiseRelative = 0.02,
    ImmutableDictionary<IndicatorId, double>? FalseProbabilityByIndicator = null)
{
    public double FalseProbabilityOf(IndicatorId indicator) =>
        FalseProbabilityByIndicator is { } own && own.TryGetValue(indicator, out var p) ? p : FalseProbability;

    public void Validate()
    {
        foreach (var (name, p) in new[] { ("miss", MissProbability), ("false", FalseProbability), ("unknown", UnknownProbability) })
        {
            if (!(p is >= 0 and <= 1))
            {
                throw new ArgumentOutOfRangeException(name, p, $"--{name} is a probability: 0 to 1");
            }
        }
    }
}
