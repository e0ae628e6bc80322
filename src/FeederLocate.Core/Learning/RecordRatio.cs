namespace FeederLocate.Core.Learning;

/// <summary>
/// How the substation records compare with the engine at the confirmed faults: the ratio of recorded to
/// predicted value of one quantity, the prediction averaged over the fault resistance and position given
/// the incident's records. A ratio far from 1 or a wide spread says the records (or the grid's data) are off
/// by more than the ranking's tolerance assumes. Reported; the ranking does not yet use it.
/// </summary>
/// <param name="Quantity">"phase current" (at the breaker with the fault beyond it) or "residual current".</param>
/// <param name="Records">Records compared (predicted value above zero).</param>
/// <param name="GeometricMeanRatio">exp(mean of ln(recorded/predicted)); 1 is unbiased.</param>
/// <param name="LogRatioStandardDeviation">Standard deviation of ln(recorded/predicted): about the relative error (0.05 ≈ 5 %).</param>
public sealed record RecordRatio(string Quantity, int Records, double GeometricMeanRatio, double LogRatioStandardDeviation)
{
    /// <summary>Summarises ratios recorded/predicted (each &gt; 0).</summary>
    public static RecordRatio Of(string quantity, IReadOnlyList<double> ratios)
    {
        ArgumentNullException.ThrowIfNull(ratios);
        if (ratios.Count == 0)
        {
            return new RecordRatio(quantity, 0, double.NaN, double.NaN);
        }

        var logs = ratios.Select(r => Math.Log(r)).ToList();
        var mean = logs.Average();
        var sd = logs.Count > 1 ? Math.Sqrt(logs.Sum(l => (l - mean) * (l - mean)) / (logs.Count - 1)) : double.NaN;
        return new RecordRatio(quantity, ratios.Count, Math.Exp(mean), sd);
    }
}
