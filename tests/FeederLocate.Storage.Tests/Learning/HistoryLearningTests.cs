using FeederLocate.Core.Learning;
using FeederLocate.Core.Model;
using FeederLocate.Storage.Events;

namespace FeederLocate.Storage.Tests.Learning;

/// <summary>
/// Priors learned from outcomes read back from the incident log: this needs the store, so it stays with
/// the storage tests; the learning itself is tested in FeederLocate.Core.Tests/Learning.
/// </summary>
public class HistoryLearningTests
{
    [Fact]
    public void Priors_learned_from_logged_outcomes_reflect_the_confirmed_segments()
    {
        using var db = new TempDatabase();
        using var store = IncidentStore.Open(db.Path);
        var grid = TestGrids.Brackenfold();
        // Three faults on S3 over the years 2022 to 2024 (2 years apart at the ends: 731 days).
        foreach (var reportedAt in new[] { "2022-05-01T10:00:00Z", "2023-02-11T03:30:00Z", "2024-05-01T10:00:00Z" })
        {
            store.Record(grid, TestIncidents.EarthFault(DateTimeOffset.Parse(reportedAt, System.Globalization.CultureInfo.InvariantCulture)),
                new OutcomeLogged(new SegmentId("S3")), new Actor("cli"));
        }

        var outcomes = store.Outcomes(grid.Name);
        var priors = HistoryLearning.Learn(grid, outcomes.Select(o => o.ToConfirmedFault()), []);

        // T = 731/365.25 = 2.001369 years. Overhead type: Gamma(4 + 3, 50 + 5·T), mean m = 7/(50 + 5T) = 0.116651.
        // S3: Gamma(10m + 3, 10 + 5T), mean (10m + 3)/(10 + 5T) = 0.208255 per km·year, × 5 km = 1.041 faults a year.
        var years = 731 / 365.25;
        var m = 7 / (50 + (5 * years));
        Assert.Equal(years, priors.FaultRates.ObservationYears, 1e-12);
        Assert.Equal(m, priors.FaultRates.LineTypes[1].FaultsPerKmYear, 1e-12);
        Assert.Equal(5 * ((10 * m) + 3) / (10 + (5 * years)), priors.FaultRateOf(new SegmentId("S3")).ExpectedFaultsPerYear, 1e-12);
        Assert.Equal(3, priors.FaultRateOf(new SegmentId("S3")).Faults);
        Assert.Equal(0.05, priors.ReliabilityOf(new IndicatorId("FI1")).MissProbability, 1e-12);
    }

    [Fact]
    public void Priors_only_equal_the_grids_stated_rates_and_the_default_reliabilities()
    {
        var priors = HistoryLearning.PriorsOnly(TestGrids.Brackenfold());

        Assert.Equal(0.08, priors.FaultRateOf(new SegmentId("S3")).FaultsPerKmYear, 1e-12);
        Assert.Equal(0.04, priors.ReliabilityOf(new IndicatorId("FI3")).FalseReportProbability, 1e-12);
    }
}
