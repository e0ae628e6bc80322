using System.Collections.Immutable;
using FeederLocate.Application.Incidents;
using FeederLocate.Application.Lifecycle;
using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;
using FeederLocate.Core.Switching;
using FeederLocate.Core.Topology;
using FeederLocate.Storage;
using FeederLocate.Storage.Events;
using FeederLocate.Storage.Incidents;

namespace FeederLocate.Application.Tests.Lifecycle;

/// <summary>
/// Customer minutes interrupted (IEEE 1366 CMI: Σ customers × minutes without supply) on the Brackenfold test
/// feeder: CB1 trips and takes N2 (60), N3 (45) and N4 (30) customers off, 135 in all; closing CB1 restores them.
/// Every figure below is 135 × the minutes from the trip to the close, worked by hand.
/// </summary>
public sealed class CustomerInterruptionTests : IDisposable
{
    private static readonly Actor Operator = new("ana", "operator");
    private static readonly DateTimeOffset Trip = TestClock.Start;
    private static readonly SwitchingStep CloseCb1In30Min = new(1, StepAction.Close, new SwitchId("CB1"), null, [], TimeSpan.FromMinutes(30), "close CB1");

    private readonly TempDatabase _database = new();
    private readonly Microsoft.Extensions.Time.Testing.FakeTimeProvider _clock = TestClock.Manual();
    private readonly IncidentLog _log;
    private readonly NetworkGraph _graph = new(TestGrids.Brackenfold());

    public CustomerInterruptionTests() => _log = new IncidentLog(IncidentStore.Open(_database.Path, _clock));

    public void Dispose()
    {
        _log.Dispose();
        _database.Dispose();
    }

    private IncidentId OpenTrip()
    {
        var id = _log.Open(_graph.Grid, new SwitchId("CB1"), FaultType.LG, Trip, Operator);
        _log.Append(id, new IncidentTimesEntered(Trip, Trip), Operator);
        return id;
    }

    [Fact]
    public void A_step_not_done_counts_at_the_plans_estimate()
    {
        var id = OpenTrip();

        var figure = CustomerInterruption.Of(_graph, _log.State(id), [CloseCb1In30Min], [], Trip.AddMinutes(10));

        Assert.Equal(135 * 30, figure.CustomerMinutesInterrupted, 6);
        Assert.Equal((0, 1), (figure.ActualSteps, figure.EstimatedSteps));
        Assert.Equal(Trip.AddMinutes(30), figure.Until);
        Assert.Equal("from the trip at 2026-03-14 05:45 UTC: 0 switching operations at the actual times, 1 at the plan's estimate", figure.Basis);
    }

    [Fact]
    public void A_step_done_counts_at_its_actual_time_not_the_estimate()
    {
        var id = OpenTrip();
        _log.Append(id, new PlanStepCompleted(1, "close", "CB1", DoneAt: Trip.AddMinutes(20)), Operator);

        var figure = CustomerInterruption.Of(_graph, _log.State(id), [CloseCb1In30Min], [], Trip.AddMinutes(25));

        Assert.Equal(135 * 20, figure.CustomerMinutesInterrupted, 6);
        Assert.Equal((1, 0), (figure.ActualSteps, figure.EstimatedSteps));
    }

    [Fact]
    public void An_overdue_step_counts_from_now_since_it_has_not_happened_yet()
    {
        var id = OpenTrip();

        var figure = CustomerInterruption.Of(_graph, _log.State(id), [CloseCb1In30Min], [], Trip.AddMinutes(45));

        Assert.Equal(135 * 45, figure.CustomerMinutesInterrupted, 6);
    }

    [Fact]
    public void A_return_step_counts_from_the_repair_and_the_customers_stay_off_until_it()
    {
        var id = OpenTrip();
        _clock.SetUtcNow(Trip.AddMinutes(50));
        _log.Append(id, new IncidentStageChanged(IncidentStage.Repaired), Operator);
        var backIn15Min = CloseCb1In30Min with { At = TimeSpan.FromMinutes(15) };

        var estimated = CustomerInterruption.Of(_graph, _log.State(id), [], [backIn15Min], Trip.AddMinutes(50));
        _log.Append(id, new ReturnStepCompleted(1, "close", "CB1", Trip.AddMinutes(58)), Operator);
        var actual = CustomerInterruption.Of(_graph, _log.State(id), [], [backIn15Min], Trip.AddMinutes(60));

        // Repaired at 50 min, the return's close 15 min later: 135 × 65.
        Assert.Equal(135 * 65, estimated.CustomerMinutesInterrupted, 6);
        // Closed at 58 min: 135 × 58.
        Assert.Equal(135 * 58, actual.CustomerMinutesInterrupted, 6);
        Assert.Equal((1, 0), (actual.ActualSteps, actual.EstimatedSteps));
    }

    [Fact]
    public void Without_an_entered_trip_the_count_starts_at_the_fault()
    {
        var id = _log.Open(_graph.Grid, new SwitchId("CB1"), FaultType.LG, Trip, Operator);
        _log.Append(id, new IncidentTimesEntered(Trip.AddMinutes(-4)), Operator);

        var figure = CustomerInterruption.Of(_graph, _log.State(id), ImmutableArray.Create(CloseCb1In30Min), [], Trip);

        // Estimated close at 30 min after the fault: 135 × 30, from the fault 4 min before the report.
        Assert.Equal(135 * 30, figure.CustomerMinutesInterrupted, 6);
        Assert.Equal(Trip.AddMinutes(-4), figure.From);
        Assert.StartsWith("from the fault at", figure.Basis, StringComparison.Ordinal);
    }
}
