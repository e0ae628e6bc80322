namespace FeederLocate.Core.Ranking;

/// <summary>
/// Likelihood of a measured value given a predicted one, with σ = relative·|predicted| + absolute:
/// Huber's robust density (normal within 3σ, exponential tails beyond), so one bad record cannot veto
/// the truth and no exponential is needed.
/// </summary>
internal static class MeasurementLikelihood
{
    private const double HuberLimitSigma = 3;
    private static readonly double LogNormalisation = 0.5 * Math.Log(2 * Math.PI);

    public static double Sigma(MeasurementTolerance tolerance, double predicted) =>
        (tolerance.Relative * Math.Abs(predicted)) + tolerance.Absolute;

    public static double Log(MeasurementTolerance tolerance, double measured, double predicted)
    {
        var sigma = Sigma(tolerance, predicted);
        var z = Math.Abs(measured - predicted) / sigma;
        var penalty = z <= HuberLimitSigma ? 0.5 * z * z : (HuberLimitSigma * z) - (0.5 * HuberLimitSigma * HuberLimitSigma);
        return -penalty - Math.Log(sigma) - LogNormalisation;
    }

    /// <summary>The largest <see cref="Log"/> can be for any prediction: σ at its least (the absolute part), no penalty.</summary>
    public static double Maximum(MeasurementTolerance tolerance) =>
        tolerance.Absolute > 0 ? -Math.Log(tolerance.Absolute) - LogNormalisation : double.PositiveInfinity;

    /// <summary>
    /// At least <see cref="Log"/> for every prediction within [<paramref name="lowest"/>, <paramref name="highest"/>] (both ≥ 0):
    /// σ grows with the prediction, so the penalty is at least that of the distance to the interval over the largest σ,
    /// and ln σ at least that of the smallest.
    /// </summary>
    public static double UpperBound(MeasurementTolerance tolerance, double measured, double lowest, double highest)
    {
        var sigmaLeast = Sigma(tolerance, lowest);
        if (!(sigmaLeast > 0))
        {
            return double.PositiveInfinity;
        }

        var distance = measured < lowest ? lowest - measured : measured > highest ? measured - highest : 0;
        var z = distance > 0 ? distance / Sigma(tolerance, highest) : 0;
        var penalty = z <= HuberLimitSigma ? 0.5 * z * z : (HuberLimitSigma * z) - (0.5 * HuberLimitSigma * HuberLimitSigma);
        return -penalty - Math.Log(sigmaLeast) - LogNormalisation;
    }
}
