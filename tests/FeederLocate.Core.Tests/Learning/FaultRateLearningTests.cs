using CsCheck;
using FeederLocate.Core.Learning;
using FeederLocate.Core.Model;

namespace FeederLocate.Core.Tests.Learning;

/// <summary>
/// Fault rates on the test grid: cable CAB-AL150 (default 3 per 100 km·year) on S1 (2 km) and S2 (3 km),
/// overhead OHL-AL95 (8 per 100 km·year) on S3 (5 km). Default strengths E0 = 50 km·years, S = 10 km·years.
/// </summary>
public class FaultRateLearningTests
{
    private const double Tolerance = 1e-12;

    private static readonly DateTimeOffset Day = new(2025, 6, 1, 0, 0, 0, TimeSpan.Zero);

    [Fact]
    public void Posteriors_match_the_hand_computed_Gamma_updates()
    {
        var options = new FaultRateOptions { ObservationYears = 2 };
        var faults = new[] { new ConfirmedFault(new SegmentId("S1"), Day), new ConfirmedFault(new SegmentId("S1"), Day.AddDays(90)) };

        var rates = FaultRateLearning.Learn(TestGrids.Brackenfold(), faults, options);

        // Cable: prior α0 = 0.03·50 = 1.5, β0 = 50; exposure X = (2 + 3) km · 2 years = 10 km·years, k = 2.
        // Posterior Gamma(1.5 + 2, 50 + 10) = Gamma(3.5, 60), mean 0.058333.
        var cable = rates.LineTypes[0];
        Assert.Equal(new GammaParameters(1.5, 50), cable.Prior);
        Assert.Equal(new GammaParameters(3.5, 60), cable.Posterior);
        Assert.Equal(10, cable.ExposureKmYears, Tolerance);
        Assert.Equal(2, cable.Faults);
        // Overhead: prior Gamma(0.08·50, 50) = Gamma(4, 50); X = 5·2 = 10, k = 0 → Gamma(4, 60), mean 0.066667.
        Assert.Equal(new GammaParameters(4, 60), rates.LineTypes[1].Posterior);

        // S1: prior Gamma(m·S, S) with m = 3.5/60: Gamma(0.58333, 10); own k = 2 over 2·2 = 4 km·years
        // → Gamma(2.58333, 14), mean 2.58333/14 = 0.184524 per km·year, 0.36905 faults a year on 2 km.
        var s1 = rates.Of(new SegmentId("S1"));
        AssertGamma(3.5 / 60 * 10, 10, s1.Prior);
        AssertGamma((3.5 / 60 * 10) + 2, 14, s1.Posterior);
        Assert.Equal(0.18452380952381, s1.FaultsPerKmYear, 1e-12);
        Assert.Equal(18.452380952381, s1.FaultsPer100KmYear, 1e-10);
        Assert.Equal(2 * 0.18452380952381, s1.ExpectedFaultsPerYear, 1e-12);
        // S2: Gamma(0.58333, 10) + (0, 3·2 = 6) → Gamma(0.58333, 16), mean 0.0364583.
        Assert.Equal(0.036458333333333, rates.Of(new SegmentId("S2")).FaultsPerKmYear, 1e-12);
        // S3: m = 4/60: Gamma(0.66667, 10) + (0, 5·2 = 10) → Gamma(0.66667, 20), mean 0.0333333.
        Assert.Equal(0.033333333333333, rates.Of(new SegmentId("S3")).FaultsPerKmYear, 1e-12);
        Assert.Equal(2, rates.ObservationYears);
        Assert.Equal(2, rates.Faults);
    }

    [Fact]
    public void Without_history_every_segment_has_its_line_types_stated_rate()
    {
        var rates = FaultRateLearning.Learn(TestGrids.Brackenfold(), []);

        Assert.Equal(0, rates.ObservationYears);
        // 3 and 8 faults per 100 km·year are 0.03 and 0.08 per km·year.
        Assert.Equal(0.03, rates.Of(new SegmentId("S1")).FaultsPerKmYear, Tolerance);
        Assert.Equal(0.03, rates.Of(new SegmentId("S2")).FaultsPerKmYear, Tolerance);
        Assert.Equal(0.08, rates.Of(new SegmentId("S3")).FaultsPerKmYear, Tolerance);
        Assert.Equal(3, rates.Of(new SegmentId("S1")).FaultsPer100KmYear, 1e-10);
    }

