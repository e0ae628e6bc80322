using FeederLocate.Storage.Errors;
using FeederLocate.Storage.Events;
using FeederLocate.Storage.Incidents;

namespace FeederLocate.Storage.Tests.Incidents;

public class IncidentStageTests
{
    private static readonly Actor Operator = new("duty-operator", "operator");
    private static readonly Actor Engineer = new("shift-engineer", "engineer");

    [Fact]
    public void Each_stage_change_is_kept_with_who_and_when_from_open_to_closed()
    {
        using var db = new TempDatabase();
        var clock = TestClock.Manual();
        using var store = IncidentStore.Open(db.Path, clock);
        var id = store.OpenIncident(TestGrids.BrackenfoldName, TestIncidents.EarthFault(), Operator);
        foreach (var (stage, minute) in new[] { (IncidentStage.Located, 10), (IncidentStage.Isolated, 20), (IncidentStage.Restored, 30), (IncidentStage.Repaired, 200) })
        {
            clock.At(minute);
            store.Append(id, new IncidentStageChanged(stage), Operator);
        }

        var closed = clock.At(230);
        store.Append(id, new IncidentClosed("back to normal"), Engineer);

        var state = store.State(id);
        Assert.Equal(
            [IncidentStage.Open, IncidentStage.Located, IncidentStage.Isolated, IncidentStage.Restored, IncidentStage.Repaired, IncidentStage.Closed],
            state.Stages.Select(s => s.Stage));
        Assert.Equal(new StageChange(IncidentStage.Closed, Engineer, closed, "back to normal"), state.Stages[^1]);
        Assert.Equal(TestClock.Start.AddMinutes(20), state.Stages[2].At);
        Assert.Equal(IncidentStage.Closed, state.Stage);
        Assert.Equal(IncidentStatus.Closed, state.Status);
    }

    [Fact]
    public void A_closed_incident_takes_only_a_reopening_and_is_back_at_the_stage_before_closing()
    {
        using var db = new TempDatabase();
        var clock = TestClock.Manual();
        using var store = IncidentStore.Open(db.Path, clock);
        var id = store.OpenIncident(TestGrids.BrackenfoldName, TestIncidents.EarthFault(), Operator);
        store.Append(id, new IncidentStageChanged(IncidentStage.Repaired), Operator);
        store.Append(id, new IncidentClosed(), Operator);

        Assert.Throws<IncidentClosedException>(() => store.Append(id, new IncidentStageChanged(IncidentStage.Located), Operator));
        var reopenedAt = clock.At(60);
        store.Append(id, new IncidentReopened("the fault came back within the hour"), Engineer);
        store.Append(id, new IncidentStageChanged(IncidentStage.Located), Operator);

        var state = store.State(id);
        Assert.Equal(IncidentStatus.Open, state.Status);
        Assert.Null(state.ClosedAt);
        Assert.Equal(new StageChange(IncidentStage.Repaired, Engineer, reopenedAt, "the fault came back within the hour"), state.Stages[^2]);
        Assert.Equal(IncidentStage.Located, state.Stage);
        Assert.Equal(5, store.Events(id).Count);
    }

    [Fact]
    public void An_open_incident_is_not_reopened_and_a_reopening_needs_a_reason()
    {
        using var db = new TempDatabase();
        using var store = IncidentStore.Open(db.Path, TestClock.Manual());
        var id = store.OpenIncident(TestGrids.BrackenfoldName, TestIncidents.EarthFault(), Operator);

        Assert.Throws<InvalidOperationException>(() => store.Append(id, new IncidentReopened("why not"), Engineer));
        store.Append(id, new IncidentClosed(), Operator);
        Assert.ThrowsAny<ArgumentException>(() => store.Append(id, new IncidentReopened(" "), Engineer));
        Assert.ThrowsAny<ArgumentException>(() => store.Append(id, new IncidentStageChanged(IncidentStage.Closed), Engineer));
        Assert.Equal(2, store.Events(id).Count);
    }
}
