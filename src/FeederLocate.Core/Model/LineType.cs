namespace FeederLocate.Core.Model;

public enum Construction
{
    Cable,
    Overhead,
}

/// <summary>
/// Electrical data of a conductor type, per km and per phase, in the units people type.
/// Z2 = Z1 (no rotating machines on the feeder).
/// </summary>
/// <param name="C0NfPerKm">Phase-to-earth (zero-sequence) capacitance per phase, nF/km, ≥ 0.</param>
/// <param name="FaultsPer100KmYear">Prior fault rate; null means the construction's default.</param>
public sealed record LineType(
    LineTypeId Id,
    Construction Construction,
    double R1OhmPerKm,
    double X1OhmPerKm,
    double R0OhmPerKm,
    double X0OhmPerKm,
    double C0NfPerKm,
    double AmpacityA,
    double? FaultsPer100KmYear = null,
    string? Description = null,
    string? ConductorMaterial = null,
    double? CrossSectionMm2 = null,
    string? DataSource = null)
{
    /// <summary>Default fault rates when a line type gives none (from memory, typical MV figures).</summary>
    public const double DefaultOverheadFaultsPer100KmYear = 8.0;

    /// <summary>Default fault rate of cable (from memory, typical MV figure).</summary>
    public const double DefaultCableFaultsPer100KmYear = 3.0;

    /// <summary>The line type's fault rate, or its construction's default.</summary>
    public double EffectiveFaultsPer100KmYear =>
        FaultsPer100KmYear ?? (Construction == Construction.Cable
            ? DefaultCableFaultsPer100KmYear
            : DefaultOverheadFaultsPer100KmYear);
}
