namespace FeederLocate.Core.Model;

/// <summary>
/// The one place where values in the units people type become the SI basis of the calculations.
/// Each conversion keeps the operand order of the formulas it replaced, so results are bit-identical.
/// </summary>
public static class Units
{
    /// <summary>
    /// Phase-to-neutral voltage in V of a three-phase system with line-to-line voltage
    /// <paramref name="lineVoltageKv"/> in kV, times <paramref name="factor"/> (e.g. the voltage factor c):
    /// factor·U·1000/√3 (IEC 60909-0 uses c·Un/√3 as the equivalent source voltage).
    /// </summary>
    public static double PhaseVoltageV(double lineVoltageKv, double factor = 1.0) => factor * lineVoltageKv * 1000 / Math.Sqrt(3);

    /// <summary>Capacitance per km in F from nF per km (the unit line data sheets give).</summary>
    public static double FaradsPerKm(double nanofaradsPerKm) => nanofaradsPerKm * 1e-9;

    /// <summary>A rate per km·year from the rate per 100 km·year that fault statistics quote.</summary>
    public static double PerKmYear(double per100KmYear) => per100KmYear / 100;
}
