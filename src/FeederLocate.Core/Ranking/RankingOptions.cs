using System.Collections.Immutable;

namespace FeederLocate.Core.Ranking;

/// <summary>Error rates of one indicator: probabilities of missing a fault, reporting falsely, and being misread.</summary>
/// <param name="MissProbability">P(reports none | it should have picked up).</param>
/// <param name="FalseReportProbability">P(reports a pickup | it should not have), including a wrong direction.</param>
/// <param name="MisreadProbability">P(the reading written down is another state than shown): field readings.</param>
/// <param name="WrongDirectionProbability">P(the opposite direction | a direction expected), directional indicators;
/// null takes half the false-report rate.</param>
public sealed record IndicatorErrorRates(double MissProbability, double FalseReportProbability, double MisreadProbability = 0, double? WrongDirectionProbability = null)
{
    /// <summary>P(the opposite direction | a direction expected): the learned rate, else half the false-report rate.</summary>
    public double WrongDirection => WrongDirectionProbability ?? (FalseReportProbability / 2);

    public void Validate()
    {
        foreach (var (name, p) in new[] { ("miss", MissProbability), ("false report", FalseReportProbability), ("misread", MisreadProbability), ("wrong direction", WrongDirection) })
        {
            if (!(p is >= 0 and < 0.5))
            {
                throw new ArgumentOutOfRangeException(name, p, $"{name} probability must be within 0 to 0.5");
            }
        }
    }
}

/// <summary>Measurement tolerance: σ = relative·|predicted| + absolute, in the quantity's unit.</summary>
public sealed record MeasurementTolerance(double Relative, double Absolute);

/// <summary>
/// Settings of the ranking. Defaults are common practice for MV distribution; every number here is
/// shown with the result so the operator can see what was assumed.
/// </summary>
public sealed record RankingOptions
{
    /// <summary>Remote (telecontrol) indicators: miss 5 %, false 2 % (common practice).</summary>
    public IndicatorErrorRates RemoteRates { get; init; } = new(0.05, 0.02);

    /// <summary>Field-read indicators: as remote plus 3 % misreading (common practice, from memory).</summary>
    public IndicatorErrorRates FieldRates { get; init; } = new(0.05, 0.02, 0.03);

    /// <summary>Weight (0..1) of an indication read before a trial re-energisation. One read after its indicator's reset time (counted from the fault) carries no weight at all.</summary>
    public double StaleWeight { get; init; } = 0.3;

    /// <summary>
    /// Voltage factor c of the predictions compared with the evidence: 1.0. IEC 60909-0's cmax = 1.1 rates
    /// equipment for the largest current; a recorded current is compared with the current at the nominal
    /// voltage, within the measurement tolerance (common practice).
    /// </summary>
    public double VoltageFactor { get; init; } = 1.0;

    /// <summary>
    /// σ of ln(current / pickup) at which an indicator is taken to pick up: 0.1, about the ±10 % to which
    /// indicator settings and the model's currents hold (common practice). Near its pickup an indicator
    /// may show either state; 0 makes every pickup a sharp step.
    /// </summary>
    public double PickupTolerance { get; init; } = 0.1;

    /// <summary>Faulted-phase current at the feeder breaker: 5 % + 20 A (CT and recorder class, common practice).</summary>
    public MeasurementTolerance PhaseCurrentTolerance { get; init; } = new(0.05, 20);

    /// <summary>Residual current |3I0|: 10 % + 1 A (summation CTs on cable feeders, common practice).</summary>
    public MeasurementTolerance ResidualCurrentTolerance { get; init; } = new(0.10, 1);

    /// <summary>Neutral voltage |U0|: 5 % + 200 V (common practice).</summary>
    public MeasurementTolerance NeutralVoltageTolerance { get; init; } = new(0.05, 200);

    /// <summary>Fault resistances for earth faults on isolated and resonant networks, Ω (a few Ω to a few kΩ, common practice).</summary>
    public ImmutableArray<double> HighResistanceEarthFaultOhms { get; init; } = [0, 5, 20, 60, 150, 400, 1000, 2500, 5000];

    /// <summary>Fault resistances for earth faults that trip on solid and impedance networks, Ω (mostly under 20 Ω, common practice).</summary>
    public ImmutableArray<double> LowResistanceEarthFaultOhms { get; init; } = [0, 0.5, 1, 1.5, 2, 3, 4, 6, 8, 10, 13, 16, 20];

