namespace FeederLocate.Core.Tests.ReferenceCases;

/// <summary>
/// Earth faults worked by hand from the symmetrical-component relations (shared CHECK-VALUES.md,
/// "Earth faults"; derived, not an independent source): I_f = 3E/(2·Z1 + Z0 + 3Rf) with the series
/// impedance negligible against the zero-sequence shunt, U0 = −Z0·I0, and for the earth-fault factor
/// (IEC 60071-1, definitions of earth fault factor and effectively earthed; edition and clause not
/// recorded in CHECK-VALUES.md) the healthy-phase voltages
/// Ub, Uc = U0 + a²U1 + aU2, U0 + aU1 + a²U2 with R1 = 0.
/// </summary>
public static class SymmetricalComponentEarthFaults
{
    /// <summary>Charging current of the isolated and resonant cases: I_C = 3ωC0·E = 100 A.</summary>
    public const double ChargingCurrentA = 100;

    /// <summary>E = 20 kV/√3 (c = 1 in these cases).</summary>
    public static readonly double PhaseVoltageV = 20_000 / Math.Sqrt(3);

    /// <summary>C0 = I_C/(3ωE) at 50 Hz, per phase: 9.189 µF.</summary>
    public const double CapacitanceMicrofarad = 9.189;

    /// <summary>Stated to three decimals in µF.</summary>
    public const double CapacitanceToleranceMicrofarad = 0.0005;

    /// <summary>Isolated: fault resistance, |U0/E| (±0.00005, four decimals), I_F in A and its tolerance (half a unit of the last digit given).</summary>
    public static TheoryData<double, double, double, double> Isolated => new()
    {
        { 100, 0.7559, 75.59, 0.005 },
        { 500, 0.2250, 22.50, 0.005 },
        { 1000, 0.1147, 11.47, 0.005 },
        { 5000, 0.0231, 2.309, 0.0005 },
    };

    public const double VoltageRatioTolerance = 0.00005;

    /// <summary>Resonant, d = 5 %: detuning v in percent, residual current at Rf 0 (A), |U0/E| at Rf 1000 Ω.</summary>
    public static TheoryData<double, double, double> Resonant => new()
    {
        { 0, 5.000, 0.6978 },
        { 10, 11.18, 0.5972 },
        { -10, 11.18, 0.5972 },
    };

    public const double ResonantDampingPercent = 5;

    /// <summary>11.18 A is given to two decimals (5.000 A to three).</summary>
    public const double ResonantResidualToleranceA = 0.005;

    /// <summary>Earth-fault factor for R1 = 0: X0/X1, R0/X1, |Ub|/E, |Uc|/E (three decimals, ±0.0005).</summary>
    public static TheoryData<double, double, double, double> EarthFaultFactor => new()
    {
        { 1, 0, 1.000, 1.000 },
        { 3, 0, 1.249, 1.249 },
        { 5, 0, 1.378, 1.378 },
        { 10, 0, 1.521, 1.521 },
        { 3, 1, 1.190, 1.347 },
    };

    public const double EarthFaultFactorTolerance = 0.0005;

    /// <summary>Neutral resistors for a current limit at 20 kV: RN = 20 kV/(√3·I), c = 1 (derived).</summary>
    public static TheoryData<double, double> NeutralResistorLimits => new()
    {
        { 11.547, 1000 },
        { 38.49, 300 },
    };
}
