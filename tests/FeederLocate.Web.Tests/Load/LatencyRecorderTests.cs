using FeederLocate.LoadTest;

namespace FeederLocate.Web.Tests.Load;

public sealed class LatencyRecorderTests
{
    // Nearest-rank percentile (common practice): the value at rank ⌈p/100 · n⌉ of the sorted values.
    // Hand-computed for 15, 20, 35, 40, 50 (n = 5): p5 → rank 1, p30 → rank 2 (⌈1.5⌉), p40 → rank 2 (exactly 2),
    // p50 → rank 3 (⌈2.5⌉), p100 → rank 5.
    [Theory]
    [InlineData(0, 15)]
    [InlineData(5, 15)]
    [InlineData(30, 20)]
    [InlineData(40, 20)]
    [InlineData(50, 35)]
    [InlineData(95, 50)]
    [InlineData(100, 50)]
    public void Nearest_rank_percentile_is_the_value_at_rank_ceiling_p_n(double percent, double expected)
    {
        Assert.Equal(expected, LatencyRecorder.NearestRank([15, 20, 35, 40, 50], percent));
    }

    [Fact]
    public void Whole_percentages_of_a_round_count_hit_their_rank_exactly()
    {
        // 95 % of 20 values is rank 19 exactly; 0.95 · 20 in floating point must not round up to 20.
        var values = Enumerable.Range(1, 20).Select(i => (double)i).ToList();

        Assert.Equal(19, LatencyRecorder.NearestRank(values, 95));
    }

    [Fact]
    public void Summary_gives_nearest_rank_percentiles_and_the_largest_and_windows_by_start_time()
    {
        var recorder = new LatencyRecorder();
        for (var ms = 1; ms <= 100; ms++)
        {
            // the first 50 start in the first second, the rest in the second
            recorder.Add(TimeSpan.FromSeconds(ms <= 50 ? 0.5 : 1.5), TimeSpan.FromMilliseconds(ms));
        }

        var all = recorder.Summary();
        var second = recorder.Summary(TimeSpan.FromSeconds(1), TimeSpan.FromSeconds(2));

        Assert.Equal(new LatencySummary(100, 50, 95, 99, 100), all);
        Assert.Equal(50, second.Count);
        Assert.Equal(75, second.P50Ms, 1e-9);
        Assert.Equal(100, second.MaxMs, 1e-9);
        Assert.Equal(new LatencySummary(0, 0, 0, 0, 0), recorder.Summary(TimeSpan.FromSeconds(5), TimeSpan.FromSeconds(6)));
    }

    [Fact]
    public void A_percentile_outside_0_to_100_or_of_no_values_is_refused()
    {
        Assert.Throws<ArgumentOutOfRangeException>(() => LatencyRecorder.NearestRank([1], 101));
        Assert.Throws<ArgumentException>(() => LatencyRecorder.NearestRank([], 50));
    }
}
