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
}
