using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;
using FeederLocate.Storage.Errors;
using FeederLocate.Storage.Events;

namespace FeederLocate.Storage.Tests.Faults;

/// <summary>The evidence limits hold in the log itself, whichever entry point a change comes through.</summary>
public class EvidenceLimitTests
{
    private static readonly Actor Engineer = new("shift-engineer", "engineer");

    [Fact]
    public void Notes_cause_and_reason_over_their_limits_are_refused_naming_the_field_and_nothing_is_logged()
    {
        using var db = new TempDatabase();
        using var store = IncidentStore.Open(db.Path, TestClock.Manual());
        var id = store.OpenIncident(TestGrids.BrackenfoldName, TestIncidents.EarthFault(), Engineer);
        var longNotes = new string('n', EvidenceLimits.MaxNoteChars + 1);
        var longCause = new string('c', EvidenceLimits.MaxCauseChars + 1);

        var notes = Assert.Throws<EvidenceLimitException>(() => store.Append(id, new OutcomeLogged(new SegmentId("S1"), null, null, longNotes), Engineer));
        var cause = Assert.Throws<EvidenceLimitException>(() => store.Append(id, new OutcomeLogged(new SegmentId("S1"), null, longCause), Engineer));
        store.Append(id, new OutcomeLogged(new SegmentId("S1"), null, longCause[1..], longNotes[1..]), Engineer);
        var reason = Assert.Throws<EvidenceLimitException>(() => store.Append(id, new OutcomeRetracted(longCause), Engineer));

        Assert.Equal(("notes", "cause", "reason"), (notes.Field, cause.Field, reason.Field));
        Assert.Contains($"at most {EvidenceLimits.MaxNoteChars}", notes.Message, StringComparison.Ordinal);
        Assert.Equal(2, store.Events(id).Count);
    }

    [Fact]
    public void Measurements_of_more_devices_than_the_limit_are_refused_however_many_posts_bring_them()
    {
        using var db = new TempDatabase();
        using var store = IncidentStore.Open(db.Path, TestClock.Manual());
        var id = store.OpenIncident(TestGrids.BrackenfoldName, TestIncidents.EarthFault(), Engineer);
        IncidentEvent Reading(int device) => new MeasurementRecorded(new SubstationMeasurement(new SwitchId($"CB-{device}"), PhaseCurrentA: 10));
        var before = store.State(id).Incident.Measurements.Length;
        var room = EvidenceLimits.MaxMeasurementsPerIncident - before;

        store.Append(id, [.. Enumerable.Range(0, room).Select(Reading)], Engineer);
        store.Append(id, Reading(0), Engineer); // the same device again replaces its record
        var refused = Assert.Throws<EvidenceLimitException>(() => store.Append(id, Reading(room), Engineer));

        Assert.Equal("measurements", refused.Field);
        Assert.Equal(EvidenceLimits.MaxMeasurementsPerIncident, store.State(id).Incident.Measurements.Length);
    }
}
