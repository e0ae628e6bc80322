using FeederLocate.Storage.Events;
using FeederLocate.Storage.Incidents;
using FeederLocate.Storage.Tests.Support;

namespace FeederLocate.Storage.Tests.Incidents;

public class GridPinTests
{
    private static readonly Actor Operator = new("duty-operator", "operator");
    private static readonly Actor Engineer = new("shift-engineer", "engineer");

    [Fact]
    public void An_incident_is_pinned_to_the_version_it_was_opened_on_and_keeps_it_across_reopening_the_file()
    {
        using var db = new TempDatabase();
        IncidentId id;
        using (var store = IncidentStore.Open(db.Path, TestClock.Manual()))
        {
            id = store.OpenIncident(TestGrids.Brackenfold(), TestIncidents.EarthFault(), Operator, gridVersion: 3);
            Assert.Equal(3, Assert.IsType<IncidentOpened>(store.Events(id)[0].Event).GridVersion);
        }

        using var reopened = IncidentStore.Open(db.Path);
        Assert.Equal(3, reopened.State(id).GridVersion);
        Assert.Empty(reopened.State(id).GridMoves);
    }

    [Fact]
    public void A_move_re_pins_the_incident_with_who_when_and_why()
    {
        using var db = new TempDatabase();
        var clock = TestClock.Manual();
        using var store = IncidentStore.Open(db.Path, clock);
        var id = store.OpenIncident(TestGrids.Brackenfold(), TestIncidents.EarthFault(), Operator, gridVersion: 1);
        var at = clock.At(15);

        store.Append(id, new IncidentGridMoved(1, 2, "the new version has the recloser fitted last week"), Engineer);

        var state = store.State(id);
        Assert.Equal(2, state.GridVersion);
        Assert.Equal(new GridMove(1, 2, "the new version has the recloser fitted last week", Engineer, at), Assert.Single(state.GridMoves));
        var folded = IncidentFold.Fold(store.Events(id));
        Assert.Equal(2, folded.GridVersion);
        Assert.Equal(state.GridMoves.Single().ToString(), folded.GridMoves.Single().ToString());
    }

    [Fact]
    public void A_move_from_a_version_the_incident_is_not_on_or_without_a_reason_is_refused_and_nothing_is_logged()
    {
        using var db = new TempDatabase();
        using var store = IncidentStore.Open(db.Path, TestClock.Manual());
        var id = store.OpenIncident(TestGrids.Brackenfold(), TestIncidents.EarthFault(), Operator, gridVersion: 2);

        Assert.Throws<InvalidOperationException>(() => store.Append(id, new IncidentGridMoved(1, 3, "stale page"), Engineer));
        Assert.Throws<ArgumentException>(() => store.Append(id, new IncidentGridMoved(2, 3, " "), Engineer));
        Assert.Throws<ArgumentOutOfRangeException>(() => store.Append(id, new IncidentGridMoved(2, 0, "no version 0"), Engineer));

        Assert.Single(store.Events(id));
        Assert.Equal(2, store.State(id).GridVersion);
    }

    [Fact]
    public void A_closed_incident_is_not_moved()
    {
        using var db = new TempDatabase();
        using var store = IncidentStore.Open(db.Path, TestClock.Manual());
        var id = store.OpenIncident(TestGrids.Brackenfold(), TestIncidents.EarthFault(), Operator);
        store.Append(id, new IncidentClosed(), Operator);

        Assert.Throws<Errors.IncidentClosedException>(() => store.Append(id, new IncidentGridMoved(1, 2, "late"), Engineer));
        Assert.Equal(1, store.State(id).GridVersion);
    }

    [Fact]
    public void An_opening_logged_before_grid_versions_reads_as_version_1()
    {
        using var db = new TempDatabase();
        IncidentId id;
        using (var store = IncidentStore.Open(db.Path, TestClock.Manual()))
        {
            id = store.OpenIncident(TestGrids.Brackenfold(), TestIncidents.EarthFault(), Operator, gridVersion: 4);
        }

        // Rewrite the opening as an older program wrote it: the same payload without gridVersion.
        using (var raw = RawDatabase.Open(db.Path))
        {
            var payload = (string)RawDatabase.Scalar(raw, "SELECT json_remove(payload, '$.gridVersion') FROM events WHERE incident_id = $id AND sequence = 1", ("$id", id.Value))!;
            Assert.DoesNotContain("gridVersion", payload, StringComparison.Ordinal);
            RawDatabase.Execute(raw, "INSERT INTO incidents (id, grid_name, reported_at, created_at) SELECT 50, grid_name, reported_at, created_at FROM incidents WHERE id = $id", ("$id", id.Value));
            RawDatabase.Execute(raw,
                "INSERT INTO events (incident_id, sequence, time, actor, kind, payload) VALUES (50, 1, '2026-03-14T06:00:00.0000000Z', 'operator-1', 'incidentOpened', $payload)",
                ("$payload", payload));
        }

        using var reopened = IncidentStore.Open(db.Path);
        Assert.Equal(1, reopened.State(new IncidentId(50)).GridVersion);
        Assert.Equal(4, reopened.State(id).GridVersion);
    }

    [Fact]
    public void A_stored_move_that_does_not_start_from_the_version_in_force_is_quarantined_and_the_pin_stays()
    {
        using var db = new TempDatabase();
        IncidentId id;
        using (var store = IncidentStore.Open(db.Path, TestClock.Manual()))
        {
            id = store.OpenIncident(TestGrids.Brackenfold(), TestIncidents.EarthFault(), Operator, gridVersion: 2);
        }

        using (var raw = RawDatabase.Open(db.Path))
        {
            RawDatabase.Execute(raw,
                "INSERT INTO events (incident_id, sequence, time, actor, kind, payload) VALUES ($id, 2, '2026-03-14T06:00:00.0000000Z', 'x', 'incidentGridMoved', '{\"fromVersion\":5,\"toVersion\":6,\"reason\":\"r\"}')",
                ("$id", id.Value));
        }

        using var reopened = IncidentStore.Open(db.Path);
        var state = reopened.State(id);
        Assert.Equal(2, state.GridVersion);
        Assert.Contains("stands on version 2", Assert.Single(state.Quarantined).Problem, StringComparison.Ordinal);
    }
}
