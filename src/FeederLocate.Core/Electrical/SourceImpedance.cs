using System.Numerics;
using FeederLocate.Core.Model;

namespace FeederLocate.Core.Electrical;

/// <summary>
/// Positive-sequence impedance of the supply seen from a substation's MV busbar, IEC 60909-0
/// (network feeder, clause 6.2; transformer with correction factor KT, clause 6.3.3).
/// </summary>
public static class SourceImpedance
{
    /// <summary>IEC 60909-0 Table 1: maximum voltage factor for medium voltage (1 kV &lt; Un ≤ 35 kV).</summary>
    public const double VoltageFactorMaxMediumVoltage = 1.10;

    /// <summary>IEC 60909-0 Table 1: minimum voltage factor for medium voltage.</summary>
    public const double VoltageFactorMinMediumVoltage = 1.00;

    /// <summary>The source impedance ZQ at the MV busbar, Ω, for voltage factor <paramref name="voltageFactor"/>.</summary>
    public static Complex AtBusbarOhm(Substation substation, double voltageFactor)
    {
        ArgumentNullException.ThrowIfNull(substation);
        CheckVoltageFactor(voltageFactor);
        return substation.Supply switch
        {
            BusbarShortCircuit b => NetworkFeederOhm(voltageFactor, substation.NominalVoltageKv, b.ShortCircuitMva, b.ROverX),
            UpstreamViaTransformer u => NetworkFeederOhm(voltageFactor, u.Upstream.NominalVoltageKv, u.Upstream.ShortCircuitMva, u.Upstream.ROverX)
                / Sqr(u.Transformer.HvKv / u.Transformer.MvKv)
                + CorrectedTransformerOhm(u.Transformer),
            _ => throw new ArgumentOutOfRangeException(nameof(substation), substation.Supply, "unknown supply model"),
        };
    }

    /// <summary>
    /// Network feeder, IEC 60909-0 eq. (5): |ZQ| = c·UnQ²/S"kQ, XQ = |ZQ|/√(1 + (R/X)²), RQ = (R/X)·XQ; Ω at UnQ.
    /// </summary>
    public static Complex NetworkFeederOhm(double voltageFactor, double nominalVoltageKv, double shortCircuitMva, double rOverX)
    {
        CheckVoltageFactor(voltageFactor);
        ArgumentOutOfRangeException.ThrowIfNegativeOrZero(shortCircuitMva);
        if (rOverX < 0)
        {
            throw new ArgumentOutOfRangeException(nameof(rOverX), rOverX, "must be >= 0");
        }
        var magnitudeOhm = voltageFactor * nominalVoltageKv * nominalVoltageKv / shortCircuitMva;
        var reactanceOhm = magnitudeOhm / Math.Sqrt(1 + (rOverX * rOverX));
        return new Complex(rOverX * reactanceOhm, reactanceOhm);
    }

    /// <summary>
    /// Transformer impedance on its MV side corrected by KT, IEC 60909-0 eqs. (7)–(9) and (12a):
    /// ZT = ukr/100·UrT²/SrT, RT = PkrT·UrT²/SrT², KT = 0.95·cmax/(1 + 0.6·xT); Ω.
    /// </summary>
    public static Complex CorrectedTransformerOhm(TransformerData transformer)
    {
        ArgumentNullException.ThrowIfNull(transformer);
        var baseOhm = transformer.MvKv * transformer.MvKv / transformer.RatedMva;
        var magnitudeOhm = transformer.UkrPercent / 100 * baseOhm;
        var resistanceOhm = transformer.PkrKw / 1000 * transformer.MvKv * transformer.MvKv / Sqr(transformer.RatedMva);
        var reactanceOhm = Math.Sqrt((magnitudeOhm * magnitudeOhm) - (resistanceOhm * resistanceOhm));
        return TransformerCorrectionFactor(transformer) * new Complex(resistanceOhm, reactanceOhm);
    }

    /// <summary>
    /// The transformer's zero-sequence impedance on the MV side, Ω, as the model uses it: where the supply
    /// is given as upstream network and transformer, <c>transformerZ0Ohm</c> corrected by the same KT as the
    /// positive-sequence impedance (Z0TK = KT·Z0T, IEC 60909-0 §6.3.3); where it is given by S"k alone, as
    /// given. Zero where none is given.
    /// </summary>
    public static Complex TransformerZeroSequenceOhm(Substation substation)
    {
        ArgumentNullException.ThrowIfNull(substation);
        if (substation.TransformerZ0Ohm is not { } z)
        {
            return Complex.Zero;
        }

        var given = new Complex(z.ResistanceOhm, z.ReactanceOhm);
        return substation.Supply is UpstreamViaTransformer u ? TransformerCorrectionFactor(u.Transformer) * given : given;
    }

    /// <summary>KT = 0.95·cmax/(1 + 0.6·xT), IEC 60909-0 eq. (12a), xT the relative reactance.</summary>
    public static double TransformerCorrectionFactor(TransformerData transformer)
    {
        ArgumentNullException.ThrowIfNull(transformer);
        var baseOhm = transformer.MvKv * transformer.MvKv / transformer.RatedMva;
        var magnitudeOhm = transformer.UkrPercent / 100 * baseOhm;
        var resistanceOhm = transformer.PkrKw / 1000 * transformer.MvKv * transformer.MvKv / Sqr(transformer.RatedMva);
        var relativeReactance = Math.Sqrt((magnitudeOhm * magnitudeOhm) - (resistanceOhm * resistanceOhm)) / baseOhm;
        return 0.95 * VoltageFactorMaxMediumVoltage / (1 + (0.6 * relativeReactance));
    }

    internal static void CheckVoltageFactor(double voltageFactor)
    {
        if (!(voltageFactor is >= 0.8 and <= 1.2))
        {
            throw new ArgumentOutOfRangeException(nameof(voltageFactor), voltageFactor, "voltage factor c must be within 0.8 to 1.2 (IEC 60909-0 Table 1 gives 1.00 to 1.10 for MV)");
        }
    }

    private static double Sqr(double x) => x * x;
}
