using System.Collections.Immutable;
using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;
using FeederLocate.Storage.Errors;
using FeederLocate.Storage.Events;
using FeederLocate.Storage.Incidents;
using FeederLocate.Storage.Tests.Support;

namespace FeederLocate.Storage.Tests.Incidents;

public class ProtectionRecordedTests
{
    private static readonly DateTimeOffset FaultAt = new(2026, 3, 1, 7, 58, 30, TimeSpan.Zero);

    [Fact]
    public void Protection_context_folds_into_the_incident_and_survives_reopening()
    {
        using var db = new TempDatabase();
        var grid = TestGrids.Brackenfold();
        IncidentId id;
        using (var store = IncidentStore.Open(db.Path))
        {
            id = store.OpenIncident(grid.Name, TestIncidents.EarthFault(), new Actor("ana"));
            store.Append(id, new ProtectionRecorded(FaultAt, new Reclosing(new SwitchId("CB1"), 2, ReclosingResult.Lockout),
                ImmutableDictionary<SwitchId, FuseCondition>.Empty, [new RelayResult(new SwitchId("CB1"), EarthFaultDirection.Forward, 2.5)]), new Actor("ana"), grid);
            // A later entry for the same relay replaces the earlier one; the fault time given before stays.
            store.Append(id, new ProtectionRecorded(null, null,
                ImmutableDictionary<SwitchId, FuseCondition>.Empty, [new RelayResult(new SwitchId("CB1"), EarthFaultDirection.Reverse)]), new Actor("ana"), grid);
        }

        using var reopened = IncidentStore.Open(db.Path);
        var incident = reopened.State(id).Incident;

        Assert.Equal(FaultAt, incident.FaultAt);
        Assert.Equal(new Reclosing(new SwitchId("CB1"), 2, ReclosingResult.Lockout), incident.Reclosing);
        var relay = Assert.Single(incident.Relays);
        Assert.Equal(new RelayResult(new SwitchId("CB1"), EarthFaultDirection.Reverse), relay);
        Assert.IsType<ProtectionRecorded>(reopened.Events(id)[^1].Event);
    }

    [Fact]
    public void Protection_naming_a_device_the_grid_lacks_is_refused()
    {
        using var db = new TempDatabase();
        var grid = TestGrids.Brackenfold();
        using var store = IncidentStore.Open(db.Path);
        var id = store.OpenIncident(grid.Name, TestIncidents.EarthFault(), new Actor("ana"));

        Assert.ThrowsAny<IncidentStoreException>(() => store.Append(id, new ProtectionRecorded(null, null,
            ImmutableDictionary<SwitchId, FuseCondition>.Empty.Add(new SwitchId("FU-NOWHERE"), FuseCondition.Blown), []), new Actor("ana"), grid));
        Assert.True(store.State(id).Incident.Fuses.IsEmpty);
    }
}
