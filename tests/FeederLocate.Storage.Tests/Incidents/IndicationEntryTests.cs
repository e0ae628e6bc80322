using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;
using FeederLocate.Storage.Events;

namespace FeederLocate.Storage.Tests.Incidents;

public class IndicationEntryTests
{
    private static readonly Actor Ana = new("ana", "operator");
    private static readonly Actor Ben = new("ben", "operator");

    private static IndicationEntered Reading(IndicatorState state) =>
        new(new Indication(new IndicatorId("FI3"), state, IndicationSource.Field));

    [Fact]
    public void Each_reading_keeps_its_author_and_a_second_operator_within_seconds_overrides_the_first()
    {
        using var db = new TempDatabase();
        var clock = TestClock.Manual();
        using var store = IncidentStore.Open(db.Path, clock);
        var id = store.OpenIncident(TestGrids.BrackenfoldName, TestIncidents.EarthFault(), Ana);
        clock.At(10);
        store.Append(id, Reading(IndicatorState.Fault), Ana);
        clock.SetUtcNow(TestClock.Start.AddMinutes(10).AddSeconds(12));

        store.Append(id, Reading(IndicatorState.None), Ben);

        var entry = store.State(id).IndicationEntries[new IndicatorId("FI3")];
        Assert.Equal((Ben, TestClock.Start.AddMinutes(10).AddSeconds(12), IndicatorState.None), (entry.Actor, entry.EnteredAt, entry.Indication.State));
        Assert.Equal((Ana, TestClock.Start.AddMinutes(10), IndicatorState.Fault), (entry.Overrode?.Actor, entry.Overrode?.EnteredAt, entry.Overrode?.Indication.State));
    }

    [Fact]
    public void The_same_operator_or_a_later_entry_overrides_nobody()
    {
        using var db = new TempDatabase();
        var clock = TestClock.Manual();
        using var store = IncidentStore.Open(db.Path, clock);
        var id = store.OpenIncident(TestGrids.BrackenfoldName, TestIncidents.EarthFault(), Ana);
        store.Append(id, Reading(IndicatorState.Fault), Ana);
        store.Append(id, Reading(IndicatorState.None), Ana);
        Assert.Null(store.State(id).IndicationEntries[new IndicatorId("FI3")].Overrode);

        clock.At(2);
        store.Append(id, Reading(IndicatorState.Fault), Ben);

        Assert.Null(store.State(id).IndicationEntries[new IndicatorId("FI3")].Overrode);
    }
}
