namespace FeederLocate.Core.Ranking;

/// <summary>
/// P(an element picks up | the current the reference model predicts): a setting is met within a
/// tolerance, and the model's current is not exact either, so near its pickup an indicator may show
/// either state. z = ln(I / I_pickup) / σ, σ = <see cref="RankingOptions.PickupTolerance"/>, through the
/// logistic curve 1 / (1 + e^(−1.702 z)) (within 0.01 of the normal distribution's; a cheap stand-in),
/// truncated at ±<see cref="BandSigma"/> and stretched to reach exactly 0 and 1 there, so that far from
/// the pickup the answer is a step (what lets the ranking sum most indicators at once, and equal the
/// plain sum to rounding).
/// </summary>
internal static class PickupCurve
{
    /// <summary>Half-width of the uncertain band, in σ of ln(I / I_pickup).</summary>
    public const double BandSigma = 3;

    private static readonly double Low = Logistic(-BandSigma);
    private static readonly double InverseSpan = 1 / (Logistic(BandSigma) - Low);

    /// <summary>P(pickup) for <paramref name="currentA"/> at a setting <paramref name="pickupA"/>; 0 where the element is absent (NaN) or sees nothing.</summary>
    public static double Probability(double currentA, double pickupA, double sigma)
    {
        if (double.IsNaN(pickupA) || !(currentA > 0))
        {
            return 0;
        }

        if (sigma <= 0)
        {
            return currentA >= pickupA ? 1 : 0;
        }

        // Outside the band the answer is a step: decided by the ratio alone, without a logarithm.
        var band = BandOf(sigma);
        if (currentA <= pickupA / band.Factor)
        {
            return 0;
        }

        if (currentA >= pickupA * band.Factor)
        {
            return 1;
        }

        var z = Math.Log(currentA / pickupA) / sigma;
        return z <= -BandSigma ? 0 : z >= BandSigma ? 1 : Math.Clamp((Logistic(z) - Low) * InverseSpan, 0, 1);
    }

    /// <summary>The band factor of the last σ asked for (one ranking uses one σ): e^(3σ) computed once, not per indicator.</summary>
    private static Band _last = new(0, 1);

    private static Band BandOf(double sigma)
    {
        var last = _last;
        if (last.Sigma != sigma)
        {
            last = new Band(sigma, BandFactor(sigma));
            _last = last;
        }

        return last;
    }

    private sealed record Band(double Sigma, double Factor);

    private static double Logistic(double z) => 1 / (1 + Math.Exp(-Slope * z));

    private const double Slope = 1.702;

    /// <summary>
    /// e^(−1.702 z) for the current-to-pickup ratio's inverse <paramref name="pickupToCurrent"/> = I_pickup / I:
    /// z = ln(I / I_pickup) / σ, so e^(−1.702 z) = (I_pickup / I)^(1.702 / σ). Ratios of such values are
    /// again such values, which lets a sum over sorted pickups step from one to the next by a multiplication.
    /// </summary>
    public static double ExponentialFactor(double pickupToCurrent, double sigma) => Math.Pow(pickupToCurrent, Slope / sigma);

    /// <summary>P(pickup) from e^(−1.702 z) (see <see cref="ExponentialFactor"/>): the same truncated, stretched logistic as <see cref="Probability"/>.</summary>
    public static double FromExponential(double exponential) => Math.Clamp(((1 / (1 + exponential)) - Low) * InverseSpan, 0, 1);

    /// <summary>The factor e^(band) by which the current may differ from the pickup and the answer still be uncertain.</summary>
    public static double BandFactor(double sigma) => Math.Exp(BandSigma * Math.Max(0, sigma));
}
