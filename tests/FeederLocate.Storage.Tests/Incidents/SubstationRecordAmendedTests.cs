using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;
using FeederLocate.Storage.Errors;
using FeederLocate.Storage.Events;
using FeederLocate.Storage.Incidents;

namespace FeederLocate.Storage.Tests.Incidents;

public class SubstationRecordAmendedTests
{
    [Fact]
    public void Amending_the_record_replaces_tripped_device_and_fault_type_and_survives_reopening()
    {
        using var db = new TempDatabase();
        var grid = TestGrids.Brackenfold();
        IncidentId id;
        using (var store = IncidentStore.Open(db.Path))
        {
            id = store.OpenIncident(grid.Name, TestIncidents.EarthFault(), new Actor("ana"));
            store.Append(id, new SubstationRecordAmended(null, FaultType.LLG), new Actor("ana"), grid);
        }

        using var reopened = IncidentStore.Open(db.Path);
        var incident = reopened.State(id).Incident;

        Assert.Null(incident.TrippedDevice);
        Assert.Equal(FaultType.LLG, incident.FaultType);
        Assert.IsType<SubstationRecordAmended>(reopened.Events(id)[^1].Event);
    }

    [Fact]
    public void Amending_with_a_device_the_grid_lacks_is_refused()
    {
        using var db = new TempDatabase();
        var grid = TestGrids.Brackenfold();
        using var store = IncidentStore.Open(db.Path);
        var id = store.OpenIncident(grid.Name, TestIncidents.EarthFault(), new Actor("ana"));

        Assert.ThrowsAny<IncidentStoreException>(() =>
            store.Append(id, new SubstationRecordAmended(new SwitchId("CB-NOWHERE"), FaultType.LG), new Actor("ana"), grid));
        Assert.Equal(new SwitchId("CB1"), store.State(id).Incident.TrippedDevice);
    }
}
