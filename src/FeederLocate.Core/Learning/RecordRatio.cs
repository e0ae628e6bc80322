namespace FeederLocate.Core.Learning;

/// <summary>
/// How the substation records compare with the engine at the confirmed faults: the ratio of recorded to
/// predicted value of one quantity, the prediction averaged over the fault resistance and position given
/// the incident's records. A ratio far from 1 or a wide spread says the records (or the grid's data) are off
/// by more than the ranking's tolerance assumes. With enough records (<see cref="MinimumRecords"/>) the ranking
/// widens its tolerance of that quantity to <see cref="RelativeError"/> where that is larger.
/// </summary>
/// <param name="Quantity">"phase current" (at the breaker with the fault beyond it) or "residual current".</param>
/// <param name="Records">Records compared (predicted value above zero).</param>
/// <param name="GeometricMeanRatio">exp(mean of ln(recorded/predicted)); 1 is unbiased.</param>
/// <param name="LogRatioStandardDeviation">Standard deviation of ln(recorded/predicted): about the relative error (0.05 ≈ 5 %).</param>
public sealed record RecordRatio(string Quantity, int Records, double GeometricMeanRatio, double LogRatioStandardDeviation)
{
    /// <summary>The quantity compared at the breaker with the fault beyond it.</summary>
    public const string PhaseCurrent = "phase current";

    /// <summary>The residual current |3I0| compared at the breaker with the fault beyond it.</summary>
    public const string ResidualCurrent = "residual current";

    /// <summary>Measurements needed before the ratio is taken as the measurement's error: fewer say too little.</summary>
    public const int MinimumRecords = 5;

    /// <summary>
    /// Root mean square of ln(recorded/predicted): bias and spread together, about the relative error
    /// (0.05 ≈ 5 %); NaN below <see cref="MinimumRecords"/>.
    /// </summary>
    public double RelativeError { get; init; } = double.NaN;

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
        var rms = Math.Sqrt(logs.Sum(l => l * l) / logs.Count);
        return new RecordRatio(quantity, ratios.Count, Math.Exp(mean), sd) { RelativeError = ratios.Count >= MinimumRecords ? rms : double.NaN };
    }
}
