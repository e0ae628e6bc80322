using FeederLocate.Application.Evidence;
using FeederLocate.Application.Tests.Support;
using FeederLocate.Application.Times;
using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;
using FeederLocate.Storage.Events;

namespace FeederLocate.Application.Tests.Times;

public sealed class IncidentTimesEntryTests : IDisposable
{
    private static readonly DateTimeOffset Reported = TestClock.Start.AddMinutes(-10);
    private readonly TestLog _test = new();
    private readonly Microsoft.Extensions.Time.Testing.FakeTimeProvider _clock = TestClock.Manual();
    private readonly Grid _grid = Samples.Graph("solid").Grid;

    public void Dispose() => _test.Dispose();

    private Storage.Incidents.IncidentId OpenTrip() => _test.Log.Open(_grid, new SwitchId("CB-A1"), FaultType.LG, Reported, Samples.Operator);

    [Fact]
    public void Fault_trip_and_reclosure_times_are_kept_and_a_later_entry_replaces_only_what_it_gives()
    {
        var id = OpenTrip();
        var entry = new IncidentTimesEntry(_test.Log, _clock);
        var fault = Reported.AddMinutes(-2);

        Assert.True(entry.Enter(id, fault, fault.AddSeconds(1), null, Samples.Operator).IsLogged);
        Assert.True(entry.Enter(id, null, null, fault.AddSeconds(3), Samples.Operator).IsLogged);

        var state = _test.Log.State(id);
        Assert.Equal(new Storage.Incidents.IncidentTimes(fault, fault.AddSeconds(1), fault.AddSeconds(3)), state.Times);
        Assert.Equal(fault, state.FaultAt);
    }

    [Fact]
    public void Times_in_the_future_or_out_of_sequence_are_refused_with_the_rule_and_nothing_is_logged()
    {
        var id = OpenTrip();
        var entry = new IncidentTimesEntry(_test.Log, _clock);
        var fault = Reported.AddMinutes(-2);

        var future = entry.Enter(id, TestClock.Start.AddMinutes(1), null, null, Samples.Operator);
        var tripBeforeFault = entry.Enter(id, fault, fault.AddSeconds(-5), null, Samples.Operator);
        entry.Enter(id, fault, fault.AddSeconds(1), null, Samples.Operator);
        var reclosureBeforeTrip = entry.Enter(id, null, null, fault, Samples.Operator);
        var nothing = entry.Enter(id, null, null, null, Samples.Operator);

        Assert.Equal("faultAt 2026-03-14T05:46:00Z is in the future (now 2026-03-14T05:45:00Z)", future.Refusal);
        Assert.Equal("trippedAt 2026-03-14T05:32:55Z is before the fault began at 2026-03-14T05:33:00Z", tripBeforeFault.Refusal);
        Assert.Equal("reclosedAt 2026-03-14T05:33:00Z is before the trip at 2026-03-14T05:33:01Z", reclosureBeforeTrip.Refusal);
        Assert.False(nothing.IsLogged);
        Assert.Equal(2, _test.Log.Events(id).Count);
    }

    [Fact]
    public void A_reading_dated_before_the_fault_or_in_the_future_is_refused_with_the_indicator_and_field()
    {
        var id = OpenTrip();
        new IncidentTimesEntry(_test.Log, _clock).Enter(id, Reported.AddMinutes(-2), null, null, Samples.Operator);
        var intake = new EvidenceIntake(_test.Log, _clock);

        var early = intake.AddIndications(id, _grid, """[{"indicator":"FPI-A1-04","state":"fault","source":"field","readAt":"2026-03-14T05:30:00Z"}]""", Samples.Operator);
        var future = intake.AddIndications(id, _grid, """{"indicator":"FPI-A1-04","state":"fault","source":"field","readAt":"2026-03-14T06:00:00Z"}""", Samples.Operator);
        var fine = intake.AddIndications(id, _grid, """{"indicator":"FPI-A1-04","state":"fault","source":"field","readAt":"2026-03-14T05:40:00Z"}""", Samples.Operator);

        Assert.Equal("indication FPI-A1-04: readAt 2026-03-14T05:30:00Z is before the fault began at 2026-03-14T05:33:00Z", Assert.Single(early.Issues).ToString());
        Assert.Equal("indication FPI-A1-04: readAt 2026-03-14T06:00:00Z is in the future (now 2026-03-14T05:45:00Z)", Assert.Single(future.Issues).ToString());
        Assert.True(fine.IsAccepted);
        Assert.Equal(TestClock.Start.AddMinutes(-5), _test.Log.State(id).Incident.IndicationOf(new IndicatorId("FPI-A1-04"))!.ReadAt);
        Assert.Equal(3, _test.Log.Events(id).Count);
    }

    [Fact]
    public void The_fault_time_is_refused_after_a_reading_already_entered()
    {
        var id = OpenTrip();
        _test.Log.Append(id, new IndicationEntered(new Indication(new IndicatorId("FPI-A1-04"), IndicatorState.Fault, IndicationSource.Field, Reported)), Samples.Operator);

        var late = new IncidentTimesEntry(_test.Log, _clock).Enter(id, Reported.AddMinutes(1), null, null, Samples.Operator);

        Assert.Equal("faultAt 2026-03-14T05:36:00Z is after the reading of FPI-A1-04 at 2026-03-14T05:35:00Z", late.Refusal);
    }
}
