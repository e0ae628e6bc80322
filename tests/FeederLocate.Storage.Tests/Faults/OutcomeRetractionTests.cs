using FeederLocate.Core.Model;
using FeederLocate.Storage.Errors;
using FeederLocate.Storage.Events;

namespace FeederLocate.Storage.Tests.Faults;

/// <summary>A wrong outcome is withdrawn by a logged retraction; the log keeps both.</summary>
public class OutcomeRetractionTests
{
    private static readonly Actor Engineer = new("shift-engineer", "engineer");

    [Fact]
    public void A_retracted_outcome_is_no_longer_in_force_nor_learned_from_even_after_closing()
    {
        using var db = new TempDatabase();
        using var store = IncidentStore.Open(db.Path, TestClock.Manual());
        var id = store.Append(TestGrids.Brackenfold(), TestIncidents.EarthFault(), new OutcomeLogged(new SegmentId("S1")), Engineer);

        store.Append(id, new OutcomeRetracted("the crew found the fault on S2"), Engineer);

        Assert.Null(store.State(id).Outcome);
        Assert.Empty(store.Outcomes(TestGrids.BrackenfoldName));
        Assert.Equal(["incidentOpened", "outcomeLogged", "incidentClosed", "outcomeRetracted"], store.Events(id).Select(e => e.Kind));
        Assert.Empty(store.State(id).Quarantined);
    }

    [Fact]
    public void A_retraction_without_an_outcome_in_force_is_refused_and_nothing_is_logged()
    {
        using var db = new TempDatabase();
        using var store = IncidentStore.Open(db.Path, TestClock.Manual());
        var id = store.OpenIncident(TestGrids.BrackenfoldName, TestIncidents.EarthFault(), Engineer);

        Assert.Throws<OutcomeNotLoggedException>(() => store.Append(id, new OutcomeRetracted("typo"), Engineer));
        store.Append(id, new OutcomeLogged(new SegmentId("S1")), Engineer);
        store.Append(id, new OutcomeRetracted("typo"), Engineer);
        Assert.Throws<OutcomeNotLoggedException>(() => store.Append(id, new OutcomeRetracted("again"), Engineer));

        Assert.Equal(3, store.Events(id).Count);
    }

    [Fact]
    public void After_closing_only_a_retraction_is_accepted()
    {
        using var db = new TempDatabase();
        using var store = IncidentStore.Open(db.Path, TestClock.Manual());
        var id = store.Append(TestGrids.Brackenfold(), TestIncidents.EarthFault(), new OutcomeLogged(new SegmentId("S1")), Engineer);

        Assert.Throws<IncidentClosedException>(() => store.Append(id, new OutcomeLogged(new SegmentId("S2")), Engineer));
        Assert.Throws<ArgumentException>(() => store.Append(id, new OutcomeRetracted(" "), Engineer));

        Assert.Equal(new SegmentId("S1"), store.State(id).Outcome!.Outcome.ConfirmedSegment);
    }
}