    [Fact]
    public void The_history_length_is_the_span_of_the_reported_times_in_years()
    {
        // 2020-01-01 to 2024-01-01 is 1461 days = 4 × 365.25: exactly 4 years.
        var faults = new[]
        {
            new ConfirmedFault(new SegmentId("S3"), new DateTimeOffset(2020, 1, 1, 0, 0, 0, TimeSpan.Zero)),
            new ConfirmedFault(new SegmentId("S3"), new DateTimeOffset(2024, 1, 1, 0, 0, 0, TimeSpan.Zero)),
        };

        var rates = FaultRateLearning.Learn(TestGrids.Brackenfold(), faults);

        Assert.Equal(4, rates.ObservationYears, Tolerance);
        // S3's own exposure: 5 km · 4 years.
        Assert.Equal(20, rates.Of(new SegmentId("S3")).ExposureKmYears, Tolerance);
    }

    [Fact]
    public void A_history_shorter_than_the_minimum_counts_as_the_minimum()
    {
        var faults = new[] { new ConfirmedFault(new SegmentId("S1"), Day), new ConfirmedFault(new SegmentId("S2"), Day.AddDays(7)) };

        Assert.Equal(1, FaultRateLearning.Learn(TestGrids.Brackenfold(), faults).ObservationYears, Tolerance);
        Assert.Equal(0.5, FaultRateLearning.Learn(TestGrids.Brackenfold(), faults, new FaultRateOptions { MinimumObservationYears = 0.5 }).ObservationYears, Tolerance);
    }

    [Fact]
    public void Faults_on_segments_not_in_the_grid_are_listed_and_not_counted()
    {
        var faults = new[]
        {
            new ConfirmedFault(new SegmentId("S9"), Day),
            new ConfirmedFault(new SegmentId("S9"), Day.AddDays(30)),
            new ConfirmedFault(new SegmentId("S1"), Day.AddDays(60)),
        };

        var rates = FaultRateLearning.Learn(TestGrids.Brackenfold(), faults);

        Assert.Equal(new SegmentId("S9"), Assert.Single(rates.UnknownSegments));
        Assert.Equal(1, rates.Faults);
        Assert.Equal(1, rates.LineTypes[0].Faults);
        Assert.Throws<KeyNotFoundException>(() => rates.Of(new SegmentId("S9")));
    }

    [Fact]
    public void A_segments_rate_lies_between_its_line_types_rate_and_its_own_frequency()
    {
        Gen.Select(Gen.Int[0, 40], Gen.Double[0.5, 30]).Sample((faultsOnS3, years) =>
        {
            var faults = Enumerable.Range(0, faultsOnS3).Select(i => new ConfirmedFault(new SegmentId("S3"), Day.AddDays(i)));

            var rates = FaultRateLearning.Learn(TestGrids.Brackenfold(), faults, new FaultRateOptions { ObservationYears = years });

            var s3 = rates.Of(new SegmentId("S3"));
            var typeMean = rates.LineTypes[1].FaultsPerKmYear;
            var own = faultsOnS3 / (5 * years);
            Assert.InRange(s3.FaultsPerKmYear, Math.Min(typeMean, own) - 1e-12, Math.Max(typeMean, own) + 1e-12);
        });
    }

    [Theory]
    [InlineData(0)]
    [InlineData(-5)]
    [InlineData(double.NaN)]
    public void Strengths_out_of_range_are_refused(double value)
    {
        Assert.Throws<ArgumentOutOfRangeException>(() => new FaultRateOptions { PriorExposureKmYears = value });
        Assert.Throws<ArgumentOutOfRangeException>(() => new FaultRateOptions { SegmentShrinkKmYears = value });
        Assert.Throws<ArgumentOutOfRangeException>(() => new FaultRateOptions { ObservationYears = value });
    }

    private static void AssertGamma(double shape, double rate, GammaParameters actual)
    {
        Assert.Equal(shape, actual.Shape, Tolerance);
        Assert.Equal(rate, actual.Rate, Tolerance);
    }
}
