using System.Collections.Immutable;
using FeederLocate.Core.Model;

namespace FeederLocate.Core.Evaluation;

/// <summary>
/// How simulated incidents go wrong: each indication is lost (unknown) with <see cref="UnknownProbability"/>;
/// one that should show a pickup shows none with <see cref="MissProbability"/>; one that should show none
/// reports falsely with <see cref="FalseProbability"/> (or its own rate in <see cref="FalseProbabilityByIndicator"/>).
/// Substation records carry relative noise.
/// </summary>
public sealed record SimulationSettings(
    double MissProbability = 0.05,
    double FalseProbability = 0.02,
    double UnknownProbability = 0.10,
    double RecordNoiseRelative = 0.02,
    ImmutableDictionary<IndicatorId, double>? FalseProbabilityByIndicator = null)
{
    /// <summary>
    /// Adds the protection context: an earth-fault direction from every feeder breaker (wrong or silent
    /// with <see cref="RelayErrorProbability"/>), the fault locator's reactance at the tripped feeder
    /// breaker, the reclosing sequence of a tripped breaker or recloser, and the fuses on the faulted
    /// feeder found blown or intact.
    /// </summary>
    public bool ProtectionContext { get; init; }

    /// <summary>
    /// Share of the earth faults on solid and impedance networks that go through a high resistance
    /// (log-uniform 200 Ω to 5 kΩ: a conductor down on dry ground) and trip nothing.
    /// </summary>
    public double HighResistanceShare { get; init; }

    /// <summary>P(a relay's earth-fault direction is wrong or silent): 5 % (common practice).</summary>
    public double RelayErrorProbability { get; init; } = 0.05;

    /// <summary>Relative noise of a fault locator's reactance: 5 % (common practice).</summary>
    public double ReactanceNoiseRelative { get; init; } = 0.05;

    public double FalseProbabilityOf(IndicatorId indicator) =>
        FalseProbabilityByIndicator is { } own && own.TryGetValue(indicator, out var p) ? p : FalseProbability;

    public void Validate()
    {
        foreach (var (name, p) in new[] { ("miss", MissProbability), ("false", FalseProbability), ("unknown", UnknownProbability), ("high-resistance", HighResistanceShare), ("relay-error", RelayErrorProbability) })
        {
            if (!(p is >= 0 and <= 1))
            {
                throw new ArgumentOutOfRangeException(name, p, $"--{name} is a probability: 0 to 1");
            }
        }
    }
}
