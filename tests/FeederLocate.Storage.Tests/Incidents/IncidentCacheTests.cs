using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;
using FeederLocate.Storage.Events;

namespace FeederLocate.Storage.Tests.Incidents;

/// <summary>A store reads only events it has not seen, yet sees every event another store (another process) logs.</summary>
public class IncidentCacheTests
{
    private static readonly Actor Ana = new("ana", "operator");

    private static IndicationEntered Reading(int minute) =>
        new(new Indication(new IndicatorId("FI2"), minute % 2 == 0 ? IndicatorState.Forward : IndicatorState.None, IndicationSource.Remote,
            TestIncidents.ReportedAt.AddMinutes(minute)));

    [Fact]
    public void Events_logged_by_another_store_on_the_same_file_are_seen_by_state_by_lists_and_by_outcomes()
    {
        using var db = new TempDatabase();
        using var reader = IncidentStore.Open(db.Path);
        using var writer = IncidentStore.Open(db.Path);
        var id = writer.OpenIncident(TestGrids.BrackenfoldName, TestIncidents.EarthFault(), Ana);
        Assert.Equal(1, reader.State(id).EventCount);
        Assert.Single(reader.Incidents());

        writer.Append(id, Reading(2), Ana);
        writer.Append(id, new OutcomeLogged(new SegmentId("S2"), FaultType.LG, "cable joint"), Ana);
        var second = writer.OpenIncident(TestGrids.BrackenfoldName, TestIncidents.EarthFault(), Ana);

        Assert.Equal(3, reader.State(id).EventCount);
        Assert.Equal([3, 1], reader.Incidents().Select(i => i.EventCount));
        Assert.Equal(new SegmentId("S2"), Assert.Single(reader.Outcomes(TestGrids.BrackenfoldName)).ConfirmedSegment);
        Assert.Equal(1, reader.State(second).EventCount);
    }

    [Fact]
    public void Reading_an_incident_by_id_and_then_every_incident_counts_each_event_once()
    {
        using var db = new TempDatabase();
        using var store = IncidentStore.Open(db.Path);
        var id = store.OpenIncident(TestGrids.BrackenfoldName, TestIncidents.EarthFault(), Ana);
        for (var minute = 1; minute <= 5; minute++)
        {
            store.Append(id, Reading(minute), Ana);
            Assert.Equal(minute + 1, store.State(id).EventCount);
        }

        var listed = Assert.Single(store.Incidents());
        store.Append(id, Reading(6), Ana);

        Assert.Equal(6, listed.EventCount);
        Assert.Equal(7, store.Events(id).Count);
        Assert.Equal(Enumerable.Range(1, 7), store.Events(id).Select(e => e.Sequence));
        Assert.Equal(7, Assert.Single(store.Incidents()).EventCount);
    }

    [Fact]
    public void The_state_from_the_cache_equals_the_state_of_a_store_opened_afresh()
    {
        using var db = new TempDatabase();
        using var store = IncidentStore.Open(db.Path);
        var id = store.OpenIncident(TestGrids.BrackenfoldName, TestIncidents.EarthFault(), Ana);
        for (var minute = 1; minute <= 20; minute++)
        {
            store.Append(id, Reading(minute), Ana);
            _ = store.State(id);
        }

        store.Append(id, new SwitchStateChanged(new SwitchId("LB2"), SwitchPosition.Open), Ana);

        using var fresh = IncidentStore.Open(db.Path);
        Assert.Equal(TestIncidents.Text(fresh.State(id).Incident), TestIncidents.Text(store.State(id).Incident));
        Assert.Equal(fresh.State(id).EventCount, store.State(id).EventCount);
    }

    [Fact]
    public void A_list_of_events_handed_out_does_not_change_when_more_are_logged()
    {
        using var db = new TempDatabase();
        using var store = IncidentStore.Open(db.Path);
        var id = store.OpenIncident(TestGrids.BrackenfoldName, TestIncidents.EarthFault(), Ana);
        var before = store.Events(id);

        store.Append(id, Reading(1), Ana);

        Assert.Single(before);
        Assert.Equal(2, store.Events(id).Count);
    }
}
