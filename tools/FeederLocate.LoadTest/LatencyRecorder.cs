namespace FeederLocate.LoadTest;

/// <summary>
/// Latencies of one kind of request, each with the time into the run it started at, so the summary
/// can be given for the whole run and for windows of it. One instance per client (not thread-safe);
/// <see cref="Merge"/> joins them at the end.
/// </summary>
public sealed class LatencyRecorder
{
    private readonly List<(TimeSpan Started, TimeSpan Latency)> _samples = [];

    public int Count => _samples.Count;

    public void Add(TimeSpan started, TimeSpan latency) => _samples.Add((started, latency));

    public static LatencyRecorder Merge(IEnumerable<LatencyRecorder> recorders)
    {
        ArgumentNullException.ThrowIfNull(recorders);
        var merged = new LatencyRecorder();
        foreach (var recorder in recorders)
        {
            merged._samples.AddRange(recorder._samples);
        }

        return merged;
    }

    /// <summary>The summary of every sample.</summary>
    public LatencySummary Summary() => LatencySummary.Of(_samples.Select(s => s.Latency.TotalMilliseconds));

    /// <summary>The summary of the samples started in [<paramref name="from"/>, <paramref name="to"/>).</summary>
    public LatencySummary Summary(TimeSpan from, TimeSpan to) =>
        LatencySummary.Of(_samples.Where(s => s.Started >= from && s.Started < to).Select(s => s.Latency.TotalMilliseconds));

    /// <summary>
    /// The nearest-rank percentile (common practice): the smallest value with at least
    /// <paramref name="percent"/> % of the values at or below it, i.e. the value at rank ⌈p/100 · n⌉ of the
    /// sorted values (rank 1 for p = 0). Always one of the values; no interpolation.
    /// </summary>
    /// <param name="sorted">Values in ascending order, at least one.</param>
    /// <param name="percent">0..100.</param>
    public static double NearestRank(IReadOnlyList<double> sorted, double percent)
    {
        ArgumentNullException.ThrowIfNull(sorted);
        if (sorted.Count == 0)
        {
            throw new ArgumentException("needs at least one value", nameof(sorted));
        }

        if (percent is < 0 or > 100 || double.IsNaN(percent))
        {
            throw new ArgumentOutOfRangeException(nameof(percent), percent, "percentile must be within 0..100");
        }

        // p · n first: exact for whole percentages, so 95 % of 20 is rank 19, not 20.
        var rank = (int)Math.Ceiling(percent * sorted.Count / 100);
        return sorted[Math.Clamp(rank, 1, sorted.Count) - 1];
    }
}

/// <summary>Latency of a set of requests in milliseconds: nearest-rank percentiles and the largest; all 0 when there are none.</summary>
public sealed record LatencySummary(int Count, double P50Ms, double P95Ms, double P99Ms, double MaxMs)
{
    public static LatencySummary Of(IEnumerable<double> latenciesMs)
    {
        var sorted = latenciesMs.Order().ToList();
        return sorted.Count == 0
            ? new LatencySummary(0, 0, 0, 0, 0)
            : new LatencySummary(sorted.Count, LatencyRecorder.NearestRank(sorted, 50), LatencyRecorder.NearestRank(sorted, 95),
                LatencyRecorder.NearestRank(sorted, 99), sorted[^1]);
    }
}