    /// <summary>
    /// Prior share of high-resistance earth faults (the <see cref="HighResistanceEarthFaultOhms"/> range) among
    /// earth faults that tripped a device on solid and impedance networks: a sensitive earth-fault element
    /// trips on a few amperes (common practice). Where nothing tripped on such a network, the whole range from
    /// 0 Ω to several kΩ is considered with the tripping range.
    /// </summary>
    public double HighResistanceTripShare { get; init; } = 0.1;

    /// <summary>P(a fuse reported blown with the fault not beyond it, or intact where the fault current would have blown it): 2 % (common practice).</summary>
    public double FuseErrorProbability { get; init; } = 0.02;

    /// <summary>P(a directional or wattmetric earth-fault element points the wrong way or stays silent), and of a fault locator's reading being wrong: 5 % (common practice).</summary>
    public double RelayErrorProbability { get; init; } = 0.05;

    /// <summary>Fault locator reactance: 10 % + 0.3 Ω (fault resistance, load and line data; common practice).</summary>
    public MeasurementTolerance FaultReactanceTolerance { get; init; } = new(0.10, 0.3);

    /// <summary>Fault resistances of short circuits, Ω (a few ohms at most, common practice).</summary>
    public ImmutableArray<double> ShortCircuitOhms { get; init; } = [0, 0.5, 1.5, 3];

    /// <summary>Positions along a segment (fraction from its from node) at which the substation measurements are compared.</summary>
    public ImmutableArray<double> Positions { get; init; } = [1.0 / 6, 0.5, 5.0 / 6];

    /// <summary>Likelihood factor of a fault where the tripped device would not have seen it (maloperation, wrong switch state).</summary>
    public double OutsideTrippedZoneFactor { get; init; } = 1e-3;

    /// <summary>Significance below which the best explanation's disagreements make the evidence inconsistent.</summary>
    public double InconsistencySignificance { get; init; } = 0.01;

    /// <summary>A measurement further than this many σ from the best explanation makes the evidence inconsistent.</summary>
    public double InconsistentMeasurementSigma { get; init; } = 4;

    /// <summary>Share of prior mass given to cross-country faults when single faults explain the evidence badly.</summary>
    public double CrossCountryPrior { get; init; } = 0.05;

    /// <summary>How many of the best single-fault segments are paired for cross-country hypotheses.</summary>
    public int CrossCountryCandidates { get; init; } = 25;

    /// <summary>How many top suspects get an explanation.</summary>
    public int ExplainedSuspects { get; init; } = 3;

    /// <summary>
    /// Prior probability of one switch being in the other position than recorded at fault time: 1 %
    /// (common practice). Used for the switches whose other position could explain the evidence.
    /// </summary>
    public double WrongSwitchPositionPrior { get; init; } = 0.01;

    /// <summary>How many switches at most are tried in their other position (keeps the ranking fast on large grids).</summary>
    public int SwitchSuspectCandidates { get; init; } = 6;

    public static RankingOptions Default { get; } = new();

    public void Validate()
    {
        RemoteRates.Validate();
        FieldRates.Validate();
        if (!(StaleWeight is >= 0 and <= 1))
        {
            throw new ArgumentOutOfRangeException(nameof(StaleWeight), StaleWeight, "stale weight must be within 0 to 1");
        }

        foreach (var (name, p) in new[] { (nameof(HighResistanceTripShare), HighResistanceTripShare), (nameof(FuseErrorProbability), FuseErrorProbability), (nameof(RelayErrorProbability), RelayErrorProbability) })
        {
            if (!(p is > 0 and < 0.5))
            {
                throw new ArgumentOutOfRangeException(name, p, $"{name} must lie strictly between 0 and 0.5");
            }
        }

        if (!(WrongSwitchPositionPrior is >= 0 and < 0.5))
        {
            throw new ArgumentOutOfRangeException(nameof(WrongSwitchPositionPrior), WrongSwitchPositionPrior, "prior of a wrongly recorded switch position must be within 0 to 0.5");
        }

        ArgumentOutOfRangeException.ThrowIfNegative(SwitchSuspectCandidates);
        if (!(PickupTolerance is >= 0 and <= 1))
        {
            throw new ArgumentOutOfRangeException(nameof(PickupTolerance), PickupTolerance, "pickup tolerance (σ of ln I/I_pickup) must be within 0 to 1");
        }

        if (Positions.IsDefaultOrEmpty || Positions.Any(p => !(p is >= 0 and <= 1)))
        {
            throw new ArgumentOutOfRangeException(nameof(Positions), "positions must be fractions 0 to 1, at least one");
        }
    }
}
