using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;
using FeederLocate.Storage.Errors;
using FeederLocate.Storage.Events;
using FeederLocate.Storage.Incidents;

namespace FeederLocate.Storage.Tests.Incidents;

public class StoreRefusalTests
{
    private static readonly Actor Operator = new("duty-operator", "operator");

    [Fact]
    public void Appending_to_an_unknown_incident_throws_naming_its_id()
    {
        using var db = new TempDatabase();
        using var store = IncidentStore.Open(db.Path);

        var error = Assert.Throws<UnknownIncidentException>(() => store.Append(new IncidentId(42), new IncidentClosed(), Operator));

        Assert.Equal(new IncidentId(42), error.Incident);
        Assert.Contains("incident 42", error.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void Reading_an_unknown_incident_throws_naming_its_id()
    {
        using var db = new TempDatabase();
        using var store = IncidentStore.Open(db.Path);

        var error = Assert.Throws<UnknownIncidentException>(() => store.State(new IncidentId(5)));

        Assert.Contains("incident 5 does not exist", error.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void An_outcome_on_a_closed_incident_is_refused_and_nothing_is_logged()
    {
        using var db = new TempDatabase();
        using var store = IncidentStore.Open(db.Path);
        var id = store.OpenIncident(TestGrids.BrackenfoldName, TestIncidents.EarthFault(), Operator);
        store.Append(id, new IncidentClosed(), Operator);

        var error = Assert.Throws<IncidentClosedException>(() => store.Append(id, new OutcomeLogged(new SegmentId("S1")), Operator));

        Assert.Equal(id, error.Incident);
        Assert.Contains($"incident {id} is closed", error.Message, StringComparison.Ordinal);
        Assert.Equal(2, store.Events(id).Count);
        Assert.Null(store.State(id).Outcome);
    }

    [Fact]
    public void A_batch_that_fails_part_way_logs_none_of_its_events()
    {
        using var db = new TempDatabase();
        using var store = IncidentStore.Open(db.Path);
        var id = store.OpenIncident(TestGrids.BrackenfoldName, TestIncidents.EarthFault(), Operator);

        Assert.Throws<IncidentClosedException>(() => store.Append(id,
            [new PlanStepCompleted(1, "open", "LB2"), new IncidentClosed(), new OutcomeLogged(new SegmentId("S1"))], Operator));

        Assert.Single(store.Events(id));
        Assert.Equal(IncidentStatus.Open, store.State(id).Status);
    }

    [Fact]
    public void An_event_given_with_another_grid_is_refused_naming_the_incident_and_both_grids()
    {
        using var db = new TempDatabase();
        using var store = IncidentStore.Open(db.Path);
        var id = store.OpenIncident(TestGrids.BrackenfoldName, TestIncidents.EarthFault(), Operator);

        var error = Assert.Throws<IncidentGridMismatchException>(() =>
            store.Append(id, new OutcomeLogged(new SegmentId("S1")), Operator, TestGrids.Brackenfold("Ferncombe 11 kV")));

        Assert.Equal(id, error.Incident);
        Assert.Equal(TestGrids.BrackenfoldName, error.IncidentGrid);
        Assert.Equal("Ferncombe 11 kV", error.GivenGrid);
        Assert.Contains($"incident {id}", error.Message, StringComparison.Ordinal);
        Assert.Single(store.Events(id));
    }

    [Theory]
    [InlineData("outcome", "segment S99")]
    [InlineData("indication", "indicator FI99")]
    [InlineData("switch", "switch SW99")]
    [InlineData("measurement", "switch CB99")]
    public void An_event_naming_an_element_the_grid_lacks_is_refused(string kind, string element)
    {
        using var db = new TempDatabase();
        using var store = IncidentStore.Open(db.Path);
        var id = store.OpenIncident(TestGrids.BrackenfoldName, TestIncidents.EarthFault(), Operator);
        IncidentEvent e = kind switch
        {
            "outcome" => new OutcomeLogged(new SegmentId("S99")),
            "indication" => new IndicationEntered(new Indication(new IndicatorId("FI99"), IndicatorState.Fault, IndicationSource.Field)),
            "switch" => new SwitchStateChanged(new SwitchId("SW99"), SwitchPosition.Open),
            _ => new MeasurementRecorded(new SubstationMeasurement(new SwitchId("CB99"), 100)),
        };

        var error = Assert.Throws<IncidentGridMismatchException>(() => store.Append(id, e, Operator, TestGrids.Brackenfold()));

        Assert.Equal(element, error.Element);
        Assert.Contains($"incident {id}: {element} is not in grid", error.Message, StringComparison.Ordinal);
        Assert.Single(store.Events(id));
    }

    [Fact]
    public void Record_refuses_an_outcome_on_a_segment_the_grid_lacks_and_logs_no_incident()
    {
        using var db = new TempDatabase();
        using var store = IncidentStore.Open(db.Path);

        Assert.Throws<IncidentGridMismatchException>(() =>
            store.Record(TestGrids.Brackenfold(), TestIncidents.EarthFault(), new OutcomeLogged(new SegmentId("S99")), Operator));

        Assert.Empty(store.Incidents());
    }

    [Fact]
    public void Appending_an_opening_event_is_refused()
    {
        using var db = new TempDatabase();
        using var store = IncidentStore.Open(db.Path);
        var id = store.OpenIncident(TestGrids.BrackenfoldName, TestIncidents.EarthFault(), Operator);

        Assert.Throws<ArgumentException>(() => store.Append(id, new IncidentOpened(TestGrids.BrackenfoldName, TestIncidents.EarthFault()), Operator));

        Assert.Single(store.Events(id));
    }
}
