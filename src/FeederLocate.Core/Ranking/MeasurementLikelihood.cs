namespace FeederLocate.Core.Ranking;

/// <summary>
/// Likelihood of a measured value given a predicted one: normal with σ = relative·|predicted| + absolute,
/// mixed with a small broad component so one bad record cannot veto the truth (a robust likelihood).
/// </summary>
internal static class MeasurementLikelihood
{
    private const double OutlierShare = 0.02;

    public static double Sigma(MeasurementTolerance tolerance, double predicted) =>
        (tolerance.Relative * Math.Abs(predicted)) + tolerance.Absolute;

    public static double Log(MeasurementTolerance tolerance, double measured, double predicted)
    {
        var sigma = Sigma(tolerance, predicted);
        var z = (measured - predicted) / sigma;
        var normal = Math.Exp(-0.5 * z * z) / (sigma * Math.Sqrt(2 * Math.PI));
        var broadWidth = (2 * Math.Max(Math.Abs(measured), Math.Abs(predicted))) + (10 * tolerance.Absolute);
        return Math.Log(((1 - OutlierShare) * normal) + (OutlierShare / broadWidth));
    }
}
