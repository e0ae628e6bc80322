using System.Numerics;
using FeederLocate.Core.Model;

namespace FeederLocate.Core.Tests.ReferenceCases;

/// <summary>
/// IEC TR 60909-4, worked example of the 33 kV / 6 kV network: the network feeder and the network
/// transformer, values as published (transcribed in shared CHECK-VALUES.md; edition and clause
/// from memory: 2000, clause 3). The feeder is given by its I"kQ = 13.12 kA at 33 kV, so S"kQ = √3·33 kV·13.12 kA.
/// </summary>
public static class IecTr60909Part4MediumVoltageExample
{
    /// <summary>Voltage factor of the example: cmax for medium voltage, IEC 60909-0 Table 1.</summary>
    public const double VoltageFactor = 1.10;

    public const double FeederNominalVoltageKv = 33;

    public const double FeederInitialShortCircuitCurrentKa = 13.12;

    /// <summary>R/X of the feeder as the example gives it.</summary>
    public const double FeederROverX = 0.1;

    /// <summary>Rated transformation ratio tr = 33 kV / 6.3 kV.</summary>
    public const double TransformationRatio = 33 / 6.3;

    /// <summary>ZQt: the feeder referred to the 6 kV side, Ω (published).</summary>
    public static readonly Complex FeederReferredOhm = new(0.0058, 0.0579);

    /// <summary>KT of the network transformer (published).</summary>
    public const double CorrectionFactor = 0.95878;

    /// <summary>ZTK = KT·ZT on the 6 kV side, Ω (published).</summary>
    public static readonly Complex CorrectedTransformerOhm = new(0.0152, 0.3803);

    /// <summary>The example prints impedances to four decimals: ±0.00005 Ω rounding, plus 0.00001 Ω for the inputs' rounding.</summary>
    public const double ImpedanceToleranceOhm = 0.00006;

    /// <summary>
    /// The formulas give XTK = 0.38023 Ω, the published value is 0.3803 Ω: 0.00007 Ω apart, which is the
    /// rounding of the example's intermediate values (uXr, xT), so XTK is compared to ±0.0001 Ω.
    /// </summary>
    public const double TransformerReactanceToleranceOhm = 0.0001;

    /// <summary>KT is printed to five decimals.</summary>
    public const double CorrectionFactorTolerance = 0.00001;

    public static double FeederShortCircuitMva => Math.Sqrt(3) * FeederNominalVoltageKv * FeederInitialShortCircuitCurrentKa;

    /// <summary>15 MVA, 33/6.3 kV, ukr 15 %, uRr 0.6 %: PkrT = uRr·SrT = 0.006·15 MVA = 90 kW.</summary>
    public static TransformerData Transformer => new(RatedMva: 15, HvKv: 33, MvKv: 6.3, UkrPercent: 15, PkrKw: 0.006 * 15 * 1000);
}
